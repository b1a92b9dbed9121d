// "Generate conversion code for <channel>": the channel's exact model inverse handed to the C
// generator (server/src/codegen), written into `<spec-stem>_conversion.c` next to the spec.
// A new file gets the generator's whole output; an existing one has only this channel's marked
// block replaced (or appended), so hand-written code around it is kept.
import * as path from 'node:path';
import type { Analysis } from '../engine';
import type { ChannelResult } from '../analysis/types';
import { kelvinAtVolts } from '../analysis/inverse';
import { ZERO_CELSIUS_K } from '../physics/constants';
import { generateC, spliceGenerated, type ConversionInput } from '../codegen/index';

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

export function conversionFilePath(specPath: string): string {
  const stem = path.basename(specPath).replace(/\.tsense$/i, '');
  return path.join(path.dirname(specPath), `${stem}_conversion.c`);
}

/** The channels code can be generated for, by name. */
export function generatableChannels(a: Analysis): string[] {
  return a.channels.filter((r) => r.channel.adc.bits <= 16).map((r) => r.channel.name);
}

/** FNV-1a, 32 bits (Fowler, Noll, Vo; public-domain hash): a short fingerprint of the channel's spec text. */
function fnv1a(s: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}

export function conversionInput(a: Analysis, r: ChannelResult): ConversionInput {
  const c = r.channel;
  const lsb = c.adc.reference.value / 2 ** c.adc.bits;
  // Codes at the range ends map to voltages a little beyond the swept ones: widen the search.
  const lowK = Math.max(1, c.lowK - 50);
  const highK = c.highK + 50;
  const text = a.files[0]!.text.slice(c.span.start, c.span.end);
  return {
    channelName: c.name,
    bits: c.adc.bits,
    codeLow: r.summary.codeMin,
    codeHigh: r.summary.codeMax,
    celsiusAtCode: (code: number) => kelvinAtVolts(c, (code + 0.5) * lsb, lowK, highK) - ZERO_CELSIUS_K,
    outputScale: 100,
    errorTarget: 0.02,
    method: 'auto',
    calibration: { mode: 'none', runtime: false },
    floatVariant: false,
    specHash: fnv1a(text),
    note: `Channel ${c.name} of ${path.basename(a.path)}.`,
  };
}

/** Generates the channel's code; `existing` is the current text of the C file, if it exists. */
export function generateForChannel(a: Analysis, channel: string, existing: string | undefined): GenerateOutcome {
  const r = a.channels.find((x) => x.channel.name === channel);
  if (!r) return { ok: false, message: `channel '${channel}' has errors; fix them before generating code` };
  if (r.channel.adc.bits > 16) return { ok: false, message: `the generator handles ADCs of up to 16 bits ('${r.channel.adc.name}' has ${r.channel.adc.bits})` };
  const file = conversionFilePath(a.path);
  const stem = path.basename(file, '.c');
  try {
    const input = conversionInput(a, r);
    const gen = generateC([input], { fileStem: stem });
    const ch = gen.channels[0]!;
    if (existing === undefined) return { ok: true, result: { file, text: gen.text, create: true, maxErrorC: ch.maxErrorC, method: ch.method } };
    const spliced = spliceGenerated(existing, [{ channel, hash: input.specHash, text: ch.code }]);
    if (!spliced.ok) return { ok: false, message: `${path.basename(file)}: ${spliced.message}` };
    return { ok: true, result: { file, text: spliced.text, create: false, maxErrorC: ch.maxErrorC, method: ch.method } };
  } catch (err) {
    return { ok: false, message: `code for '${channel}' could not be generated: ${err instanceof Error ? err.message : String(err)}` };
  }
}
