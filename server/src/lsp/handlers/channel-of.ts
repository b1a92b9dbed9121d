// What the custom requests share: the analysis of a spec by URI (the open document's, else the file
// read through the document host), and one of its channels by name with a message when it is absent.
import { analyse, plotBlockers, type Analysis } from '../../engine';
import type { ChannelResult } from '../../engine';
import type { ServerContext } from '../context';
import { uriToPath } from '../documents';

export function analysisOf(ctx: ServerContext, uri: string): Analysis | undefined {
  const open = ctx.documents.get(uri);
  if (open) return ctx.analyses.get(open);
  const p = uriToPath(uri, ctx.documents.roots);
  const host = ctx.documents.host();
  const text = host.read(p);
  return text === undefined ? undefined : analyse({ path: p, text, root: ctx.documents.rootFor(p), host });
}

/** The analysed channel `name` of the spec at `uri`, or why not with the spec's own channel names. */
export function channelOf(ctx: ServerContext, uri: string, name: string | undefined): { ok: true; result: ChannelResult } | { ok: false; message: string; channels: string[]; blocked?: boolean } {
  const a = analysisOf(ctx, uri);
  if (!a) return { ok: false, message: `cannot read ${uri}`, channels: [] };
  // Every channel written in the file, those stopped by errors too (asking for one names its errors).
  const own = a.files[0]!.parse.tree.items.filter((i) => i.kind === 'block' && i.keyword.text === 'channel').map((i) => (i.kind === 'block' ? i.name.text : ''));
  if (name === undefined) return { ok: false, message: 'name a channel', channels: own };
  const result = a.channels.find((x) => x.channel.name === name && x.channel.file === a.path);
  if (result) return { ok: true, result };
  // A channel written here but stopped by errors: say which (not "no channel named").
  const blocked = plotBlockers(a, name);
  if (blocked) return { ok: false, message: blocked, channels: own, blocked: true };
  const message = own.includes(name) ? `channel '${name}' cannot be analysed: see the problems list` : `no channel named '${name}' in this file`;
  return { ok: false, message, channels: own };
}
