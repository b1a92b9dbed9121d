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
import { scanGeneratedBlocks } from '../codegen/markers';
import { fixedNumber, trimNumber } from '../diagnostics/numbers';

export interface GeneratedFile {
  /** Absolute path of the C file. */
  file: string;
  /** Full new text of the file. */
  text: string;
  /** True when the file does not exist yet. */
  create: boolean;
  maxErrorC: number;
  method: string;
  /** 0-based line of the channel's begin marker in `text`: where the editor shows the new code. */
  line: number;
  /** What was written, in one sentence for the user: the method, its worst error, the sizes. */
  summary: string;
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
    let text = gen.text;
    if (existing !== undefined) {
      const clash = symbolClash(existing, [{ channel, identifier: ch.identifier }]);
      if (clash) return { ok: false, message: `${path.basename(file)}: ${clash}` };
      const spliced = spliceGenerated(existing, [{ channel, hash: input.specHash, text: ch.code }]);
      if (!spliced.ok) return { ok: false, message: `${path.basename(file)}: ${spliced.message}` };
      text = spliced.text;
    }
    const at = scanGeneratedBlocks(text).blocks.find((b) => b.channel === channel)?.start ?? 0;
    const line = text.slice(0, at).split('\n').length - 1;
    const how = input.method === 'line' ? 'a straight line' : ch.method === 'table' ? `a table of ${ch.entries} entries` : `a polynomial in ${ch.entries} segments`;
    const summary = `Wrote the conversion of '${channel}' into ${path.basename(file)}${existing === undefined ? ' (a new file)' : ''}: ${how}, ` +
      `worst error ${fixedNumber(ch.maxErrorC, 3)} °C against the model over every in-range code, about ${trimNumber(ch.bytesEstimate, 4)} bytes of flash (8-bit AVR estimate); ` +
      `the file holds ${trimNumber(new TextEncoder().encode(text).length, 6)} bytes of C.`;
    return { ok: true, result: { file, text, create: existing === undefined, maxErrorC: ch.maxErrorC, method: ch.method, line, summary } };
  } catch (err) {
    return { ok: false, message: `code for '${channel}' could not be generated: ${err instanceof Error ? err.message : String(err)}` };
  }
}
