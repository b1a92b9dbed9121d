// Offset and two-point (gain + offset) trims applied to the converted value in integer arithmetic.
//
// Offset trim: out = y + O, y the untrimmed value in output units, O = round(offset * scale).
//
// Two-point trim: the kernel keeps one fraction bit (k = the untrimmed value in half output units,
// an int16) and the trim rounds once, to the output unit:
//   out = floor((u * g + 2^15) / 2^16) + c,  u = k + 2^15,  g = 2 G,  c = O - G,
// with G = round(gain * 2^14) (the Q14 gain the setter takes, 8192..24575: gain 0.5 .. 1.5). Since
// u * g = k * g + 2^16 G, this is floor(k * g / 2^16 + 1/2) + O = round(gain * k / 2) + O: the
// gain applied to the untrimmed value, rounded to the output unit, plus the offset.
// Why this form: u and g are unsigned 16-bit, so the product is one unsigned 16 x 16 multiply whose
// high half is the result (four hardware multiplies on an 8-bit AVR, any registers, no sign
// fix-ups); the bias of u and the rounding of the offset fold into c, which the setter computes
// once. No 32-bit multiply, no shift loop, no separate rounding step.

export const GAIN_Q = 14;
/** Q14 gains a trim may have: 0.5 .. 1.5 (g = 2 G then fits uint16). */
export const GAIN_Q_MIN = 8192;
export const GAIN_Q_MAX = 24575;
/** Fraction bits the kernel keeps into a two-point trim (which rounds to the output unit). */
export const TWO_POINT_FRAC = 1;

export interface TrimDesign {
  mode: 'none' | 'offset' | 'two-point';
  runtime: boolean;
  /** Offset in output units (scaled). */
  offsetScaled: number;
  /** Gain in Q14. */
  gainQ: number;
  /** 4 * gainQ - 65536: the gain's distance from 1 in 1/65536 (kept for callers of the earlier form). */
  gainD: number;
  /** g = 2 * gainQ: the gain in 1/32768, the unsigned multiplier of a two-point trim. */
  gainG: number;
  /** c = offsetScaled - gainQ: what a two-point trim adds after the multiply (bias and offset). */
  addC: number;
  /** Real-valued trims the outputs are compared against. */
  offsetC: number;
  gain: number;
}

export function trimDesign(
  cal: { mode: 'none' | 'offset' | 'two-point'; offset?: number; gain?: number; runtime: boolean },
  scale: number,
): TrimDesign {
  const offsetC = cal.mode === 'none' ? 0 : cal.offset ?? 0;
  const gain = cal.mode === 'two-point' ? cal.gain ?? 1 : 1;
  const gainQ = Math.min(GAIN_Q_MAX, Math.max(GAIN_Q_MIN, Math.round(gain * 2 ** GAIN_Q)));
  const offsetScaled = Math.round(offsetC * scale);
  return {
    mode: cal.mode,
    runtime: cal.runtime && cal.mode !== 'none',
    offsetScaled,
    gainQ,
    gainD: 4 * gainQ - 65536,
    gainG: 2 * gainQ,
    addC: offsetScaled - gainQ,
    offsetC,
    gain,
  };
}

/** A run-time trim as its setter stores it, from the integers the firmware passes (offset in output units, gain in Q14). */
export function integerTrim(mode: 'offset' | 'two-point', offsetScaled: number, gainQ: number): TrimDesign {
  const gain = mode === 'two-point' ? gainQ / 2 ** GAIN_Q : 1;
  return {
    mode,
    runtime: true,
    offsetScaled,
    gainQ,
    gainD: 4 * gainQ - 65536,
    gainG: 2 * gainQ,
    addC: offsetScaled - gainQ,
    offsetC: 0,
    gain,
  };
}

/** floor((u * g + 2^15) / 2^16) for unsigned 16-bit u and g: the C's THSC_MUL_HI16. */
export function mulHi16(u: number, g: number): number {
  return Math.floor((u * g + 32768) / 65536);
}

/** The two-point trim's result for kernel k (half output units, int16) with multiplier g and addend c. */
export function twoPointTrim(k: number, g: number, c: number): number {
  return mulHi16(k + 32768, g) + c;
}

/**
 * Integer trim exactly as the C does it (before clamping to the output type). y: the untrimmed
 * value, in output units, or for a two-point trim in 1/2^TWO_POINT_FRAC output units.
 */
export function applyTrim(t: TrimDesign, y: number): number {
  if (t.mode === 'none') return y;
  if (t.mode === 'offset') return y + t.offsetScaled;
  return twoPointTrim(y, t.gainG, t.addC);
}

/** The value, in output units, a perfect conversion with these trims would give for model value f (scaled). */
export function idealTrimmed(t: TrimDesign, fScaled: number, scale: number): number {
  return t.gain * fScaled + t.offsetC * scale;
}
