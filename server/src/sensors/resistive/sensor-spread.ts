// Temperature error from a resistive element's own spread (R25 and beta of a thermistor; R0 and the
// IEC 60751 class of an RTD; each kind gives its corners), before and after a one-point (offset)
// calibration at the range centre. The channel's chain inverts resistance exactly
// (analysis/inverse.ts), so an element-resistance error maps to the same temperature error whatever
// the circuit: the error is T_model(R_true(T)) - T. Circuit and ADC errors are the error budget's
// (server/src/budget).
import type { ChannelDef } from '../../model/types';
import type { SensorSpread } from '../kind';
import { sweepKelvins } from '../../analysis/sweep';
import { trimNumber } from '../../model/read-value';

/** The corners of an element's spread and the temperature error at each (a kind's own). */
export interface SpreadCorners {
  corners: number[][];
  basis: string;
  errorAt: (kelvin: number, corner: number[]) => number;
}

export function spreadOver(c: ChannelDef, spread: SpreadCorners): SensorSpread {
  const kelvins = sweepKelvins(c);
  const tc = (c.lowK + c.highK) / 2;
  const { corners, errorAt, basis } = spread;
  let before = 0;
  let after = 0;
  for (const corner of corners) {
    const atCentre = errorAt(tc, corner);
    for (const k of kelvins) {
      const e = errorAt(k, corner);
      if (Number.isFinite(e)) {
        before = Math.max(before, Math.abs(e));
        after = Math.max(after, Math.abs(e - atCentre));
      }
    }
  }
  return { beforeK: before, afterOnePointK: after, basis };
}

export function trim(v: number): string {
  return trimNumber(v, 3);
}

/** `± 1.5 %` for a relative half-width (contributor labels). */
export const pct = (r: number) => `± ${trimNumber(r * 100, 3)} %`;
