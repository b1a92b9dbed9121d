// Monte Carlo error budget: simulated boards with every board input drawn inside its tolerance
// (uniform, or normal with the bound at 3 sigma), one INL curve per board (inl-profile.ts), the
// calibration readings' errors (quantisation, INL at their codes, the reference thermometer) in each
// board's trim, and per reading a new quantisation draw (always uniform). The run is split into
// chunks so that a long one can report progress, yield to the event loop and be cancelled; the sync
// and async forms give identical samples for a seed. At one grid temperature per mode it also
// gathers what the variance shares need (types.ts ContributorShare.varianceShare).
import { Xoshiro128 } from './prng';
import { boardErrors, boardTrim, calibrated, type BudgetFrame } from './frame';
import { applyTrimK } from '../calibration/trim';
import { InlProfile } from './inl-profile';
import type { CalShift } from './calibration-readings';
import type { CancellationToken, Progress } from '../analysis/budget-types';

export interface McSamples {
  runs: number;
  /** [mode][grid] -> Float64Array(runs) of errors, K. */
  samples: Float64Array[][];
  /** [mode][contributor (board, reading, calibration)]: variance share at shareAt[mode], or null. */
  varianceShares: (number | null)[][] | null;
}

/** Sums for a correlation: n, Σy, Σy², and per variable Σx, Σx², Σxy. */
interface Moments {
  n: number;
  y: number;
  yy: number;
  x: Float64Array;
  xx: Float64Array;
  xy: Float64Array;
}

interface McRun {
  f: BudgetFrame;
  rng: Xoshiro128;
  distribution: 'uniform' | 'normal';
  out: McSamples;
  u: Float64Array;
  errs: Float64Array;
  codes: Float64Array;
  ce: Float64Array;
  dq: Float64Array;
  di: Float64Array;
  qDraw: Float64Array;
  profile: InlProfile;
  shareAt: number[] | null;
  moments: Moments[];
  /** Per mode, work arrays for the calibration readings' draws (one per calibration point). */
  cal: { repQ: Float64Array; repI: Float64Array; shift: CalShift; part: CalShift; zero: Float64Array }[];
}

function start(f: BudgetFrame, runs: number, seed: number, distribution: 'uniform' | 'normal', shareAt?: number[]): McRun {
  const G = f.gridK.length;
  const K = f.board.length + f.reading.length + f.calibration.length;
  return {
    f,
    rng: new Xoshiro128(seed),
    distribution,
    out: { runs, samples: f.modes.map(() => Array.from({ length: G }, () => new Float64Array(runs))), varianceShares: null },
    u: new Float64Array(f.board.length),
    errs: new Float64Array(f.evalK.length),
    codes: new Float64Array(f.evalK.length),
    ce: new Float64Array(G),
    dq: new Float64Array(G),
    di: new Float64Array(G),
    qDraw: new Float64Array(G),
    profile: new InlProfile(),
    shareAt: shareAt ?? null,
    moments: f.modes.map(() => ({ n: 0, y: 0, yy: 0, x: new Float64Array(K), xx: new Float64Array(K), xy: new Float64Array(K) })),
    cal: f.calIndex.map((points) => {
      const J = points.length;
      const zero = new Float64Array(J);
      return { repQ: new Float64Array(J), repI: new Float64Array(J), shift: { rep: new Float64Array(J), ref: new Float64Array(J) }, part: { rep: zero, ref: zero }, zero };
    }),
  };
}

const amountOf = (f: BudgetFrame, list: 'reading' | 'calibration', id: string) => f[list].find((k) => k.id === id)?.amount ?? 0;

