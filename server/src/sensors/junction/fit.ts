// Fits the junction model to ADC codes measured on a real board at known temperatures, and finds a
// point that disagrees with the others. Parameters fitted: ln IS with one point, ln IS and N with
// two or more (a two-current channel does not depend on IS: N alone). Least squares on the
// temperature residuals by Gauss-Newton with a Levenberg-Marquardt damping term (Levenberg,
// Quart. Appl. Math. 2, 1944; Marquardt, J. SIAM 11, 1963); numerical derivatives.
// The fitted channel (every point but a flagged outlier) is what code generation and the error budget
// convert with (calibration/fit.ts fittedChannel).
import type { ChannelDef, MeasuredPoint } from '../../model/types';
import type { FitPoint, FitResult } from '../../calibration/fit';
import type { JunctionDef } from './types';
import { sense } from '../../analysis/sense';
import { ZERO_CELSIUS_K } from '../../physics/constants';

type Param = 'lnIS' | 'N';

function withParams(c: ChannelDef, names: Param[], x: number[]): ChannelDef {
  const s = c.sensor as JunctionDef;
  const p = { ...s.params };
  names.forEach((n, i) => {
    if (n === 'lnIS') p.IS = Math.exp(x[i]!);
    else p.N = Math.min(4, Math.max(0.5, x[i]!));
  });
  return { ...c, sensor: { ...s, params: p } };
}

/**
 * Residual of one point in K: (measured code's voltage - model voltage) / model slope, which to first
 * order is the temperature the model gives for the measured code minus the point's temperature.
 */
function residual(c: ChannelDef, m: MeasuredPoint): number {
  const full = 2 ** c.adc.bits;
  const v = ((m.code + 0.5) * c.adc.reference.value) / full;
  const p = sense(c, m.kelvin);
  return (v - p.volts) / p.slope;
}

function fitOn(c: ChannelDef, pts: MeasuredPoint[], names: Param[]): { channel: ChannelDef; x: number[] } | null {
  const s = c.sensor as JunctionDef;
  let x = names.map((n) => (n === 'lnIS' ? Math.log(s.params.IS) : s.params.N));
  const cost = (xx: number[]) => {
    try {
      const ch = withParams(c, names, xx);
      return pts.reduce((a, m) => a + residual(ch, m) ** 2, 0);
    } catch {
      return Infinity;
    }
  };
  let f = cost(x);
  let lambda = 1e-3;
  for (let iter = 0; iter < 60 && Number.isFinite(f); iter++) {
    const ch = withParams(c, names, x);
    const r = pts.map((m) => residual(ch, m));
    const J = pts.map(() => new Array<number>(names.length).fill(0));
    names.forEach((_, j) => {
      const h = 1e-6 * Math.max(1, Math.abs(x[j]!));
      const xp = [...x];
      xp[j]! += h;
      const chp = withParams(c, names, xp);
      pts.forEach((m, i) => (J[i]![j] = (residual(chp, m) - r[i]!) / h));
    });
    // Normal equations (J^T J + lambda diag) d = -J^T r, for one or two parameters.
    const n = names.length;
    const A = Array.from({ length: n }, (_, a) => Array.from({ length: n }, (_, b) => J.reduce((acc, row) => acc + row[a]! * row[b]!, 0)));
    const g = Array.from({ length: n }, (_, a) => J.reduce((acc, row, i) => acc + row[a]! * r[i]!, 0));
    let improved = false;
    for (let tries = 0; tries < 20; tries++) {
      const M = A.map((row, a) => row.map((v, b) => (a === b ? v * (1 + lambda) + 1e-30 : v)));
      const d = solve(M, g.map((v) => -v));
      if (!d) break;
      const xn = x.map((v, i) => v + d[i]!);
      const fn = cost(xn);
      if (fn < f) {
        const small = Math.max(...d.map((v, i) => Math.abs(v) / Math.max(1, Math.abs(x[i]!)))) < 1e-12;
        x = xn;
        f = fn;
        lambda = Math.max(lambda / 10, 1e-12);
        improved = !small;
        break;
      }
      lambda *= 10;
    }
    if (!improved) break;
  }
  if (!Number.isFinite(f)) return null;
  return { channel: withParams(c, names, x), x };
}

