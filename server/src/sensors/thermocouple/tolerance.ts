// Tolerance classes of the letter-designated thermocouples, IEC 60584-1 (the classes first published
// in IEC 60584-2:1982): the largest deviation allowed from the reference function, a temperature
// half-width in °C, the larger of a fixed value a and a fraction b of |t|, each over the class's
// temperature range; types R and S class 1 rise as 1 °C + 0.003 (t - 1100 °C) above 1100 °C.
// The classes and ranges agree with the 1982 table as a thermocouple supplier's published reference
// data reproduces it (found); the 2013 edition's values are recalled, from memory. Where that
// reproduction prints the R/S class 1 pivot as 1000 °C we keep 1100 °C (from memory): only 1100 °C
// makes the two pieces meet at 1 °C.
// A type/class pair with no entry (J, R and S class 3; B class 1) has no tolerance in the standard.

import { ZERO_CELSIUS_K } from '../../physics/constants';
import type { TcType } from './its90';

export type TcClass = 1 | 2 | 3;
export const TC_CLASSES: readonly TcClass[] = [1, 2, 3];

/** ±max(a, b|t|) over lowC..highC, plus, above `risesFromC`, a + rise (t - risesFromC) instead. */
interface ClassRule {
  lowC: number;
  highC: number;
  a: number;
  b: number;
  risesFromC?: number;
  rise?: number;
}

// IEC 60584-1 tolerance table (see the header for which values are found and which from memory).
const BASE_METAL_KN: Partial<Record<TcClass, ClassRule>> = {
  1: { lowC: -40, highC: 1000, a: 1.5, b: 0.004 },
  2: { lowC: -40, highC: 1200, a: 2.5, b: 0.0075 },
  3: { lowC: -200, highC: 40, a: 2.5, b: 0.015 },
};
const NOBLE_RS: Partial<Record<TcClass, ClassRule>> = {
  1: { lowC: 0, highC: 1600, a: 1, b: 0, risesFromC: 1100, rise: 0.003 },
  2: { lowC: -40, highC: 1600, a: 1.5, b: 0.0025 },
};

const RULES: Record<TcType, Partial<Record<TcClass, ClassRule>>> = {
  T: {
    1: { lowC: -40, highC: 350, a: 0.5, b: 0.004 },
    2: { lowC: -40, highC: 350, a: 1, b: 0.0075 },
    3: { lowC: -200, highC: 40, a: 1, b: 0.015 },
  },
  E: {
    1: { lowC: -40, highC: 800, a: 1.5, b: 0.004 },
    2: { lowC: -40, highC: 900, a: 2.5, b: 0.0075 },
    3: { lowC: -200, highC: 40, a: 2.5, b: 0.015 },
  },
  J: {
    1: { lowC: -40, highC: 750, a: 1.5, b: 0.004 },
    2: { lowC: -40, highC: 750, a: 2.5, b: 0.0075 },
  },
  K: BASE_METAL_KN,
  N: BASE_METAL_KN,
  R: NOBLE_RS,
  S: NOBLE_RS,
  B: {
    2: { lowC: 600, highC: 1700, a: 1.5, b: 0.0025 },
    3: { lowC: 600, highC: 1700, a: 4, b: 0.005 },
  },
};

/** Kelvin within this of a class range's end counts as the end. */
const END_SLACK_K = 1e-9;

/** The class's temperature range in kelvin, or null where the standard gives the type no such class. */
export function classRange(t: TcType, cls: TcClass): { lowK: number; highK: number } | null {
  const r = RULES[t][cls];
  return r ? { lowK: r.lowC + ZERO_CELSIUS_K, highK: r.highC + ZERO_CELSIUS_K } : null;
}

/** The classes the standard gives a type. */
export function classesOf(t: TcType): readonly TcClass[] {
  return TC_CLASSES.filter((c) => RULES[t][c] !== undefined);
}

/**
 * Half-width of the class tolerance at `kelvin`, in K; null where the standard gives none (no such
 * class for the type, or a temperature outside the class's range, or not a finite number).
 */
export function toleranceK(t: TcType, cls: TcClass, kelvin: number): number | null {
  const r = RULES[t][cls];
  if (!r || !Number.isFinite(kelvin)) return null;
  const lowK = r.lowC + ZERO_CELSIUS_K;
  const highK = r.highC + ZERO_CELSIUS_K;
  if (kelvin < lowK - END_SLACK_K || kelvin > highK + END_SLACK_K) return null;
  const c = kelvin - ZERO_CELSIUS_K;
  const base = Math.max(r.a, r.b * Math.abs(c));
  if (r.risesFromC !== undefined && r.rise !== undefined && c > r.risesFromC) return Math.max(base, r.a + r.rise * (c - r.risesFromC));
  return base;
}
