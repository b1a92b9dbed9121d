// Monte Carlo error budget: simulated boards with every board input drawn inside its tolerance
// (uniform, or normal with the bound at 3 sigma), and per reading the quantisation (always uniform)
// and INL terms. The run is split into chunks so that a long one can report progress, yield to the
// event loop and be cancelled; the sync and async forms give identical samples for a seed.
import { Xoshiro128 } from './prng';
import { boardErrors, calibrated, type BudgetFrame } from './frame';
import type { CancellationToken, Progress } from './types';

export interface McSamples {
  runs: number;
  /** [mode][grid] -> Float64Array(runs) of errors, K. */
  samples: Float64Array[][];
}

interface McRun {
  f: BudgetFrame;
  rng: Xoshiro128;
  distribution: 'uniform' | 'normal';
  out: McSamples;
  u: Float64Array;
  errs: Float64Array;
  ce: Float64Array;
  reading: Float64Array;
}

function start(f: BudgetFrame, runs: number, seed: number, distribution: 'uniform' | 'normal'): McRun {
  const G = f.gridK.length;
  return {
    f,
    rng: new Xoshiro128(seed),
    distribution,
    out: { runs, samples: f.modes.map(() => Array.from({ length: G }, () => new Float64Array(runs))) },
    u: new Float64Array(f.board.length),
    errs: new Float64Array(f.evalK.length),
    ce: new Float64Array(G),
    reading: new Float64Array(G),
  };
}

function boards(run: McRun, from: number, to: number): void {
  const { f, rng, u, errs, ce, reading } = run;
  const G = f.gridK.length;
  for (let b = from; b < to; b++) {
    for (let i = 0; i < u.length; i++) u[i] = rng.draw(run.distribution);
    for (let t = 0; t < G; t++) {
      let r = 0;
      for (let j = 0; j < f.reading.length; j++) {
        const d = f.reading[j]!.id === 'quantisation' ? rng.symmetric() : rng.draw(run.distribution);
        r += d * f.readingK[j]![t]!;
      }
      reading[t] = r;
    }
    boardErrors(f, u, errs);
    for (let m = 0; m < f.modes.length; m++) {
      const g = calibrated(f, m, errs, ce);
      const s = run.out.samples[m]!;
      for (let t = 0; t < G; t++) s[t]![b] = ce[t]! + g * reading[t]!;
    }
  }
}

export function monteCarlo(f: BudgetFrame, runs: number, seed: number, distribution: 'uniform' | 'normal' = 'uniform'): McSamples {
  const run = start(f, runs, seed, distribution);
  boards(run, 0, runs);
  return run.out;
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
): Promise<McSamples | null> {
  const run = start(f, runs, seed, distribution);
  for (let b = 0; b < runs; b += chunk) {
    if (token?.isCancellationRequested) return null;
    boards(run, b, Math.min(runs, b + chunk));
    progress?.(Math.min(runs, b + chunk), runs);
    await new Promise<void>((resolve) => setImmediate(resolve));
  }
  return token?.isCancellationRequested ? null : run.out;
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
