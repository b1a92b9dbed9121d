// The designer: validates a one-dimensional input, samples its model at every in-range code (any
// integer input over a range), picks the smallest design (table or piecewise quadratic) that meets
// the error target in exact integer simulation, and plans its C (generate.ts writes it).

import { INT16_MAX, INT16_MIN, clamp } from './arith';
import { MAX_AVERAGE_LOG2, MAX_RECURSIVE_SHIFT } from '../analysis/dynamics';
import { GAIN_Q, GAIN_Q_MAX, TWO_POINT_FRAC, applyTrim, trimDesign } from './calibration';
import { narrowSpans, roundsByShift, splitTable, type ChannelPlan } from './emit';
import { uniqueIdentifiers } from './names';
import { designPolynomial, polyKernel, type PolyDesign } from './polynomial';
import { finish, makeIdeal, rounded, withFraction, type Samples } from './samples';
import { designTable, tableKernel, type TableDesign } from './table';
import type { ConversionInput } from './types';
import { CodegenInputError } from '../sensors/conversion';
import { prefixProblem } from '../model/code-prefix';

/**
 * The firmware filter's reset and update (codegen/filter.ts): linked flash bytes they add to a
 * program that converts (reset and update called minus not; the state is RAM and not counted),
 * measured by tests/unit/codegen/filter-compile.test.ts, which holds these to 15 %: atmega328p,
 * the recursive filter 108..128 bytes for shifts 1..16 and the average of 2^m values 144..190 for
 * m = 1..6; Cortex-M0 44..48 and 76..100 (alone, without a conversion, about 15 bytes more: they
 * share start-up and literal-pool code). avr-gcc 5.4, arm-none-eabi-gcc with newlib-nano,
 * 2026-12-02; the filtered builds of size-estimate.test.ts hold the totals to 10 %.
 */
const FILTER_SIZE = {
  avr: { recursive: 122, average: 138, perLog2: 8 },
  m0: { recursive: 49, average: 74, perLog2: 5 },
} as const;

/** The size model's counts of a firmware filter (what sizeFeatures adds for it). */
function filterFeatures(f: NonNullable<ConversionInput['filter']>): Partial<Record<SizeFeature, number>> {
  return f.kind === 'recursive' ? { filterRecursive: 1 } : { filterAverage: 1, filterAveragePerLog2: f.log2n };
}

/** Estimated linked bytes of a channel's firmware filter on a target; 0 without one. */
export function filterBytes(f: ConversionInput['filter'], target: SizeTarget): number {
  return f ? weigh(filterFeatures(f), target) : 0;
}

/**
 * Linked flash bytes of one channel's code around its data, per target, at -Os with
 * -ffunction-sections and --gc-sections: the ELF's .text + .data of a minimal program calling the
 * channel's functions (conversion, trim setter, float variant, filter) minus the same program
 * without the calls, library routines included (atmega328p: avr-gcc 5.4; Cortex-M0: -mcpu=cortex-m0
 * -mthumb, arm-none-eabi-gcc with newlib-nano). Bytes per count of sizeFeatures, fitted to minimise
 * the largest relative error over 189 measured builds (every sample channel under auto, table,
 * polynomial, line, 0.1 degC, fixed and run-time trims, both filters and the float variant, and the
 * four invented thermocouple channels): worst 8.6 % on the AVR, 7.9 % on the Cortex-M0. Re-measure
 * when the emitted C changes: tests/unit/codegen/size-estimate.test.ts links the real sizes
 * (tests/fixtures/codegen/linked-size.ts) and holds every estimate to 10 %. Not fitted: the filter
 * terms (FILTER_SIZE, measured directly) and the Cortex-M0's `combine`, set by hand to the links of
 * all eight thermocouple types (the fit over four left type N 12 % under); `fractionShift` and
 * `narrowSpan`, measured directly (avr-gcc 5.4, 2026-12-03), with the AVR's `split` refitted beside
 * them (103.7 to 102.1 bytes; 193 builds, worst 9.6 % on the AVR, 7.9 % on the Cortex-M0). Refitted
 * when a clamped code's return became one store a side (emit.ts clampCode; 4 to 24 B less on the
 * AVR): on the AVR the fault side, polynomial, run-time offset, gain trim and code shift; on the
 * Cortex-M0 the fault side, direct, split, table32, polynomial, one segment, both run-time trims and
 * polyMulti; each moved as little as the minimax allowed, none made negative where it was not
 * (2026-12-03; worst in size-estimate.test.ts's log).
 */
