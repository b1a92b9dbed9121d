// Offset and two-point (gain + offset) trims applied to the converted value in integer arithmetic.
// y' = y + floor((y * D + 2^15) / 2^16) + O, with D = 4 G - 2^16 the gain's distance from 1 in
// 1/65536 (G = round(gain * 2^14), the Q14 gain the setter takes) and O = round(offset * scale).
// Why this form: D fits int16 for gains 0.5 .. 1.5, so y * D is one 16 x 16 -> 32-bit multiply,
// and dividing by 2^16 takes the high half of the product: no 32-bit multiply and no 14-step
// shift loop on an 8-bit MCU (they cost about 200 cycles per conversion).

import { asr } from './arith';

export const GAIN_Q = 14;
/** Q14 gains a trim may have: 0.5 .. 1.5 (D = 4 G - 65536 then fits int16). */
export const GAIN_Q_MIN = 8192;
export const GAIN_Q_MAX = 24575;

export interface TrimDesign {
  mode: 'none' | 'offset' | 'two-point';
  runtime: boolean;
  /** Offset in output units (scaled). */
  offsetScaled: number;
  /** Gain in Q14. */
  gainQ: number;
  /** 4 * gainQ - 65536: the gain's distance from 1 in 1/65536, what the C multiplies by. */
  gainD: number;
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
  return {
    mode: cal.mode,
    runtime: cal.runtime && cal.mode !== 'none',
    offsetScaled: Math.round(offsetC * scale),
    gainQ,
    gainD: 4 * gainQ - 65536,
    offsetC,
    gain,
  };
}

/** Integer trim exactly as the C does it (before clamping to the output type). */
export function applyTrim(t: TrimDesign, y: number): number {
  if (t.mode === 'none') return y;
  if (t.mode === 'offset') return y + t.offsetScaled;
  return y + asr(y * t.gainD + 32768, 16) + t.offsetScaled;
}

/** The value, in output units, a perfect conversion with these trims would give for model value f (scaled). */
export function idealTrimmed(t: TrimDesign, fScaled: number, scale: number): number {
  return t.gain * fScaled + t.offsetC * scale;
}
