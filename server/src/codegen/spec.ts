// Generation for a whole analysed spec (every channel, or one): the C source and header texts the
// CLI writes, and the marker-wrapped block the editor inserts at the cursor. Pure: no file IO.
import type { ChannelResult } from '../analysis/types';
import type { Diagnostic } from '../diagnostics/diagnostic';
import type { DocumentNode } from '../syntax/ast';
import { channelError, generatorInput, generatableResults, tooWideMessage } from './channel-input';
import { generateC, type AnyConversionInput } from './generate';
import { renderBlock } from './markers';
import type { GenerateResult } from './types';
import { CodegenInputError } from '../sensors/conversion';

export interface SpecLike {
  path: string;
  channels: readonly ChannelResult[];
}

/** A channel of the spec whose code was not generated, and why. */
export interface LeftOut {
  channel: string;
  why: string;
}

export type SpecGeneration =
  | { ok: true; inputs: AnyConversionInput[]; source: GenerateResult; header: GenerateResult; leftOut: LeftOut[] }
  | { ok: false; message: string; leftOut: LeftOut[] };

/**
 * The spec's channels (or the one named) split into those whose code can be generated and those
 * left out, with the reason: an error in the channel's block or its sensor's or ADC's, a channel
 * that could not be resolved at all, or a value too wide for the generator.
 */
export function splitChannels(
  a: SpecLike & { diagnostics: readonly Diagnostic[]; files?: readonly { path: string; parse: { tree: DocumentNode } }[] },
  channel?: string,
): { clean: ChannelResult[]; leftOut: LeftOut[] } {
  const clean: ChannelResult[] = [];
  const leftOut: LeftOut[] = [];
  const analysed = new Set(a.channels.map((r) => r.channel.name));
  for (const r of a.channels) {
    if (channel !== undefined && r.channel.name !== channel) continue;
    const err = channelError(r.channel, a.diagnostics);
    const wide = tooWideMessage(r.channel);
    if (err) leftOut.push({ channel: r.channel.name, why: `${err.code}: ${err.message}` });
    else if (wide) leftOut.push({ channel: r.channel.name, why: wide });
    else clean.push(r);
  }
  // Channel blocks of the spec itself that did not resolve (an unknown sensor, a broken ADC).
  const entry = a.files?.[0];
  for (const item of entry?.parse.tree.items ?? []) {
    if (item.kind !== 'block' || item.keyword.text !== 'channel' || analysed.has(item.name.text)) continue;
    if (channel !== undefined && item.name.text !== channel) continue;
    const err = a.diagnostics.find((d) => d.severity === 'error' && d.file === entry!.path && d.span.start >= item.span.start && d.span.end <= item.span.end);
    leftOut.push({ channel: item.name.text, why: err ? `${err.code}: ${err.message}` : 'it could not be resolved (see the errors above)' });
  }
  return { clean, leftOut };
}

function pick(a: SpecLike, channel: string | undefined): ChannelResult[] | string {
  const all = a.channels;
  if (channel !== undefined) {
    const r = all.find((x) => x.channel.name === channel);
    if (!r) {
      const names = all.map((x) => `'${x.channel.name}'`).join(', ');
      return `no channel '${channel}' was analysed in this spec${names ? ` (channels: ${names})` : ' (it has no channel without errors)'}`;
    }
    if (generatableResults([r]).length === 0) return `channel '${channel}': ${tooWideMessage(r.channel) ?? 'cannot be generated'}`;
    return [r];
  }
  const ok = generatableResults(all);
  const okSet = new Set(ok);
  const skipped = all.filter((r) => !okSet.has(r));
  if (skipped.length > 0) return `channel '${skipped[0]!.channel.name}': ${tooWideMessage(skipped[0]!.channel) ?? 'cannot be generated'}; name the other channels with --channel`;
  if (ok.length === 0) return 'the spec has no channel to generate code for';
  return ok;
}

function failure(err: unknown): { ok: false; message: string } {
  if (err instanceof CodegenInputError) return { ok: false, message: err.message };
  throw err;
}

/**
 * Source and header for the spec's channels (or the one named), with `fileStem` for the file header
 * and guard. A channel whose code cannot be made as asked is left out (named in `leftOut`, with
 * the generator's message) and the others are still generated.
 */
export function generateForSpec(a: SpecLike, opts: { channel?: string; fileStem: string; prefix?: string }): SpecGeneration {
  const chosen = pick(a, opts.channel);
  if (typeof chosen === 'string') return { ok: false, message: chosen, leftOut: [] };
  const leftOut: LeftOut[] = [];
  // Each channel's generator input made once (the designs chosen for them are kept with them,
  // generate.ts `chosen`), so a retry without a failed channel repeats no design search.
  let pool: { r: ChannelResult; input: AnyConversionInput }[] = [];
  for (const r of chosen) {
    try {
      pool.push({ r, input: generatorInput(r, a.path) });
    } catch (err) {
      const f = failure(err);
      leftOut.push({ channel: r.channel.name, why: f.message });
    }
  }
  if (pool.length === 0) return { ok: false, message: leftOut.length > 0 ? 'no channel could be generated' : 'the spec has no channel to generate code for', leftOut };
  for (;;) {
    try {
      const inputs = pool.map((p) => p.input);
      const source = generateC(inputs, { fileStem: opts.fileStem, prefix: opts.prefix });
      const header = generateC(inputs, { fileStem: opts.fileStem, header: true, prefix: opts.prefix });
      return { ok: true, inputs, source, header, leftOut };
    } catch (err) {
      const f = failure(err);
      const bad = err instanceof CodegenInputError ? pool.findIndex((p) => p.r.channel.name === err.channel) : -1;
      if (bad < 0) return { ...f, leftOut };
      leftOut.push({ channel: pool[bad]!.r.channel.name, why: f.message });
      pool = pool.filter((_, i) => i !== bad);
      if (pool.length === 0) return { ok: false, message: 'no channel could be generated', leftOut };
    }
  }
}

/** One channel's source block with its begin/end markers, for pasting into a C or C++ file. */
export function conversionBlock(a: SpecLike, channel: string, eol = '\n'): { ok: true; text: string; maxErrorC: number; method: string } | { ok: false; message: string } {
  const chosen = pick(a, channel);
  if (typeof chosen === 'string') return { ok: false, message: chosen };
  try {
    const input = generatorInput(chosen[0]!, a.path);
    const ch = generateC([input], { fileStem: 'conversion', selfContained: true }).channels[0]!;
    return { ok: true, text: renderBlock({ channel, hash: input.specHash, text: ch.code }, eol), maxErrorC: ch.maxErrorC, method: ch.method };
  } catch (err) {
    return failure(err);
  }
}