export const SIZE_MODEL = {
  avr: { direct: 32.7, polynomial: 308.2, split: 102.1, table16: 154.7, table32: 217.8, polyMulti: 8, oneSegment: -8.2, codeShift: 4.2, narrowSpan: -14, wideConst: 0.2, fraction: 0, fractionShift: 4, offsetTrim: 8, gainTrim: 49.8, runtimeOffset: 62.7, runtimeTwoPoint: 318.9, floatInterp: 1288.6, floatOneSegment: 1076.9, floatPlain: 1230, floatTwoPoint: 0, floatOffset: 0, faultSide: 25.6, out32: 13, filterRecursive: FILTER_SIZE.avr.recursive, filterAverage: FILTER_SIZE.avr.average, filterAveragePerLog2: FILTER_SIZE.avr.perLog2, combine: 245.2 },
  m0: { direct: 53.7, polynomial: 88.2, split: 87.5, table16: 93.3, table32: 85.9, polyMulti: 18.6, oneSegment: -39.0, codeShift: 1.1, narrowSpan: 0, wideConst: 8.7, fraction: 0, fractionShift: 0, offsetTrim: 8, gainTrim: 30, runtimeOffset: 75.8, runtimeTwoPoint: 190.8, floatInterp: 3232.1, floatOneSegment: 2232.2, floatPlain: 2742, floatTwoPoint: 0, floatOffset: 0, faultSide: 7.0, out32: 0, filterRecursive: FILTER_SIZE.m0.recursive, filterAverage: FILTER_SIZE.m0.average, filterAveragePerLog2: FILTER_SIZE.m0.perLog2, combine: 92 },
} as const;

export type SizeTarget = keyof typeof SIZE_MODEL;
export type SizeFeature = keyof typeof SIZE_MODEL.avr;

const MAX_CODES = 65536;

function fail(c: ConversionInput, field: string, msg: string): never {
  throw new CodegenInputError(String(c.channelName), field, msg);
}

