// Reuse of channel sweeps between analyses of the same document: a keystroke usually changes one
// channel, so the others' sweeps are taken from the cache. The key is every input of the channel
// except where it was written (spans, file), so a moved or reformatted channel is still a hit.
import type { ChannelDef } from '../model/types';
import type { ChannelResult } from './types';
import { channelResult } from './sweep';

const POSITIONAL = new Set(['span', 'nameSpan', 'fieldSpans', 'file', 'given', 'closeSpan']);

const keys = new WeakMap<ChannelDef, string>();

/** The channel's inputs as a string; computed once per ChannelDef object. */
export function channelKey(c: ChannelDef): string {
  let k = keys.get(c);
  if (k === undefined) keys.set(c, (k = JSON.stringify(c, (key, v) => (POSITIONAL.has(key) ? undefined : v))));
  return k;
}

/** A bounded cache of sweeps by channel key; keep one per open document. */
export class SweepCache {
  private map = new Map<string, Pick<ChannelResult, 'table' | 'summary'>>();
  constructor(private readonly limit = 2000) {}
  get(c: ChannelDef, compute: () => ChannelResult): ChannelResult {
    const key = channelKey(c);
    const hit = this.map.get(key);
    if (hit) return channelResult(c, hit.table, hit.summary);
    const r = compute();
    if (this.map.size >= this.limit) this.map.clear();
    this.map.set(key, { table: r.table, summary: r.summary });
    return r;
  }
}
