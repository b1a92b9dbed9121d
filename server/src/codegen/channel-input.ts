// A spec channel as generator input: its exact model inverse (analysis/inverse.ts), the code range
// of its sweep, and the code options of the channel (output unit, error target, method, float
// variant, board calibration). One implementation shared by the CLI `gen`, the code action and the
// stale-block check, so all three write and compare the same spec hash.
// Two spec fields change what the firmware converts: `measured` points (the conversion inverts the
// model fitted to them, calibration/fit.ts) and `oversampling = n bits` (the firmware hands over the
// decimated value of 4^n readings summed and shifted right by n, a (bits + n)-bit value).
import * as path from 'node:path';
import { channelKey } from '../analysis/cache';
import { kelvinAtVolts } from '../analysis/inverse';
import { channelDynamics } from '../analysis/dynamics';
import { sense } from '../analysis/sense';
import { fitMeasured, fittedChannel } from '../calibration/fit';
import type { ChannelResult } from '../analysis/types';
import type { Diagnostic } from '../diagnostics/diagnostic';
import type { ChannelDef } from '../model/types';
import { ZERO_CELSIUS_K } from '../physics/constants';
import { faultLimits, sensorFaults, usableCodes, type SensorFault } from '../analysis/sensor-faults';
export { faultLimits } from '../analysis/sensor-faults';
import { kindOf } from '../sensors/registry';
import type { ConversionInput } from './types';
import { CodegenInputError, type CompensatedInput } from '../sensors/conversion';

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

/** Widest code the generated functions take (their argument is a uint16_t). */
export const MAX_CODE_BITS = 16;

/** Bits of the value the conversion takes: the ADC's plus the stated oversampling bits. */
export function conversionBits(c: ChannelDef): number {
  return c.adc.bits + (c.oversamplingBits ?? 0);
}

/** Why a channel's code cannot be generated because its value is too wide (null when it fits). */
export function tooWideMessage(c: ChannelDef): string | null {
  // A channel that reads another (a thermocouple's cold junction) needs that reading as a second
  // input of its conversion: its kind gives it (`conversionInput`), else no code is made.
  const linked = Object.entries(c.linked ?? {})[0];
  if (linked && !kindOf(c.sensor).conversionInput) return `its conversion takes the reading of channel '${linked[1].name}' (${linked[0]}) as a second input, which this generator does not make yet`;
  const bits = conversionBits(c);
  if (bits <= MAX_CODE_BITS) return null;
  const n = c.oversamplingBits ?? 0;
  return n > 0
    ? `the generator takes values of up to ${MAX_CODE_BITS} bits ('${c.adc.name}' has ${c.adc.bits} bits and oversampling adds ${n}: ${bits}); lower the oversampling to at most ${Math.max(0, MAX_CODE_BITS - c.adc.bits)} bits`
    : `the generator handles ADCs of up to ${MAX_CODE_BITS} bits ('${c.adc.name}' has ${c.adc.bits})`;
}

/**
 * Mean ADC reading, in LSB of the converter, that a decimated value D of n extra bits stands for.
 * D = floor(S / 2^n) with S the sum of 4^n readings (AVR121), so the mean S / 4^n lies in
 * [D / 2^n, (D + 1) / 2^n - 1 / 4^n]; its centre is (D + 0.5 - 2^-(n+1)) / 2^n. With n = 0 this
 * is the code itself.
 */
export function meanReadingOfDecimated(d: number, n: number): number {
  return n === 0 ? d : (d + 0.5 - 2 ** -(n + 1)) / 2 ** n;
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
 * The first error reported inside the channel's block or the blocks of its sensor and ADC (a
 * definition with an error may have taken a default in its place), or undefined.
 */
export function channelError(c: ChannelDef, diagnostics: readonly Diagnostic[]): Diagnostic | undefined {
  const inside = (d: Diagnostic, b: { file: string; span: { start: number; end: number } }) => d.file === b.file && d.span.start >= b.span.start && d.span.end <= b.span.end;
  return diagnostics.find((d) => d.severity === 'error' && (inside(d, c) || inside(d, c.sensor) || inside(d, c.adc)));
}