/** Throws CodegenInputError naming the field and the accepted range. */
export function validateInput(c: ConversionInput): void {
  if (typeof c.channelName !== 'string') fail(c, 'channelName', 'must be a string');
  if (!Number.isInteger(c.bits) || c.bits < 1 || c.bits > 16) fail(c, 'bits', `must be an integer 1..16, got ${c.bits}`);
  if (c.oversamplingBits !== undefined && (!Number.isInteger(c.oversamplingBits) || c.oversamplingBits < 0 || c.oversamplingBits >= c.bits))
    fail(c, 'oversamplingBits', `must be an integer 0..${c.bits - 1} (below bits), got ${c.oversamplingBits}`);
  const top = 2 ** c.bits - 1;
  if (!Number.isInteger(c.codeLow) || c.codeLow < 0 || c.codeLow > top)
    fail(c, 'codeLow', `must be an integer 0..${top}, got ${c.codeLow}`);
  if (!Number.isInteger(c.codeHigh) || c.codeHigh < c.codeLow || c.codeHigh > top)
    fail(c, 'codeHigh', `must be an integer ${c.codeLow}..${top} (codeLow..2^bits-1), got ${c.codeHigh}`);
  if (!Number.isInteger(c.outputScale) || c.outputScale < 1 || c.outputScale > 10000)
    fail(c, 'outputScale', `must be an integer 1..10000, got ${c.outputScale}`);
  if (!Number.isFinite(c.errorTarget) || c.errorTarget <= 0 || c.errorTarget > 100)
    fail(c, 'errorTarget', `must be a number in (0, 100] degC, got ${c.errorTarget}`);
  if (c.errorTarget * c.outputScale < 0.5)
    fail(c, 'errorTarget', `${c.errorTarget} degC is below half an output unit (0.5/${c.outputScale} degC); raise outputScale or the target`);
  if (c.optimise !== undefined && !['size', 'speed', 'balanced'].includes(c.optimise)) fail(c, 'optimise', `must be size, speed or balanced, got ${String(c.optimise)}`);
  if (!['auto', 'table', 'polynomial', 'line'].includes(c.method)) fail(c, 'method', `must be auto, table, polynomial or line, got ${String(c.method)}`);
  const cal = c.calibration;
  if (!cal || !['none', 'offset', 'two-point'].includes(cal.mode))
    fail(c, 'calibration.mode', `must be none, offset or two-point, got ${String(cal?.mode)}`);
  if (cal.offset !== undefined && (!Number.isFinite(cal.offset) || Math.abs(cal.offset * c.outputScale) > 32767))
    fail(c, 'calibration.offset', `must be finite with |offset| <= ${(32767 / c.outputScale).toFixed(2)} degC, got ${cal.offset}`);
  if (cal.gain !== undefined && (!Number.isFinite(cal.gain) || cal.gain < 0.5 || cal.gain > GAIN_Q_MAX / 2 ** GAIN_Q))
    fail(c, 'calibration.gain', `must be in 0.5..${(GAIN_Q_MAX / 2 ** GAIN_Q).toFixed(4)}, got ${cal.gain}`);
  for (const [field, v, ok] of [
    ['faultBelow', c.faultBelow, (x: number) => x < c.codeLow],
    ['faultAbove', c.faultAbove, (x: number) => x > c.codeHigh],
  ] as const) {
    if (v !== undefined && (!Number.isInteger(v) || v < 0 || v > top || !ok(v)))
      fail(c, field, `must be an integer 0..${top} outside the in-range codes ${c.codeLow}..${c.codeHigh}, got ${v}`);
  }
  if (typeof c.specHash !== 'string') fail(c, 'specHash', 'must be a string');
  const ownPrefix = c.prefix === undefined ? undefined : typeof c.prefix === 'string' ? prefixProblem(c.prefix) : 'must be a string';
  if (ownPrefix) fail(c, 'prefix', ownPrefix);
  const fl = c.filter;
  if (fl !== undefined) {
    const ok =
      fl.kind === 'recursive' ? Number.isInteger(fl.shift) && fl.shift >= 1 && fl.shift <= MAX_RECURSIVE_SHIFT
        : fl.kind === 'average' ? Number.isInteger(fl.log2n) && fl.log2n >= 1 && fl.log2n <= MAX_AVERAGE_LOG2 : false;
    if (!ok) fail(c, 'filter', `must be a recursive filter of shift 1..${MAX_RECURSIVE_SHIFT} or an average of 2^1..2^${MAX_AVERAGE_LOG2} values, got ${JSON.stringify(fl)}`);
  }
  if (typeof c.celsiusAtCode !== 'function') fail(c, 'celsiusAtCode', 'must be a function');
}

/** The model sampled at every in-range code of a validated input, without fraction bits. */
export function sample(c: ConversionInput): Samples {
  const n = c.codeHigh - c.codeLow + 1;
  if (n > MAX_CODES) fail(c, 'codeHigh', `range too wide (${n} codes)`);
  const f = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let v: number;
    try {
      v = c.celsiusAtCode(c.codeLow + k);
    } catch (e) {
      fail(c, 'celsiusAtCode', `threw at code ${c.codeLow + k}: ${(e as Error).message}`);
    }
    if (!Number.isFinite(v) || Math.abs(v) > 10000)
      fail(c, 'celsiusAtCode', `ADC code ${c.codeLow + k} maps to no temperature the sensor gives within 50 K of the channel's range (a count is too coarse or the reference too far above the sensed voltage); use more bits or a reference nearer the sensed voltage`);
    f[k] = v * c.outputScale;
    if (Math.abs(f[k]!) > 2 ** 30) fail(c, 'outputScale', `scaled temperature ${f[k]} at code ${c.codeLow + k} exceeds 2^30`);
  }
  const dir: 1 | -1 = n > 1 ? (f[n - 1]! < f[0]! ? -1 : 1) : oneCodeDirection(c);
  for (let k = 1; k < n && !c.anyShape; k++) {
    if ((f[k]! - f[k - 1]!) * dir < 0)
      fail(c, 'celsiusAtCode', `not monotonic: ${f[k - 1]! / c.outputScale} degC at code ${c.codeLow + k - 1}, ${f[k]! / c.outputScale} degC at code ${c.codeLow + k}`);
  }
  const trim = trimDesign(c.calibration, c.outputScale);
  let fmax = 0;
  for (const v of f) fmax = Math.max(fmax, Math.abs(v));
  const outBits: 16 | 32 = fmax * (trim.mode === 'two-point' ? 2 : 1) + Math.abs(trim.offsetScaled) + 2 <= INT16_MAX ? 16 : 32;
  if (trim.mode === 'two-point' && outBits === 32)
    fail(c, 'outputScale', `two-point trim needs |temperature x outputScale| < 16384; got up to ${Math.round(fmax)}`);
  return {
    low: c.codeLow,
    high: c.codeHigh,
    scale: c.outputScale,
    frac: 0,
    f,
    ideal: makeIdeal(f, trim, c.outputScale),
    dir,
    trim,
    outMin: outBits === 16 ? INT16_MIN : -2147483648,
    outMax: outBits === 16 ? INT16_MAX : 2147483647,
  };
}

