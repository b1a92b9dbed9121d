// The model sampled at every in-range code, and the error measure every design is judged by.

import { clamp } from './arith';
import { applyTrim, idealTrimmed, type TrimDesign } from './calibration';

export interface Samples {
  low: number;
  high: number;
  scale: number;
  /** Internal fraction bits F: the kernel works in 1/(scale * 2^F) degC and rounds to the output unit at the end. */
  frac: number;
  /** scale * 2^frac * celsiusAtCode(code) for code = low..high (kernel units). */
  f: Float64Array;
  /** What the trimmed output should be at each code (output units). */
  ideal: Float64Array;
  /** +1 when temperature rises with code, -1 when it falls. */
  dir: 1 | -1;
  trim: TrimDesign;
  /** Output type range the C clamps to. */
  outMin: number;
  outMax: number;
}

/** Scaled model value at any (possibly out-of-range, fractional) code: linear extrapolation outside. */
export function modelAt(s: Samples, code: number): number {
  const n = s.f.length;
  if (n === 1) return s.f[0]!;
  const i = clamp(Math.floor(code - s.low), 0, n - 2);
  const a = s.f[i]!;
  const b = s.f[i + 1]!;
  return a + (b - a) * (code - s.low - i);
}

/**
 * A kernel value rounded to the output unit: floor((k + 2^(F-1)) / 2^F), as the C does it. With a
 * two-point trim the kernel keeps its fraction bit into the trim, which does the rounding
 * (calibration.ts): the untrimmed value is then the kernel itself, in 1/2^F output units.
 */
export function rounded(s: Samples, kernel: number): number {
  return s.frac === 0 || s.trim.mode === 'two-point' ? kernel : Math.floor((kernel + 2 ** (s.frac - 1)) / 2 ** s.frac);
}

/** Final output (rounding, trim, clamp) from a kernel value. */
export function finish(s: Samples, kernel: number): number {
  return clamp(applyTrim(s.trim, rounded(s, kernel)), s.outMin, s.outMax);
}

/**
 * The same samples with F internal fraction bits: a coarse output unit then does not force table
 * points and constant terms onto whole output units (which costs many more points for the same
 * error). Only for kernels that stay inside int16 with room to spare.
 */
export function withFraction(s: Samples, frac: number): Samples {
  if (frac === 0) return s;
  return { ...s, frac, f: s.f.map((v) => v * 2 ** frac) };
}

/** |output - ideal| in output units at in-range code index k. */
export function errAt(s: Samples, k: number, kernel: number): number {
  return Math.abs(finish(s, kernel) - s.ideal[k]!);
}

export function makeIdeal(f: Float64Array, trim: TrimDesign, scale: number): Float64Array {
  const out = new Float64Array(f.length);
  for (let k = 0; k < f.length; k++) out[k] = idealTrimmed(trim, f[k]!, scale);
  return out;
}