function boards(run: McRun, from: number, to: number): void {
  const { f, rng, u, errs, codes, ce, dq, di, qDraw, profile } = run;
  const G = f.gridK.length;
  const kb = f.board.length;
  const q = amountOf(f, 'reading', 'quantisation');
  const inl = amountOf(f, 'reading', 'inl');
  const ref = amountOf(f, 'calibration', 'cal-reference');
  const idx = (list: 'reading' | 'calibration', id: string) => {
    const i = f[list].findIndex((k) => k.id === id);
    return i < 0 ? -1 : i + kb + (list === 'calibration' ? f.reading.length : 0);
  };
  const iq = idx('reading', 'quantisation');
  const ii = idx('reading', 'inl');
  const icq = idx('calibration', 'cal-quantisation');
  const icr = idx('calibration', 'cal-reference');
  const full = f.full;
  for (let b = from; b < to; b++) {
    for (let i = 0; i < kb; i++) u[i] = rng.draw(run.distribution);
    if (inl > 0) profile.draw(rng, run.distribution);
    boardErrors(f, u, errs, codes);
    for (let t = 0; t < G; t++) {
      qDraw[t] = q > 0 ? rng.symmetric() : 0;
      dq[t] = qDraw[t]! * q * f.kPerLsb[t]!;
      di[t] = inl > 0 ? profile.at(codes[t]! / full) * inl * f.kPerLsb[t]! : 0;
    }
    for (let m = 0; m < f.modes.length; m++) {
      const points = f.calIndex[m]!;
      const J = points.length;
      const { repQ, repI, shift, part } = run.cal[m]!;
      for (let j = 0; j < J; j++) {
        const i = points[j]!;
        repQ[j] = q > 0 ? rng.symmetric() * q * f.kPerLsb[i]! : 0;
        repI[j] = inl > 0 ? profile.at(codes[i]! / full) * inl * f.kPerLsb[i]! : 0;
        shift.rep[j] = repQ[j]! + repI[j]!;
        shift.ref[j] = ref > 0 ? rng.draw(run.distribution) * ref : 0;
      }
      const g = calibrated(f, m, errs, ce, shift);
      const s = run.out.samples[m]!;
      for (let t = 0; t < G; t++) s[t]![b] = ce[t]! + g * (dq[t]! + di[t]!);
      if (!run.shareAt) continue;
      // Variance shares: each input's draw, or its contribution (the error less the error without it).
      const t = run.shareAt[m]!;
      const k = f.gridK[t]!;
      const y = s[t]![b]!;
      const mo = run.moments[m]!;
      mo.n++;
      mo.y += y;
      mo.yy += y * y;
      for (let i = 0; i < kb; i++) gather(mo, i, u[i]!, y);
      if (iq >= 0) gather(mo, iq, qDraw[t]!, y);
      if (ii >= 0) {
        part.rep = repQ;
        part.ref = shift.ref;
        gather(mo, ii, y - (applyTrimK(boardTrim(f, m, errs, part), k + errs[t]! + dq[t]!) - k), y);
      }
      if (J === 0) continue;
      if (icq >= 0) {
        part.rep = repI;
        part.ref = shift.ref;
        gather(mo, icq, y - (applyTrimK(boardTrim(f, m, errs, part), k + errs[t]! + dq[t]! + di[t]!) - k), y);
      }
      if (icr >= 0) {
        part.rep = shift.rep;
        part.ref = run.cal[m]!.zero;
        gather(mo, icr, y - (applyTrimK(boardTrim(f, m, errs, part), k + errs[t]! + dq[t]! + di[t]!) - k), y);
      }
    }
  }
}

function gather(mo: Moments, i: number, x: number, y: number): void {
  mo.x[i]! += x;
  mo.xx[i]! += x * x;
  mo.xy[i]! += x * y;
}

/** Squared correlations from the gathered sums (null for inputs not gathered or without spread). */
function finish(run: McRun): McSamples {
  if (!run.shareAt) return run.out;
  const f = run.f;
  const merged = new Set(['cal-inl']);
  const ids = [...f.board, ...f.reading, ...f.calibration].map((k) => k.id);
  run.out.varianceShares = run.moments.map((mo, m) => {
    const vy = mo.yy / mo.n - (mo.y / mo.n) ** 2;
    return ids.map((id, i) => {
      if (merged.has(id)) return null;
      if (f.calIndex[m]!.length === 0 && id.startsWith('cal-')) return 0;
      const vx = mo.xx[i]! / mo.n - (mo.x[i]! / mo.n) ** 2;
      const cov = mo.xy[i]! / mo.n - (mo.x[i]! / mo.n) * (mo.y / mo.n);
      return vx > 0 && vy > 0 ? Math.min(1, (cov * cov) / (vx * vy)) : 0;
    });
  });
  return run.out;
}

/** Monte Carlo samples; with shareAt (a grid index per mode) also the variance shares there. */
export function monteCarlo(f: BudgetFrame, runs: number, seed: number, distribution: 'uniform' | 'normal' = 'uniform', shareAt?: number[]): McSamples {
  const run = start(f, runs, seed, distribution, shareAt);
  boards(run, 0, runs);
  return finish(run);
}

/** Chunked form: yields between chunks; resolves null when cancelled. */
export async function monteCarloAsync(
  f: BudgetFrame,
  runs: number,
  seed: number,
  distribution: 'uniform' | 'normal' = 'uniform',
  token?: CancellationToken,
  progress?: Progress,
  chunk = 250,
  shareAt?: number[],
): Promise<McSamples | null> {
  const run = start(f, runs, seed, distribution, shareAt);
  for (let b = 0; b < runs; b += chunk) {
    if (token?.isCancellationRequested) return null;
    boards(run, b, Math.min(runs, b + chunk));
    progress?.(Math.min(runs, b + chunk), runs);
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
  return token?.isCancellationRequested ? null : finish(run);
}

/**
 * Percentile p (0..100) of sorted data, linear interpolation between order statistics (Hyndman and
 * Fan, "Sample quantiles in statistical packages", The American Statistician 50(4), 1996, type 7).
 */
export function percentileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = ((n - 1) * p) / 100;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}