/**
 * Direction of a one-code range: the model a quarter code either side of the code's centre (still
 * inside its step). Rising when the model cannot say.
 */
function oneCodeDirection(c: ConversionInput): 1 | -1 {
  try {
    const a = c.celsiusAtCode(c.codeLow - 0.25);
    const b = c.celsiusAtCode(c.codeLow + 0.25);
    return Number.isFinite(a) && Number.isFinite(b) && b < a ? -1 : 1;
  } catch {
    return 1;
  }
}

/** Smallest and largest |degC per code step| over the range (one code: across its own step). */
function perCount(c: ConversionInput, s: Samples): { min: number; max: number } {
  const n = s.f.length;
  let min = Infinity;
  let max = 0;
  for (let k = 1; k < n; k++) {
    const d = Math.abs(s.f[k]! - s.f[k - 1]!) / c.outputScale;
    min = Math.min(min, d);
    max = Math.max(max, d);
  }
  if (n === 1) {
    try {
      const d = Math.abs(c.celsiusAtCode(c.codeLow + 0.5) - c.celsiusAtCode(c.codeLow - 0.5));
      if (Number.isFinite(d)) min = max = d;
    } catch {
      // no figure: the header then says nothing of the step
    }
  }
  return Number.isFinite(min) ? { min, max } : { min: NaN, max: NaN };
}

type Design = TableDesign | PolyDesign;

/** The emitted form of a design, as the size model tells them apart. */
export function formOf(d: Design, s: Samples): 'direct' | 'polynomial' | 'split' | 'table16' | 'table32' {
  if (d.kind === 'polynomial') return 'polynomial';
  if (d.shift === 0) return 'direct';
  if (!roundsByShift(d)) return 'table32';
  return splitTable(d, s.high) ? 'split' : 'table16';
}

/** What a plan adds that the design alone does not say (fault tests, a 32-bit output, float variant, filter). */
export interface SizeExtra {
  faultSides: number;
  out32: boolean;
  floatVariant: boolean;
  filter?: ConversionInput['filter'];
}

/**
 * The counts the size model weighs (SIZE_MODEL's keys): the emitted form, what the compiler folds
 * (a one-segment table or polynomial has a constant index; a polynomial without a quadratic term
 * loses a multiply), the rounding step, the trims, and with `extra` the plan's additions.
 */
