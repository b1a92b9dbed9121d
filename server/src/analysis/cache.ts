// A channel's inputs as one string, except where they were written (spans, file), so a moved or
// reformatted channel has the same key. The document state (document-state.ts) keeps what was
// derived from a channel by this key; the code generator hashes it.
import type { ChannelDef } from '../model/types';

// `benchInfo` says where bench data was read (an absolute path) and how many rows were left out; the
// points themselves are in `measured`, and the path as written in `benchData`.
const POSITIONAL = new Set(['span', 'nameSpan', 'fieldSpans', 'file', 'given', 'closeSpan', 'benchInfo']);

/** Computed once per ChannelDef object (a memo attached to the object: it goes with it). */
const keys = new WeakMap<ChannelDef, string>();

/** The channel's inputs as a string. */
export function channelKey(c: ChannelDef): string {
  let k = keys.get(c);
  if (k === undefined) keys.set(c, (k = JSON.stringify(c, (key, v) => (POSITIONAL.has(key) ? undefined : v))));
  return k;
}
