// Piecewise quadratic: segments of 2^shift codes, in each y = c0 + x (c1 + c2 x / 2^k2) / 2^k1
// with x the code's offset inside its segment, evaluated in int32 with floor shifts (Horner form).
// Coefficients start from a least-squares fit (normal equations) and c0 is then moved so the
// segment's error band is centred, counting the exact integer rounding.

import { INT32_MAX, asr, fitsInt32 } from './arith';
import { errAt, type Samples } from './samples';

export interface PolyDesign {
  kind: 'polynomial';
  shift: number;
  /** [c0, c1, c2] per segment. */
  coefs: [number, number, number][];
  k1: number;
  k2: number;
}

export function polyKernel(d: PolyDesign, low: number, code: number): number {
  const off = code - low;
  const h = 2 ** d.shift;
  const i = Math.floor(off / h);
  const x = off - i * h;
  const [c0, c1, c2] = d.coefs[i]!;
  const acc = c1 + asr(c2 * x, d.k2);
  return c0 + asr(x * acc + 2 ** (d.k1 - 1), d.k1);
}

/** Least-squares a0 + a1 x + a2 x^2 through (x, y); degree drops when points are too few. */
function fitQuadratic(xs: number[], ys: number[]): [number, number, number] {
  const n = xs.length;
  if (n === 1) return [ys[0]!, 0, 0];
  if (n === 2) return [ys[0]!, (ys[1]! - ys[0]!) / (xs[1]! - xs[0]!), 0];
  // Scale x to [0,1] for conditioning, solve the 3x3 normal equations by Gaussian elimination.
  const m = Math.max(1, xs[n - 1]!);
  const S = [0, 0, 0, 0, 0];
  const T = [0, 0, 0];
  for (let k = 0; k < n; k++) {
    const t = xs[k]! / m;
    let p = 1;
    for (let j = 0; j < 5; j++) { S[j]! += p; if (j < 3) T[j]! += p * ys[k]!; p *= t; }
  }
  const A = [
    [S[0]!, S[1]!, S[2]!, T[0]!],
    [S[1]!, S[2]!, S[3]!, T[1]!],
    [S[2]!, S[3]!, S[4]!, T[2]!],
  ];
  for (let c = 0; c < 3; c++) {
    let piv = c;
    for (let r = c + 1; r < 3; r++) if (Math.abs(A[r]![c]!) > Math.abs(A[piv]![c]!)) piv = r;
    [A[c], A[piv]] = [A[piv]!, A[c]!];
    for (let r = 0; r < 3; r++) {
      if (r === c) continue;
      const f = A[r]![c]! / A[c]![c]!;
      for (let k = c; k < 4; k++) A[r]![k]! -= f * A[c]![k]!;
    }
  }
  const b0 = A[0]![3]! / A[0]![0]!;
  const b1 = A[1]![3]! / A[1]![1]!;
  const b2 = A[2]![3]! / A[2]![2]!;
  return [b0, b1 / m, b2 / (m * m)];
}

function segRange(s: Samples, shift: number, seg: number): [number, number] {
  const h = 2 ** shift;
  return [seg * h, Math.min(s.high - s.low, seg * h + h - 1)];
}

export function designPolynomial(s: Samples, shift: number): { design: PolyDesign; maxErr: number } | undefined {
  const h = 2 ** shift;
  const segs = Math.floor((s.high - s.low) / h) + 1;
  const real: [number, number, number][] = [];
  for (let i = 0; i < segs; i++) {
    const [a, b] = segRange(s, shift, i);
    const xs: number[] = [];
    const ys: number[] = [];
    for (let k = a; k <= b; k++) { xs.push(k - a); ys.push(s.f[k]!); }
    real.push(fitQuadratic(xs, ys));
  }
  const xmax = Math.max(1, Math.min(h - 1, s.high - s.low));
  let mag = 0;
  let a2max = 0;
  for (const [, a1, a2] of real) {
    mag = Math.max(mag, (Math.abs(a1) + Math.abs(a2) * xmax) * xmax);
    a2max = Math.max(a2max, Math.abs(a2));
  }
  // k1: largest shift keeping x * acc (+ rounding) well inside int32; k2 likewise for c2 * x.
  for (let k1 = 30; k1 >= 1; k1--) {
    if ((mag * 1.05 + 2) * 2 ** k1 >= INT32_MAX) continue;
    let k2 = 1;
    if (a2max > 0) {
      k2 = 0;
      for (let t = 30; t >= 1; t--) if (a2max * 2 ** (k1 + t) * xmax * 1.05 < 2 ** 30) { k2 = t; break; }
      if (k2 === 0) continue;
    }
    const coefs = real.map(([a0, a1, a2]) => [Math.round(a0), Math.round(a1 * 2 ** k1), Math.round(a2 * 2 ** (k1 + k2))] as [number, number, number]);
    const d: PolyDesign = { kind: 'polynomial', shift, coefs, k1, k2 };
    if (!intermediatesFit(s, d)) continue;
    // Centre each segment's error band by moving c0 (only c0: it does not change the intermediates).
    let maxErr = 0;
    for (let i = 0; i < segs; i++) {
      const [a, b] = segRange(s, shift, i);
      let lo = Infinity;
      let hi = -Infinity;
      for (let k = a; k <= b; k++) {
        const r = polyKernel(d, s.low, s.low + k) - s.f[k]!;
        lo = Math.min(lo, r);
        hi = Math.max(hi, r);
      }
      const c = d.coefs[i]!;
      c[0] -= Math.round((lo + hi) / 2);
      let best = c[0];
      let bestErr = Infinity;
      for (const dv of [0, -1, 1]) {
        c[0] = best + dv;
        let w = 0;
        for (let k = a; k <= b; k++) w = Math.max(w, errAt(s, k, polyKernel(d, s.low, s.low + k)));
        if (w < bestErr - 1e-9) { bestErr = w; best = c[0]; }
        c[0] = best;
      }
      c[0] = best;
      maxErr = Math.max(maxErr, bestErr);
    }
    if (!d.coefs.every((c) => c.every(fitsInt32)) || !intermediatesFit(s, d)) continue;
    return { design: d, maxErr };
  }
  return undefined;
}

/** Every intermediate of the C evaluation, at every reachable code, fits int32. */
function intermediatesFit(s: Samples, d: PolyDesign): boolean {
  const h = 2 ** d.shift;
  for (let k = 0; k <= s.high - s.low; k++) {
    const i = Math.floor(k / h);
    const x = k - i * h;
    const [c0, c1, c2] = d.coefs[i]!;
    const p = c2 * x;
    const acc = c1 + asr(p, d.k2);
    const q = x * acc + 2 ** (d.k1 - 1);
    const y = c0 + asr(q, d.k1);
    if (!fitsInt32(p) || !fitsInt32(acc) || !fitsInt32(q) || !fitsInt32(y) || !fitsInt32(c0)) return false;
  }
  return true;
}
