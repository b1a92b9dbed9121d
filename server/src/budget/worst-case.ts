// Worst-case error per temperature and calibration mode. With at most `maxCorners` board
// contributors every corner of the tolerance box (each input at either end) is evaluated, which is
// exact when the error is monotonic in each input; above that, the one-at-a-time swings are summed
// (a linear, sensitivity-based bound). For each board the calibration readings' errors are taken at
// every corner of their own box (calibration-readings.ts), and the reading terms (quantisation, INL)
// are added at their bounds (any INL curve within the stated bound). The one-at-a-time swings also
// give each contributor's share.
//
// The grid holds at most `points` temperatures, so a maximum can fall between two of them. After the
// grid, each mode's worst grid point is refined: the band is evaluated again at REFINE temperatures
// spread over the two grid intervals around it, for the boards that were extreme at that point and
// at its two neighbours (every one-at-a-time board for the sensitivity method), and the larger
// figure is kept.
import { boardErrors, calibrated, frameAt, kPerLsbAtCal, SensedBoards, type BudgetFrame } from './frame';
import { calCorners, type CalShift } from './calibration-readings';

/** Temperatures evaluated between the grid neighbours of each worst point. */
export const REFINE = 16;

export interface WorstCase {
  method: 'corners' | 'sensitivity';
  corners: number;
  /** [mode][grid] */
  low: Float64Array[];
  high: Float64Array[];
  /** [mode][contributor (board, reading, then calibration)][grid]: one-at-a-time swing, K. */
  swings: Float64Array[][];
  /** [mode][grid]: nominal board's error (0 up to the inverse's precision). */
  nominal: Float64Array[];
  /** [mode]: the worst |error| and its temperature (K) after refining between grid points. */
  refined: { absK: number; atK: number }[];
}

interface Bands {
  low: Float64Array[];
  high: Float64Array[];
  /** [mode][grid]: the corner index that gave high / low (corners method). */
  argHigh: Int32Array[];
  argLow: Int32Array[];
  nominal: Float64Array[];
  /** The nominal board's errors before calibration (boardErrors). */
  nominalErrors: Float64Array;
  up: Float64Array[][];
  down: Float64Array[][];
  gains: number[];
}

/**
 * Bands of the frame `sensed` is for (over every corner, or the corners `only`), for every
 * calibration mode or the one mode `just` (its entries only are filled).
 */
function bands(sensed: SensedBoards, method: 'corners' | 'sensitivity', only?: number[], just?: number): Bands {
  const f = sensed.frame;
  const G = f.gridK.length;
  const M = f.modes.length;
  const modes = just === undefined ? f.modes.map((_, m) => m) : [just];
  const k = f.board.length;
  const u = new Float64Array(k);
  const errs = new Float64Array(f.evalK.length);
  const ce = new Float64Array(G);
  const readSum = new Float64Array(G);
  for (const r of f.readingK) for (let t = 0; t < G; t++) readSum[t]! += r[t]!;
  const all = f.calibration.map(() => true);
  const shifts: CalShift[][] = f.modes.map((_, m) => (modes.includes(m) ? calCorners(f.calibration, all, kPerLsbAtCal(f, m)) : []));

  const low = Array.from({ length: M }, () => new Float64Array(G).fill(Infinity));
  const high = Array.from({ length: M }, () => new Float64Array(G).fill(-Infinity));
  const argHigh = Array.from({ length: M }, () => new Int32Array(G));
  const argLow = Array.from({ length: M }, () => new Int32Array(G));
  /** Widens the band of mode m with the board whose errors are in errs (every calibration corner). */
  const widen = (m: number, corner: number) => {
    const lo = low[m]!;
    const hi = high[m]!;
    const ss = shifts[m]!;
    for (let j = 0; j < ss.length; j++) {
      const g = Math.abs(calibrated(f, m, errs, ce, ss[j]));
      for (let t = 0; t < G; t++) {
        const r = readSum[t]! * g;
        const c = ce[t]!;
        if (c + r > hi[t]!) (hi[t] = c + r), (argHigh[m]![t] = corner);
        if (c - r < lo[t]!) (lo[t] = c - r), (argLow[m]![t] = corner);
      }
    }
  };

  // Nominal board and one-at-a-time draws.
  const nominal: Float64Array[] = new Array<Float64Array>(M);
  const gains: number[] = new Array<number>(M).fill(NaN);
  const nominalErrors = boardErrors(f, u, undefined, undefined, sensed);
  for (const m of modes) {
    nominal[m] = new Float64Array(G);
    gains[m] = calibrated(f, m, nominalErrors, nominal[m]);
  }
  const up: Float64Array[][] = Array.from({ length: M }, () => []);
  const down: Float64Array[][] = Array.from({ length: M }, () => []);
  if (!only) {
    for (let i = 0; i < k; i++) {
      for (const s of [1, -1]) {
        u.fill(0);
        u[i] = s;
        boardErrors(f, u, errs, undefined, sensed);
        for (const m of modes) {
          const d = new Float64Array(G);
          calibrated(f, m, errs, d);
          for (let t = 0; t < G; t++) d[t] = d[t]! - nominal[m]![t]!;
          (s === 1 ? up : down)[m]!.push(d);
        }
      }
    }
  }

  if (method === 'corners') {
    for (const idx of only ?? Array.from({ length: 2 ** k }, (_, i) => i)) {
      for (let i = 0; i < k; i++) u[i] = (idx >> i) & 1 ? 1 : -1;
      boardErrors(f, u, errs, undefined, sensed);
      for (const m of modes) widen(m, idx);
    }
  } else {
    // The nominal board at every calibration corner, plus the summed one-at-a-time board swings.
    errs.set(nominalErrors);
    for (const m of modes) {
      widen(m, -1);
      for (let t = 0; t < G; t++) {
        for (let i = 0; i < k; i++) {
          const a = up[m]![i]![t]!;
          const b = down[m]![i]![t]!;
          high[m]![t]! += Math.max(a, b, 0);
          low[m]![t]! += Math.min(a, b, 0);
        }
      }
    }
  }
  return { low, high, argHigh, argLow, nominal, nominalErrors, up, down, gains };
}

