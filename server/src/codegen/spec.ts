// Generation for a whole analysed spec (every channel, or one): the C source and header texts the
// CLI writes, and the marker-wrapped block the editor inserts at the cursor. Pure: no file IO.
import type { ChannelResult } from '../analysis/types';
import { conversionInput, generatableResults, tooWideMessage } from './channel-input';
import { generateC } from './generate';
import { renderBlock } from './markers';
import { CodegenInputError, type ConversionInput, type GenerateResult } from './types';

export interface SpecLike {
  path: string;
  channels: readonly ChannelResult[];
}

export type SpecGeneration =
  | { ok: true; inputs: ConversionInput[]; source: GenerateResult; header: GenerateResult }
  | { ok: false; message: string };

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
  const skipped = all.filter((r) => !ok.includes(r));
  if (skipped.length > 0) return `channel '${skipped[0]!.channel.name}': ${tooWideMessage(skipped[0]!.channel) ?? 'cannot be generated'}; name the other channels with --channel`;
  if (ok.length === 0) return 'the spec has no channel to generate code for';
  return ok;
}

function failure(err: unknown): { ok: false; message: string } {
  if (err instanceof CodegenInputError) return { ok: false, message: err.message };
  throw err;
}

/** Source and header for the spec's channels (or the one named), with `fileStem` for the file header and guard. */
export function generateForSpec(a: SpecLike, opts: { channel?: string; fileStem: string }): SpecGeneration {
  const chosen = pick(a, opts.channel);
  if (typeof chosen === 'string') return { ok: false, message: chosen };
  try {
    const inputs = chosen.map((r) => conversionInput(r, a.path));
    const source = generateC(inputs, { fileStem: opts.fileStem });
    const header = generateC(inputs, { fileStem: opts.fileStem, header: true });
    return { ok: true, inputs, source, header };
  } catch (err) {
    return failure(err);
  }
}

/** One channel's source block with its begin/end markers, for pasting into a C or C++ file. */
export function conversionBlock(a: SpecLike, channel: string, eol = '\n'): { ok: true; text: string; maxErrorC: number; method: string } | { ok: false; message: string } {
  const chosen = pick(a, channel);
  if (typeof chosen === 'string') return { ok: false, message: chosen };
  try {
    const input = conversionInput(chosen[0]!, a.path);
    const ch = generateC([input], { fileStem: 'conversion', selfContained: true }).channels[0]!;
    return { ok: true, text: renderBlock({ channel, hash: input.specHash, text: ch.code }, eol), maxErrorC: ch.maxErrorC, method: ch.method };
  } catch (err) {
    return failure(err);
  }
}