function solve(M: number[][], b: number[]): number[] | null {
  if (M.length === 1) return M[0]![0]! !== 0 ? [b[0]! / M[0]![0]!] : null;
  const [[a, bb], [c, d]] = M as [[number, number], [number, number]];
  const det = a * d - bb * c;
  if (!(Math.abs(det) > 0)) return null;
  return [(d * b[0]! - bb * b[1]!) / det, (a * b[1]! - c * b[0]!) / det];
}

/**
 * What holding N at its nominal value can cost at point m when IS is fitted at the nearest other
 * point j: an N off by dN moves V by dN V / N, and the IS fit removes a part proportional to T, so
 * the error is about dN |V_m - V_j T_m / T_j| / |dV/dT| (from V = N Vt ln(I/IS), Shockley 1949).
 * dN is the stated N spread, at least 2 % (typical spread of N for silicon junctions, from memory).
 */
function priorSlack(c: ChannelDef, m: MeasuredPoint, others: MeasuredPoint[]): number {
  const j = others.reduce((a, b) => (Math.abs(b.kelvin - m.kelvin) < Math.abs(a.kelvin - m.kelvin) ? b : a));
  const dN = Math.max((c.sensor as JunctionDef).nTolerance ?? 0, 0.02);
  const pm = sense(c, m.kelvin);
  const vj = sense(c, j.kelvin).volts;
  return (dN * Math.abs(pm.volts - (vj * m.kelvin) / j.kelvin)) / Math.abs(pm.slope);
}

function paramsFor(c: ChannelDef, count: number): Param[] {
  if (c.secondBias) return ['N'];
  return count >= 2 ? ['lnIS', 'N'] : ['lnIS'];
}

/** Fit of a junction channel's measured points, or null when there are none. */
export function fitJunction(c: ChannelDef): FitResult | null {
  const pts = c.measured;
  if (!pts || pts.length === 0) return null;
  const names = paramsFor(c, pts.length);
  const all = fitOn(c, pts, names);
  if (!all) return null;
  const lsbVolts = c.adc.reference.value / 2 ** c.adc.bits;
  const base = c.accuracyK !== null ? c.accuracyK / 2 : 0.25;
  const toleranceK = Math.max(base, ...pts.map((m) => (2 * lsbVolts) / Math.abs(sense(c, m.kelvin).slope)));
  const points: FitPoint[] = pts.map((m, i) => {
    const others = pts.filter((_, j) => j !== i);
    let loo: number | null = null;
    // With no spare point among the others, fit only the first parameter (IS; N for two-current)
    // and keep N at its nominal value: that prior is what lets one bad point stand out.
    const looNames = others.length > names.length ? names : names.slice(0, 1);
    let tol = toleranceK;
    if (others.length >= looNames.length) {
      const fo = fitOn(c, others, looNames);
      if (fo) loo = residual(fo.channel, m);
      if (looNames.length < names.length) tol += priorSlack(c, m, others);
    }
    return { celsius: m.kelvin - ZERO_CELSIUS_K, code: m.code, residualK: residual(all.channel, m), leaveOneOutK: loo, toleranceK: tol };
  });
  const rmsK = Math.sqrt(points.reduce((a, p) => a + p.residualK ** 2, 0) / points.length);
  // Only the worst disagreeing point is named: with few points every leave-one-out residual grows
  // when one point is off, and the largest one is the culprit.
  let outlier: number | null = null;
  if (pts.length > names.length) {
    let worst = -1;
    points.forEach((p, i) => {
      if (p.leaveOneOutK !== null && Math.abs(p.leaveOneOutK) > p.toleranceK && (worst < 0 || Math.abs(p.leaveOneOutK) > Math.abs(points[worst]!.leaveOneOutK!))) worst = i;
    });
    if (worst >= 0) outlier = worst;
  }
  // The outlier is left out of the fit that the firmware and the budget use.
  let used = all.channel;
  let usedNames = names;
  if (outlier !== null) {
    const rest = pts.filter((_, i) => i !== outlier);
    usedNames = paramsFor(c, rest.length);
    const refit = fitOn(c, rest, usedNames);
    if (refit) used = refit.channel;
    else usedNames = names;
  }
  const constants = (ch: ChannelDef, fitted: Param[]) => {
    const p = (ch.sensor as JunctionDef).params;
    return { ...(fitted.includes('lnIS') ? { IS: p.IS } : {}), N: p.N };
  };
  return {
    used,
    channel: all.channel,
    parameters: constants(all.channel, names),
    usedParameters: constants(used, usedNames),
    points,
    rmsK,
    toleranceK,
    outlier,
  };
}