/**
 * Channels whose code can be generated: analysed, ADC of at most 16 bits, and (when the analysis'
 * diagnostics are given) no error reported inside the channel's block or its sensor's or ADC's, since an erroneous design
 * (a clipping ADC, a junction that is not biased) has no sound inverse over its codes.
 */
export function generatableResults(channels: readonly ChannelResult[], diagnostics: readonly Diagnostic[] = []): ChannelResult[] {
  return channels.filter((r) => tooWideMessage(r.channel) === null && channelError(r.channel, diagnostics) === undefined);
}

function faultNotes(faults: readonly SensorFault[]): string[] {
  return faults.map((f) => `${f.what[0]!.toUpperCase()}${f.what.slice(1)}: ADC code ${f.code}${f.distinct ? '' : ' (a temperature of the range gives it too: cannot be told apart)'}; assumes ${f.assumption}.`);
}

/** A channel's code options as the generator resolves them; `errorC` undefined when the spec states none. */
function codeOptions(c: ChannelDef) {
  const o = c.codegen;
  return {
    outputScale: o?.outputScale ?? CODE_DEFAULTS.outputScale,
    errorC: o?.errorC,
    method: o?.method ?? CODE_DEFAULTS.method,
    optimise: o?.optimise ?? 'balanced',
    floatVariant: o?.floatVariant ?? CODE_DEFAULTS.floatVariant,
  } as const;
}

/**
 * The generator input of any channel (what `gen`, the code action and the comparison hand to
 * generateC): a function of the ADC code (conversionInput), or, for a kind whose conversion takes a
 * second input (its `conversionInput` member, e.g. a thermocouple's cold-junction temperature), a
 * two-input conversion (codegen/compensated.ts).
 */
export function generatorInput(r: ChannelResult, specPath: string): ConversionInput | CompensatedInput {
  const c = r.channel;
  const kind = kindOf(c.sensor);
  // The kind's safety cautions go into the generated block's comment, as under its reports.
  const cautions = kind.cautions?.length ? { cautions: kind.cautions } : {};
  if (kind.conversionInput) {
    return { ...kind.conversionInput(r, { specHash: channelSpecHash(c), notes: [`Channel ${c.name} of ${path.basename(specPath)}.`], options: codeOptions }), ...cautions };
  }
  return { ...conversionInput(r, specPath), ...cautions };
}

/** A channel converted from its ADC code alone; a channel of a two-input kind is refused (generatorInput takes it). */
/** Why a channel is not converted from its ADC code alone (its kind converts with a second input, such as a cold junction's reading), or null. */
export function secondInputOf(c: ChannelDef): string | null {
  const kind = kindOf(c.sensor);
  return kind.conversionInput ? `${kind.a} channel converts the ADC code with a second input (another channel's reading)` : null;
}

