// Offset and two-point (gain + offset) trims applied to the converted value in integer arithmetic.
// y' = floor((y * G + 2^(Q-1)) / 2^Q) + O, with G = round(gain * 2^Q) (Q-format gain) and
// O = round(offset * scale). Q = 14 keeps y * G inside int32 for |y| < 2^16 and gain < 2.

import { asr } from './arith';

export const GAIN_Q = 14;

export interface TrimDesign {
  mode: 'none' | 'offset' | 'two-point';
  runtime: boolean;
  /** Offset in output units (scaled). */
  offsetScaled: number;
  /** Gain in Q14. */
  gainQ: number;
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
  return {
    mode: cal.mode,
    runtime: cal.runtime && cal.mode !== 'none',
    offsetScaled: Math.round(offsetC * scale),
    gainQ: Math.round(gain * 2 ** GAIN_Q),
    offsetC,
    gain,
  };
}

/** Integer trim exactly as the C does it (before clamping to the output type). */
export function applyTrim(t: TrimDesign, y: number): number {
  if (t.mode === 'none') return y;
  if (t.mode === 'offset') return y + t.offsetScaled;
  return asr(y * t.gainQ + 2 ** (GAIN_Q - 1), GAIN_Q) + t.offsetScaled;
}

/** The value, in output units, a perfect conversion with these trims would give for model value f (scaled). */
export function idealTrimmed(t: TrimDesign, fScaled: number, scale: number): number {
  return t.gain * fScaled + t.offsetC * scale;
}