export function sizeFeatures(d: Design, s: Samples, extra?: SizeExtra): Partial<Record<SizeFeature, number>> {
  const f: Partial<Record<SizeFeature, number>> = {};
  const form = formOf(d, s);
  f[form] = 1;
  // The byte-split form shifts the code left by 8 - shift bits, unrolled (emit.ts THSC_SHL16).
  if (form === 'split' && d.kind === 'table') f.codeShift = 8 - d.shift;
  // Spans of a byte: one flash read and one 8 x 8 multiply fewer (emit.ts SHARED_NARROW), measured
  // on the samples' door thermistors: 14 bytes and 10 cycles on the AVR, no byte on the Cortex-M0.
  if (form === 'split' && narrowSpans(d)) f.narrowSpan = 1;
  if (d.kind === 'polynomial') {
    if (d.coefs.length > 1) f.polyMulti = 1;
  } else if (d.shift > 0 && d.entries.length === 2) f.oneSegment = 1;
  if (d.kind === 'polynomial' && d.coefs.length === 1) f.oneSegment = 1;
  const twoPoint = s.trim.mode === 'two-point';
  if (s.frac > 0 && !twoPoint) {
    f.fraction = 1;
    // The 16-bit table kernel's rounding is one arithmetic shift (emit.ts roundFraction), measured
    // with avr-gcc 5.4 -Os: an asr/ror pair (4 bytes, 2 cycles) per bit for 1 or 2 bits, a
    // 10-byte loop for 3 or more (counted as 2.5 pairs); on a Cortex-M0 one asrs at any count.
    if (roundsByShift(d)) f.fractionShift = roundingShifts(s.frac);
  }
  if (s.trim.mode === 'offset') f[s.trim.runtime ? 'runtimeOffset' : 'offsetTrim'] = 1;
  if (twoPoint) f[s.trim.runtime ? 'runtimeTwoPoint' : 'gainTrim'] = 1;
  if (extra) {
    if (extra.faultSides) f.faultSide = extra.faultSides;
    if (extra.out32) f.out32 = 1;
    // The float variant interpolates in float (table with spacing) or converts one integer result.
    if (extra.floatVariant) {
      // A float interpolation over one segment has constant points, which the compiler folds.
      f[d.kind === 'table' && d.shift > 0 ? (d.entries.length === 2 ? 'floatOneSegment' : 'floatInterp') : 'floatPlain'] = 1;
      if (s.trim.mode !== 'none') f[s.trim.mode === 'two-point' ? 'floatTwoPoint' : 'floatOffset'] = 1;
    }
    if (extra.filter) Object.assign(f, filterFeatures(extra.filter));
  }
  return f;
}

/** The size model's count of the rounding shift of F fraction bits (SIZE_MODEL `fractionShift`: asr/ror pairs). */
export function roundingShifts(frac: number): number {
  return frac <= 2 ? frac : 2.5;
}

/** AVR cycles of the rounding shift of F fraction bits: 2 a bit inline, about 5 a bit in avr-gcc's loop from 3 bits. */
export function roundingCycles(frac: number): number {
  return frac === 0 ? 0 : frac <= 2 ? 2 * frac : 1 + 5 * frac;
}

/** Estimated linked bytes of code on a target: SIZE_MODEL weighing the counts. */
export function weigh(features: Partial<Record<SizeFeature, number>>, target: SizeTarget): number {
  const m: Record<SizeFeature, number> = SIZE_MODEL[target];
  let b = 0;
  for (const [k, n] of Object.entries(features) as [SizeFeature, number][]) b += m[k] * n;
  return Math.round(b);
}

/**
 * Bytes a candidate is ranked by: its data and its code on the AVR without the narrow-span saving.
 * That saving is the AVR's alone; more points bought to reach it cost the Cortex-M0 their bytes
 * (on the samples' freezer probe at 0.1 degC, 6 points against 4: AVR 6 B smaller, M0 4 B larger),
 * so the form is used where the chosen points allow it and never chosen for.
 */
function rankBytes(d: Design, s: Samples): number {
  const f = sizeFeatures(d, s);
  delete f.narrowSpan;
  return dataBytes(d) + weigh(f, 'avr');
}

/** The size model's counts of a finished plan (its design, trims and additions). */
export function planSizeFeatures(p: ChannelPlan, s: Samples): Partial<Record<SizeFeature, number>> {
  const extra: SizeExtra = { faultSides: (p.faultBelow !== undefined ? 1 : 0) + (p.faultAbove !== undefined ? 1 : 0), out32: p.outBits === 32, floatVariant: p.floatVariant, ...(p.filter ? { filter: p.filter } : {}) };
  const f = sizeFeatures(p.design, s, extra);
  // Constants the conversion compares with or returns, and the points a one-segment design folds
  // into the code: on a Cortex-M0 each outside 0..255 is a literal-pool load, not an immediate.
  const d = p.design;
  const consts = [p.low, p.high - p.low, p.faultBelow, p.faultAbove, ...(p.trim.runtime ? [] : [p.outAtLow, p.outAtHigh])];
  if (d.kind === 'table' && d.shift > 0 && d.entries.length === 2) consts.push(d.entries[0]!, d.entries[1]! - d.entries[0]!);
  if (d.kind === 'polynomial' && d.coefs.length === 1) consts.push(...d.coefs[0]!);
  const wide = consts.filter((v) => v !== undefined && (v < 0 || v > 255)).length;
  if (wide) f.wideConst = wide;
  return f;
}

