// Small statistics helpers for benchmarks: medians and percentiles of repeated timings.
export function percentile(values: number[], p: number): number {
  const s = [...values].sort((a, b) => a - b);
  if (s.length === 0) return NaN;
  const idx = Math.min(s.length - 1, Math.max(0, Math.ceil((p / 100) * s.length) - 1));
  return s[idx]!;
}

export const median = (v: number[]) => percentile(v, 50);

/** Runs fn `runs` times after `warmup` runs; returns the durations in ms. */
export function timeRuns(fn: () => void, runs: number, warmup = 3): number[] {
  for (let i = 0; i < warmup; i++) fn();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = process.hrtime.bigint();
    fn();
    out.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  return out;
}

export function verdict(ok: boolean): string {
  return ok ? 'PASS' : 'MISS';
}

/**
 * Times fn on inputs all made before the first run (3 warm-up runs, then `runs` timed ones), so
 * that the garbage of making them is not collected inside a timed run.
 */
export function timeRunsOn<T>(make: () => T, fn: (input: T) => void, runs: number): number[] {
  const inputs = Array.from({ length: runs + 3 }, make);
  const out: number[] = [];
  for (let r = 0; r < inputs.length; r++) {
    const t0 = process.hrtime.bigint();
    fn(inputs[r]!);
    if (r >= 3) out.push(Number(process.hrtime.bigint() - t0) / 1e6);
    inputs[r] = undefined as T; // each input is garbage once used, as in the editor
  }
  return out;
}
