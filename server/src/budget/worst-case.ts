// Worst-case error per temperature and calibration mode. With at most `maxCorners` board
// contributors every corner of the tolerance box (each input at either end) is evaluated, which is
// exact when the error is monotonic in each input; above that, the one-at-a-time swings are summed
// (a linear, sensitivity-based bound). Reading terms (quantisation, INL) are added at their bounds.
// The one-at-a-time swings also give each contributor's share.
import { boardErrors, calibrated, type BudgetFrame } from './frame';

export interface WorstCase {
  method: 'corners' | 'sensitivity';
  corners: number;
  /** [mode][grid] */
  low: Float64Array[];
  high: Float64Array[];
  /** [mode][contributor (board then reading)][grid]: one-at-a-time swing, K. */
  swings: Float64Array[][];
  /** [mode][grid]: nominal board's error (0 up to the inverse's precision). */
  nominal: Float64Array[];
}

export function worstCase(f: BudgetFrame, maxCorners = 12): WorstCase {
  const G = f.gridK.length;
  const M = f.modes.length;
  const k = f.board.length;
  const u = new Float64Array(k);
  const errs = new Float64Array(f.evalK.length);
  const ce = new Float64Array(G);
  const readSum = new Float64Array(G);
  for (const r of f.readingK) for (let t = 0; t < G; t++) readSum[t]! += r[t]!;

  // Nominal board and one-at-a-time draws.
  const nominal: Float64Array[] = [];
  const gains: number[] = [];
  boardErrors(f, u, errs);
  for (let m = 0; m < M; m++) {
    const c0 = new Float64Array(G);
    gains.push(calibrated(f, m, errs, c0));
    nominal.push(c0);
  }
  const up: Float64Array[][] = Array.from({ length: M }, () => []);
  const down: Float64Array[][] = Array.from({ length: M }, () => []);
  for (let i = 0; i < k; i++) {
    for (const s of [1, -1]) {
      u.fill(0);
      u[i] = s;
      boardErrors(f, u, errs);
      for (let m = 0; m < M; m++) {
        const d = new Float64Array(G);
        calibrated(f, m, errs, d);
        for (let t = 0; t < G; t++) d[t] = d[t]! - nominal[m]![t]!;
        (s === 1 ? up : down)[m]!.push(d);
      }
    }
  }
  const swings = Array.from({ length: M }, (_, m) => {
    const board = up[m]!.map((d, i) => d.map((x, t) => Math.max(Math.abs(x), Math.abs(down[m]![i]![t]!))));
    const reading = f.readingK.map((r) => Float64Array.from(r, (x) => x * Math.abs(gains[m]!)));
    return [...board, ...reading];
  });

  const low = Array.from({ length: M }, () => new Float64Array(G).fill(Infinity));
  const high = Array.from({ length: M }, () => new Float64Array(G).fill(-Infinity));
  if (k <= maxCorners) {
    const corners = 2 ** k;
    for (let idx = 0; idx < corners; idx++) {
      for (let i = 0; i < k; i++) u[i] = (idx >> i) & 1 ? 1 : -1;
      boardErrors(f, u, errs);
      for (let m = 0; m < M; m++) {
        const g = Math.abs(calibrated(f, m, errs, ce));
        const lo = low[m]!;
        const hi = high[m]!;
        for (let t = 0; t < G; t++) {
          const r = readSum[t]! * g;
          if (ce[t]! + r > hi[t]!) hi[t] = ce[t]! + r;
          if (ce[t]! - r < lo[t]!) lo[t] = ce[t]! - r;
        }
      }
    }
    return { method: 'corners', corners, low, high, swings, nominal };
  }
  for (let m = 0; m < M; m++) {
    const g = Math.abs(gains[m]!);
    for (let t = 0; t < G; t++) {
      let hi = nominal[m]![t]! + readSum[t]! * g;
      let lo = nominal[m]![t]! - readSum[t]! * g;
      for (let i = 0; i < k; i++) {
        const a = up[m]![i]![t]!;
        const b = down[m]![i]![t]!;
        hi += Math.max(a, b, 0);
        lo += Math.min(a, b, 0);
      }
      high[m]![t] = hi;
      low[m]![t] = lo;
    }
  }
  return { method: 'sensitivity', corners: 0, low, high, swings, nominal };
}