export function worstCase(f: BudgetFrame, maxCorners = 12): WorstCase {
  const G = f.gridK.length;
  const k = f.board.length;
  const method = k <= maxCorners ? 'corners' : 'sensitivity';
  const b = bands(new SensedBoards(f), method);

  // One-at-a-time swings: board inputs, reading terms at their bounds, calibration readings.
  const errs = b.nominalErrors;
  const ce = new Float64Array(G);
  const swings = f.modes.map((_, m) => {
    const board = b.up[m]!.map((d, i) => d.map((x, t) => Math.max(Math.abs(x), Math.abs(b.down[m]![i]![t]!))));
    const reading = f.readingK.map((r) => Float64Array.from(r, (x) => x * Math.abs(b.gains[m]!)));
    const cal = f.calibration.map((_, i) => {
      const sw = new Float64Array(G);
      for (const s of calCorners(f.calibration, f.calibration.map((_, j) => j === i), kPerLsbAtCal(f, m))) {
        calibrated(f, m, errs, ce, s);
        for (let t = 0; t < G; t++) sw[t] = Math.max(sw[t]!, Math.abs(ce[t]! - b.nominal[m]![t]!));
      }
      return sw;
    });
    return [...board, ...reading, ...cal];
  });

  // Refine each mode's worst grid point between its neighbours (modes worst at the same point share
  // its temperatures, and so the boards sensed there).
  const around = new Map<number, SensedBoards>();
  const refined = f.modes.map((_, m) => {
    let absK = -1;
    let at = 0;
    for (let t = 0; t < G; t++) {
      const a = Math.max(Math.abs(b.low[m]![t]!), Math.abs(b.high[m]![t]!));
      if (a > absK) (absK = a), (at = t);
    }
    const best = { absK, atK: f.gridK[at]! };
    if (G < 2) return best;
    const from = f.gridK[Math.max(0, at - 1)]!;
    const to = f.gridK[Math.min(G - 1, at + 1)]!;
    let sub = around.get(at);
    if (!sub) around.set(at, (sub = new SensedBoards(frameAt(f, Array.from({ length: REFINE }, (_, i) => from + ((to - from) * (i + 0.5)) / REFINE)))));
    const local = sub.frame.gridK;
    const candidates = new Set<number>();
    for (let t = Math.max(0, at - 1); t <= Math.min(G - 1, at + 1); t++) candidates.add(b.argHigh[m]![t]!).add(b.argLow[m]![t]!);
    const r = bands(sub, method, method === 'corners' ? [...candidates] : undefined, m);
    for (let t = 0; t < local.length; t++) {
      const a = Math.max(Math.abs(r.low[m]![t]!), Math.abs(r.high[m]![t]!));
      if (a > best.absK) (best.absK = a), (best.atK = local[t]!);
    }
    return best;
  });

  return { method, corners: method === 'corners' ? 2 ** k : 0, low: b.low, high: b.high, swings, nominal: b.nominal, refined };
}
