// Straight-line conversion error: how far T deviates from a line in V over the sweep.
// End-point line through the two ends; best fit by ordinary least squares of T on V
// (normal equations, e.g. any numerical-methods text; conditioned by centring the data).
import type { Nonlinearity } from './types';

/**
 * `volts[i]` is sensed at `temps[i] - offset` degC, both in sweep order: `temps` in kelvin with
 * offset 273.15 (spares a sweep a copy of its temperatures), or in degC with the default 0.
 */
export function nonlinearity(volts: ArrayLike<number>, temps: ArrayLike<number>, offset = 0): Nonlinearity {
  const celsius = (i: number): number => temps[i]! - offset;
  const n = volts.length;
  const v0 = volts[0]!;
  const t0 = celsius(0);
  let endPointK = 0;
  const dv = volts[n - 1]! - v0;
  if (n > 1 && dv !== 0) {
    const k = (celsius(n - 1) - t0) / dv;
    for (let i = 0; i < n; i++) endPointK = Math.max(endPointK, Math.abs(t0 + (volts[i]! - v0) * k - celsius(i)));
  }
  let mv = 0;
  let mt = 0;
  for (let i = 0; i < n; i++) {
    mv += volts[i]!;
    mt += celsius(i);
  }
  mv /= n;
  mt /= n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (volts[i]! - mv) ** 2;
    sxy += (volts[i]! - mv) * (celsius(i) - mt);
  }
  const slope = sxx > 0 ? sxy / sxx : 0;
  const intercept = mt - slope * mv;
  let bestFitK = 0;
  if (sxx > 0) for (let i = 0; i < n; i++) bestFitK = Math.max(bestFitK, Math.abs(intercept + slope * volts[i]! - celsius(i)));
  return { endPointK, bestFitK, fit: { interceptC: intercept, slopeCPerVolt: slope } };
}