export function conversionInput(r: ChannelResult, specPath: string): ConversionInput {
  const c = r.channel;
  const second = secondInputOf(c);
  if (second) throw new CodegenInputError(c.name, 'sensor', `${second}; it is generated together with the channels it reads`);
  const opts = c.codegen ?? CODE_DEFAULTS;
  // Measured points: convert with the model fitted to them (the nominal model when none).
  const model = fittedChannel(c);
  const n = c.oversamplingBits ?? 0;
  const bits = c.adc.bits + n;
  const lsb = c.adc.reference.value / 2 ** c.adc.bits;
  // Codes at the range ends map to voltages a little beyond the swept ones: widen the search.
  const lowK = Math.max(1, c.lowK - 50);
  const highK = c.highK + 50;
  // The ADC codes of the range: the sweep's for the nominal model, the fitted model's own otherwise.
  let codeMin = r.summary.codeMin;
  let codeMax = r.summary.codeMax;
  if (model !== c) {
    const top = 2 ** c.adc.bits - 1;
    const codeAt = (k: number) => Math.min(top, Math.max(0, Math.floor(sense(model, k).volts / lsb)));
    const a = codeAt(c.lowK);
    const b = codeAt(c.highK);
    codeMin = Math.min(a, b);
    codeMax = Math.max(a, b);
  }
  // The end codes of the converter's scale stand for every voltage beyond them: never in range.
  const usable = usableCodes(c.adc.bits, codeMin, codeMax);
  if (!usable) {
    throw new CodegenInputError(c.name, 'range', `every code of the range is an end code of '${c.adc.name}' (0 or ${2 ** c.adc.bits - 1}), which stands for any voltage beyond it; move the sensed voltage inside 1 .. ${2 ** c.adc.bits - 2} LSB`);
  }
  // Decimated values: ADC code k covers the values k * 2^n .. (k + 1) * 2^n - 1.
  const codeLow = usable.low * 2 ** n;
  const codeHigh = Math.min(2 ** bits - 1, (usable.high + 1) * 2 ** n - 1);
  const faults = sensorFaults(c, codeMin, codeMax);
  const limits = faultLimits(faults, codeLow, codeHigh, n);
  // Board calibration from the spec: the trims differ per board, so the firmware sets them at run
  // time (offset 0 and gain 1 until it does).
  const cal = c.calibration?.mode;
  const calibration: ConversionInput['calibration'] =
    cal === 'one-point'
      ? { mode: 'offset', offset: 0, runtime: true }
      : cal === 'two-point'
        ? { mode: 'two-point', offset: 0, gain: 1, runtime: true }
        : { mode: 'none', runtime: false };
  const notes = [`Channel ${c.name} of ${path.basename(specPath)}.`];
  if (model !== c) {
    const out = fitMeasured(c)?.outlier ?? null;
    const left = out === null ? '' : ` (the point ${c.measured![out]!.code} counts at ${+(c.measured![out]!.kelvin - ZERO_CELSIUS_K).toFixed(3)} °C disagrees with the others and is left out)`;
    notes.push(`Converts with the model fitted to the ${c.measured!.length - (out === null ? 0 : 1)} measured point(s) of the spec${left}.`);
  }
  if (n > 0) {
    notes.push(
      `Takes the decimated value of ${4 ** n} readings summed and shifted right by ${n} (oversampling = ${n} bits): ` +
        `${bits} bits, 0 .. ${2 ** bits - 1}; pass that value, not a single ${c.adc.bits}-bit reading.`,
    );
  }
  notes.push(...faultNotes(faults));
  // The firmware filter chosen for the channel's noise limit (analysis/dynamics.ts), when there is one.
  const dynamics = channelDynamics(r);
  const filter = dynamics && dynamics.chosen.filter.kind !== 'none' ? dynamics.chosen.filter : undefined;
  return {
    channelName: c.name,
    bits,
    ...limits,
    ...(n > 0 ? { oversamplingBits: n } : {}),
    codeLow,
    codeHigh,
    celsiusAtCode: (code: number) => kelvinAtVolts(model, (meanReadingOfDecimated(code, n) + 0.5) * lsb, lowK, highK) - ZERO_CELSIUS_K,
    outputScale: opts.outputScale,
    errorTarget: opts.errorC,
    // `conversion = line`: the firmware converts with one straight line, as the spec says.
    method: c.conversion === 'line' ? 'line' : opts.method,
    optimise: ('optimise' in opts ? opts.optimise : undefined) ?? 'balanced',
    calibration,
    floatVariant: opts.floatVariant,
    specHash: channelSpecHash(c),
    note: notes.join(' '),
    ...('prefix' in opts && opts.prefix ? { prefix: opts.prefix } : {}),
    ...(filter ? { filter, ...(dynamics!.samplePeriodS !== null ? { samplePeriodS: dynamics!.samplePeriodS } : {}) } : {}),
  };
}
