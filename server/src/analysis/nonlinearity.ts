// Straight-line conversion error: how far T deviates from a line in V over the sweep.
// End-point line through the two ends; best fit by ordinary least squares of T on V
// (normal equations, e.g. any numerical-methods text; conditioned by centring the data).
import type { Nonlinearity, SweepPoint } from './types';

export function nonlinearity(sweep: SweepPoint[]): Nonlinearity {
  const n = sweep.length;
  const first = sweep[0]!;
  const last = sweep[n - 1]!;
  let endPointK = 0;
  const dv = last.volts - first.volts;
  if (n > 1 && dv !== 0) {
    const k = (last.celsius - first.celsius) / dv;
    for (const p of sweep) endPointK = Math.max(endPointK, Math.abs(first.celsius + (p.volts - first.volts) * k - p.celsius));
  }
  let mv = 0;
  let mt = 0;
  for (const p of sweep) {
    mv += p.volts;
    mt += p.celsius;
  }
  mv /= n;
  mt /= n;
  let sxx = 0;
  let sxy = 0;
  for (const p of sweep) {
    sxx += (p.volts - mv) ** 2;
    sxy += (p.volts - mv) * (p.celsius - mt);
  }
  const slope = sxx > 0 ? sxy / sxx : 0;
  const intercept = mt - slope * mv;
  let bestFitK = 0;
  if (sxx > 0) for (const p of sweep) bestFitK = Math.max(bestFitK, Math.abs(intercept + slope * p.volts - p.celsius));
  return { endPointK, bestFitK, fit: { interceptC: intercept, slopeCPerVolt: slope } };
}