/** Bytes of a design's constants (table points or coefficients). */
export function dataBytes(d: Design): number {
  return d.kind === 'table' ? d.entries.length * (d.entryBits / 8) : d.coefs.length * 12;
}

export function kernelAt(d: Design, s: Samples, code: number): number {
  return d.kind === 'table' ? tableKernel(d, s.dir, code) : polyKernel(d, s.low, code);
}

interface Choice {
  design: Design;
  maxErr: number;
  bytes: number;
  /** The samples the design was made for (with its fraction bits). */
  s: Samples;
}

/**
 * Rough cycles of one conversion on an 8-bit AVR (simavr, atmega328p, -Os; `npm run bench` prints
 * the measured figures): they only rank designs for `optimise`.
 */
function cyclesEstimate(d: Design, s: Samples): number {
  // Measured: byte-split table 72, kiln's 32-bit-product table 231, kiln's polynomial 540.
  let base: number;
  if (d.kind === 'polynomial') base = 540;
  else if (d.shift === 0) base = 40;
  else {
    // A byte-split table whose spans fit a byte takes about 10 cycles fewer (emit.ts SHARED_NARROW);
    // not counted here, as the choice does not chase it (rankBytes).
    base = splitTable(d, s.high) ? 72 : roundsByShift(d) && d.mulBits === 16 ? 110 : 231;
  }
  const twoPoint = s.trim.mode === 'two-point';
  const rounding = s.frac > 0 && !twoPoint ? roundingCycles(s.frac) : 0;
  return base + rounding + (s.trim.mode === 'none' ? 0 : s.trim.mode === 'offset' ? 25 : 35);
}

/** Largest number of internal fraction bits tried. */
const MAX_FRAC = 4;

/** A straight line: two points, one segment over every in-range code (linear interpolation between them). */
function chooseLine(c: ConversionInput, s0: Samples): Choice {
  const s = s0;
  let shift = 0;
  while (shift < 15 && Math.floor(s.low / 2 ** shift) !== Math.floor(s.high / 2 ** shift)) shift++;
  // Start from the line of least maximum error for a curve that bends one way: the chord's slope,
  // moved halfway between the chord and the farthest point (Chebyshev equioscillation; e.g. any
  // numerical-analysis text on minimax approximation). The table search then refines it.
  const n = s.f.length;
  const slope = n > 1 ? (s.f[n - 1]! - s.f[0]!) / (n - 1) : 0;
  let dMin = Infinity;
  let dMax = -Infinity;
  for (let k = 0; k < n; k++) {
    const d = s.f[k]! - (s.f[0]! + slope * k);
    dMin = Math.min(dMin, d);
    dMax = Math.max(dMax, d);
  }
  const line = (code: number) => s.f[0]! + (dMin + dMax) / 2 + slope * (code - s.low);
  const r = Math.floor(s.low / 2 ** shift) === Math.floor(s.high / 2 ** shift) ? designTable(s, shift, line) : undefined;
  if (!r) fail(c, 'method', `a straight line over codes ${s.low}..${s.high} cannot be represented (the range crosses code 32768); use a table`);
  return { ...r, bytes: rankBytes(r.design, s), s };
}

function kernelFitsInt16(d: Design, s: Samples): boolean {
  for (let code = s.low; code <= s.high; code++) {
    const k = kernelAt(d, s, code);
    if (k < INT16_MIN || k > INT16_MAX) return false;
  }
  return true;
}

