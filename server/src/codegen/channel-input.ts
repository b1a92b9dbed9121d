// A spec channel as generator input: its exact model inverse (analysis/inverse.ts), the code range
// of its sweep, and the code options of the channel (output unit, error target, method, float
// variant, board calibration). One implementation shared by the CLI `gen`, the code action and the
// stale-block check, so all three write and compare the same spec hash.
import * as path from 'node:path';
import { channelKey } from '../analysis/cache';
import { kelvinAtVolts } from '../analysis/inverse';
import type { ChannelResult } from '../analysis/types';
import type { Diagnostic } from '../checks/diagnostic';
import type { ChannelDef } from '../model/types';
import { ZERO_CELSIUS_K } from '../physics/constants';
import type { ConversionInput } from './types';

/** Defaults when the channel gives no code options: hundredths of a degC, 0.02 degC, auto. */
export const CODE_DEFAULTS = { outputScale: 100, errorC: 0.02, method: 'auto', floatVariant: false } as const;

/** `<spec-stem>_conversion.c` beside the spec. */
export function conversionFilePath(specPath: string): string {
  const stem = path.basename(specPath).replace(/\.tsense$/i, '');
  return path.join(path.dirname(specPath), `${stem}_conversion.c`);
}

/** The header that goes with a generated C file: same folder and stem, `.h`. */
export function headerPathFor(cPath: string): string {
  return cPath.replace(/\.[cC]$/, '') + '.h';
}

/** FNV-1a, 32 bits (Fowler, Noll, Vo; public-domain hash). */
function fnv1a(s: string): string {
  let h = 0x811c9dc5;
  for (let i = 0; i < s.length; i++) {
    h ^= s.charCodeAt(i);
    h = Math.imul(h, 0x01000193) >>> 0;
  }
  return h.toString(16).padStart(8, '0');
}

/**
 * Fingerprint of everything the channel's conversion depends on: its resolved inputs (sensor, ADC,
 * bias, range, code options...) without where they were written (analysis/cache.ts channelKey).
 * Reformatting, moving the channel or editing another channel leaves it unchanged.
 */
export function channelSpecHash(c: ChannelDef): string {
  return fnv1a(channelKey(c));
}

/**
 * Channels whose code can be generated: analysed, ADC of at most 16 bits, and (when the analysis'
 * diagnostics are given) no error reported inside the channel's block, since an erroneous design
 * (a clipping ADC, a junction that is not biased) has no sound inverse over its codes.
 */
export function generatableResults(channels: readonly ChannelResult[], diagnostics: readonly Diagnostic[] = []): ChannelResult[] {
  const errs = diagnostics.filter((d) => d.severity === 'error');
  return channels.filter((r) => {
    const c = r.channel;
    return c.adc.bits <= 16 && !errs.some((d) => d.file === c.file && d.span.start >= c.span.start && d.span.end <= c.span.end);
  });
}

export function conversionInput(r: ChannelResult, specPath: string): ConversionInput {
  const c = r.channel;
  const opts = c.codegen ?? CODE_DEFAULTS;
  const lsb = c.adc.reference.value / 2 ** c.adc.bits;
  // Codes at the range ends map to voltages a little beyond the swept ones: widen the search.
  const lowK = Math.max(1, c.lowK - 50);
  const highK = c.highK + 50;
  // Board calibration from the spec: the trims differ per board, so the firmware sets them at run
  // time (offset 0 and gain 1 until it does).
  const cal = c.calibration?.mode;
  const calibration: ConversionInput['calibration'] =
    cal === 'one-point'
      ? { mode: 'offset', offset: 0, runtime: true }
      : cal === 'two-point'
        ? { mode: 'two-point', offset: 0, gain: 1, runtime: true }
        : { mode: 'none', runtime: false };
  return {
    channelName: c.name,
    bits: c.adc.bits,
    codeLow: r.summary.codeMin,
    codeHigh: r.summary.codeMax,
    celsiusAtCode: (code: number) => kelvinAtVolts(c, (code + 0.5) * lsb, lowK, highK) - ZERO_CELSIUS_K,
    outputScale: opts.outputScale,
    errorTarget: opts.errorC,
    method: opts.method,
    calibration,
    floatVariant: opts.floatVariant,
    specHash: channelSpecHash(c),
    note: `Channel ${c.name} of ${path.basename(specPath)}.`,
  };
}
