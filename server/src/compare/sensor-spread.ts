// Temperature error from the sensor element's own spread (R25 and beta of a thermistor; R0 and the
// IEC 60751 class of an RTD), before and after a one-point (offset) calibration at the range centre.
// The channel's chain inverts resistance exactly (analysis/inverse.ts), so an element-resistance
// error maps to the same temperature error whatever the circuit: the error is
// T_model(R_true(T)) - T. Circuit and ADC errors are the error budget's (server/src/budget).
import { trimNumber } from '../model/read-value';
import type { ChannelDef } from '../model/types';
import { elementAt } from '../analysis/sense';
import { shKelvinAt } from '../physics/steinhart-hart';
import { RTD_CLASSES, cvdCelsiusAt } from '../physics/callendar-van-dusen';
import { sweepKelvins } from '../analysis/sweep';

export interface SensorSpread {
  /** Largest |error| over the range and every corner, K. */
  beforeK: number;
  /** The same after removing each corner's error at the range centre (one-point calibration), K. */
  afterOnePointK: number;
  /** What the figure covers, for the report. */
  basis: string;
}

const T25 = 298.15;

/**
 * Corners of the element's spread. Thermistor: R x (1 ± tol) and beta x (1 ± tol), where a beta
 * error changes R by exp(beta dBeta (1/T - 1/T25)) (the beta model). RTD: the class taken as an R0
 * spread of a (K at 0 °C, times A) and a slope spread of b (K per K of |t|) -- our reading of the
 * class formula a + b|t| as two physical spreads -- plus any R0 tolerance stated on r0.
 */
export function sensorSpread(c: ChannelDef): SensorSpread | null {
  const s = c.sensor;
  if (s.kind === 'junction') return null;
  const kelvins = sweepKelvins(c);
  const tc = (c.lowK + c.highK) / 2;
  let errorAt: ((k: number, corner: number[]) => number) | null = null;
  let corners: number[][] = [];
  let basis = '';
  if (s.kind === 'thermistor') {
    const eR = s.r25.tolerance;
    const eB = s.beta?.tolerance ?? 0;
    const beta = s.beta?.value ?? 0;
    corners = [[-1, -1], [-1, 1], [1, -1], [1, 1]];
    basis = `R ± ${trim(eR * 100)} %` + (s.beta ? `, beta ± ${trim(eB * 100)} %` : '');
    errorAt = (k, [sr, sb]) => {
      const r = elementAt(s, k).ohms * (1 + sr! * eR) * Math.exp(beta * sb! * eB * (1 / k - 1 / T25));
      return shKelvinAt(s.params, r) - k;
    };
  } else {
    const cls = s.toleranceClass ? RTD_CLASSES[s.toleranceClass] : { a: 0, b: 0 };
    const e0 = cls.a * s.params.A + s.r0.tolerance;
    const eb = cls.b;
    corners = [[-1, -1], [-1, 1], [1, -1], [1, 1]];
    basis = `${s.toleranceClass ? `IEC 60751 class ${s.toleranceClass}` : 'no class stated'}${s.r0.tolerance ? `, R0 ± ${trim(s.r0.tolerance * 100)} %` : ''}`;
    errorAt = (k, [s0, sb]) => {
      const t = k - 273.15;
      const r = elementAt(s, k).ohms * (1 + s0! * e0) + s.params.R0 * s.params.A * eb * sb! * t;
      return cvdCelsiusAt(s.params.R0, s.params, r) + 273.15 - k;
    };
  }
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

function trim(v: number): string {
  return trimNumber(v, 3);
}