function choose(c: ConversionInput, s0: Samples): Choice {
  if (c.method === 'line') return chooseLine(c, s0);
  const target = c.errorTarget * c.outputScale;
  const n = s0.high - s0.low + 1;
  const maxShift = Math.min(15, Math.max(0, Math.ceil(Math.log2(Math.max(1, n)))));
  const candidates: Choice[] = [];
  let bestMissed: Choice | undefined;
  let fmax = 0;
  for (const v of s0.f) fmax = Math.max(fmax, Math.abs(v));
  // A two-point trim takes the kernel with exactly one fraction bit and rounds it itself
  // (calibration.ts); other kernels try 0..MAX_FRAC bits and round at the end.
  const twoPoint = s0.trim.mode === 'two-point';
  for (let frac = twoPoint ? TWO_POINT_FRAC : 0; frac <= (twoPoint ? TWO_POINT_FRAC : MAX_FRAC); frac++) {
    // Fraction bits only while the kernel stays well inside int16 (then the rounding is 16-bit).
    if (!twoPoint && frac > 0 && (fmax + 2) * 2 ** frac * 1.05 > 32000) break;
    const s = withFraction(s0, frac);
    const consider = (r: { design: Design; maxErr: number } | undefined) => {
      if (!r) return;
      // The two-point trim biases the kernel into uint16: it must be an int16 at every code.
      if (twoPoint && !kernelFitsInt16(r.design, s)) return;
      const ch = { ...r, bytes: rankBytes(r.design, s), s };
      if (r.maxErr <= target + 1e-9) candidates.push(ch);
      else if (!bestMissed || r.maxErr < bestMissed.maxErr) bestMissed = ch;
    };
    const mine = (kind: Design['kind'], sh: number) => candidates.some((x) => x.s === s && x.design.kind === kind && x.design.shift === sh);
    if (c.method !== 'polynomial' && !c.anyShape) {
      // From wide spacing down; stop at the first spacing that meets the target twice in a row
      // narrower: narrower tables are only bigger. A direct table needs no fraction bits.
      for (let sh = maxShift; sh >= (frac > 0 ? 1 : 0); sh--) {
        const before = candidates.length;
        consider(designTable(s, sh));
        if (candidates.length > before && mine('table', sh + 1)) break;
      }
    }
    if (c.method !== 'table') {
      for (let sh = maxShift; sh >= 1; sh--) {
        const before = candidates.length;
        consider(designPolynomial(s, sh));
        if (candidates.length > before && mine('polynomial', sh + 1)) break;
      }
    }
  }
  if (candidates.length === 0) {
    const best = bestMissed ? ` (best reached: ${(bestMissed.maxErr / c.outputScale).toFixed(4)} degC)` : '';
    fail(c, 'errorTarget', `${c.errorTarget} degC cannot be met by the ${c.method} method${best}; raise the target or outputScale`);
  }
  // size: fewest bytes; speed: fewest estimated cycles, then bytes; balanced: bytes plus cycles
  // (on an 8-bit MCU both run to a few hundred). Ties: fewer fraction bits (fewer cycles), smaller
  // error, then table before polynomial, then wider spacing.
  const opt = c.optimise ?? 'balanced';
  const cost = (x: Choice) => (opt === 'size' ? x.bytes : opt === 'speed' ? cyclesEstimate(x.design, x.s) * 1e6 + x.bytes : x.bytes + cyclesEstimate(x.design, x.s));
  candidates.sort((a, b) => cost(a) - cost(b) || a.s.frac - b.s.frac || a.maxErr - b.maxErr || (a.design.kind === 'table' ? -1 : 1) - (b.design.kind === 'table' ? -1 : 1) || b.design.shift - a.design.shift);
  return candidates[0]!;
}

/**
 * The design chosen for an input, made once per input object: the source and the header of one
 * generation, and a retry without a channel that failed, then reuse it rather than search again
 * (a spec with k failing channels once searched k + 1 times over). A fact attached to the input,
 * gone with it.
 */
const CHOSEN = new WeakMap<ConversionInput, Choice>();

function chosen(c: ConversionInput): Choice {
  let ch = CHOSEN.get(c);
  if (!ch) CHOSEN.set(c, (ch = choose(c, sample(c))));
  return ch;
}

