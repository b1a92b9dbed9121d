// "Generate conversion code for <channel>": the channel's exact model inverse handed to the C
// generator (server/src/codegen), written into `<spec-stem>_conversion.c` next to the spec.
// A new file gets the generator's whole output; an existing one has only this channel's marked
// block replaced (or appended), so hand-written code around it is kept. The channel -> generator
// input mapping (and the spec hash) lives in codegen/channel-input.ts, shared with the CLI.
import * as path from 'node:path';
import type { Analysis } from '../analysis/result';
import { generateC, spliceGenerated } from '../codegen/index';
import { conversionFilePath, generatorInput, tooWideMessage } from '../codegen/channel-input';
import { symbolClash } from '../codegen/clash';

export interface GeneratedFile {
  /** Absolute path of the C file. */
  file: string;
  /** Full new text of the file. */
  text: string;
  /** True when the file does not exist yet. */
  create: boolean;
  maxErrorC: number;
  method: string;
}

export type GenerateOutcome = { ok: true; result: GeneratedFile } | { ok: false; message: string };

export { conversionFilePath };

/** The channels code can be generated for, by name. */
export function generatableChannels(a: Analysis): string[] {
  return a.channels.filter((r) => tooWideMessage(r.channel) === null).map((r) => r.channel.name);
}

/** Generates the channel's code; `existing` is the current text of the C file, if it exists. */
export function generateForChannel(a: Analysis, channel: string, existing: string | undefined): GenerateOutcome {
  const r = a.channels.find((x) => x.channel.name === channel);
  if (!r) return { ok: false, message: `channel '${channel}' has errors; fix them before generating code` };
  const wide = tooWideMessage(r.channel);
  if (wide) return { ok: false, message: wide };
  const file = conversionFilePath(a.path);
  const stem = path.basename(file, '.c');
  try {
    const input = generatorInput(r, a.path);
    // Only the .c is written here (no header beside it): the block declares its own types.
    const gen = generateC([input], { fileStem: stem, selfContained: true });
    const ch = gen.channels[0]!;
    if (existing === undefined) return { ok: true, result: { file, text: gen.text, create: true, maxErrorC: ch.maxErrorC, method: ch.method } };
    const clash = symbolClash(existing, [{ channel, identifier: ch.identifier }]);
    if (clash) return { ok: false, message: `${path.basename(file)}: ${clash}` };
    const spliced = spliceGenerated(existing, [{ channel, hash: input.specHash, text: ch.code }]);
    if (!spliced.ok) return { ok: false, message: `${path.basename(file)}: ${spliced.message}` };
    return { ok: true, result: { file, text: spliced.text, create: false, maxErrorC: ch.maxErrorC, method: ch.method } };
  } catch (err) {
    return { ok: false, message: `code for '${channel}' could not be generated: ${err instanceof Error ? err.message : String(err)}` };
  }
}