/** Plans (validated and designed) for each input, in order; shared by generateC and the tests. */
export function planChannels(inputs: readonly ConversionInput[], prefix = ''): { plans: ChannelPlan[]; samples: Samples[]; bytes: number[]; bytesM0: number[] } {
  for (const c of inputs) validateInput(c);
  const badPrefix = prefixProblem(prefix);
  if (badPrefix && inputs[0]) fail(inputs[0], 'prefix', badPrefix);
  const seen = new Set<string>();
  for (const c of inputs) {
    if (seen.has(c.channelName)) fail(c, 'channelName', 'two channels have this name; markers need unique names');
    seen.add(c.channelName);
  }
  // A channel's own prefix (the spec's `code_prefix`) before the file-wide one.
  const ids = uniqueIdentifiers(inputs.map((c) => c.channelName)).map((id, i) => (inputs[i]!.prefix ?? prefix) + id);
  const plans: ChannelPlan[] = [];
  const samples: Samples[] = [];
  const bytes: number[] = [];
  const bytesM0: number[] = [];
  inputs.forEach((c, i) => {
    const one = planOne(c, ids[i]!);
    plans.push(one.plan);
    samples.push(one.samples);
    bytes.push(one.bytes);
    bytesM0.push(one.bytesM0);
  });
  return { plans, samples, bytes, bytesM0 };
}

/**
 * One validated input designed and planned under the C identifier `ident`. Its "code" may be any
 * integer input over a range (0..65535), not only an ADC code: compensated.ts designs the two
 * one-dimensional functions of a two-input conversion with it.
 */
export function planOne(c: ConversionInput, ident: string): { plan: ChannelPlan; samples: Samples; bytes: number; bytesM0: number } {
  {
    const ch = chosen(c);
    const s = ch.s;
    let lo = Infinity;
    let hi = -Infinity;
    let worst = 0;
    let kLo = Infinity;
    let kHi = -Infinity;
    for (let code = s.low; code <= s.high; code++) {
      const k = rounded(s, kernelAt(ch.design, s, code));
      kLo = Math.min(kLo, k);
      kHi = Math.max(kHi, k);
      const t = applyTrim(s.trim, k);
      lo = Math.min(lo, t);
      hi = Math.max(hi, t);
      worst = Math.max(worst, Math.abs(clamp(applyTrim(s.trim, k), s.outMin, s.outMax) - s.ideal[code - s.low]!));
    }
    const outBits: 16 | 32 = s.outMax === INT16_MAX ? 16 : 32;
    const plan: ChannelPlan = {
      name: c.channelName,
      ident,
      bits: c.bits,
      ...(c.oversamplingBits ? { oversamplingBits: c.oversamplingBits } : {}),
      low: c.codeLow,
      high: c.codeHigh,
      scale: c.outputScale,
      dir: s.dir,
      design: ch.design,
      trim: s.trim,
      outBits,
      // Run-time trims: the setter holds them so that no output leaves the type (emit.ts).
      needClamp: !s.trim.runtime && (lo - 1 < s.outMin || hi + 1 > s.outMax),
      kernelMin: kLo,
      kernelMax: kHi,
      kernelAtLow: rounded(s, kernelAt(ch.design, s, s.low)),
      kernelAtHigh: rounded(s, kernelAt(ch.design, s, s.high)),
      fracBits: s.frac,
      floatVariant: c.floatVariant,
      outAtLow: finish(s, kernelAt(ch.design, s, s.low)),
      outAtHigh: finish(s, kernelAt(ch.design, s, s.high)),
      ...(c.faultBelow !== undefined ? { faultBelow: c.faultBelow } : {}),
      ...(c.faultAbove !== undefined ? { faultAbove: c.faultAbove } : {}),
      perCountC: perCount(c, s),
      maxErrorC: worst / c.outputScale,
      errorTarget: c.errorTarget,
      ...(c.method === 'line' ? { line: true } : {}),
      ...(c.filter ? { filter: c.filter, ...(c.samplePeriodS !== undefined ? { samplePeriodS: c.samplePeriodS } : {}) } : {}),
      note: c.note,
      ...(c.cautions?.length ? { cautions: c.cautions } : {}),
    };
    const bytes = (t: SizeTarget) => dataBytes(ch.design) + weigh(planSizeFeatures(plan, s), t);
    return { plan, samples: s, bytes: bytes('avr'), bytesM0: bytes('m0') };
  }
}

/** Why `prefix` cannot start a generated identifier (the rule lives with the spec's `code_prefix`). */
export { prefixProblem };

