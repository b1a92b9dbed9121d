// Table of breakpoints every 2^shift codes with linear interpolation between them.
// Spacing is a power of two so the segment index and fraction are a shift and a mask.
// Entries are not the model values at the breakpoints: a coordinate search moves each entry by
// whole output units to minimise the max error of its two segments, counting the exact rounding
// of the C arithmetic (see arith.ts). Linear-interpolation error bound h^2 |f''| / 8 is the
// classical result (e.g. any numerical-analysis text on polynomial interpolation error).

import { INT16_MAX, INT16_MIN, fitsInt16, fitsInt32 } from './arith';
import { errAt, modelAt, type Samples } from './samples';

export interface TableDesign {
  kind: 'table';
  shift: number;
  /** Code of the first point: the in-range low code rounded down to a multiple of 2^shift, so the
   *  point index is the code's high bits and the C needs no subtraction before the shift. */
  base: number;
  entries: number[];
  entryBits: 16 | 32;
  /** Width of the unsigned span * fraction product. */
  mulBits: 16 | 32;
  /** Largest |entry[i+1] - entry[i]|. */
  spanMax: number;
}

/** Kernel value (before trim) for in-range code, exactly as the C computes it. */
export function tableKernel(d: TableDesign, dir: 1 | -1, code: number): number {
  const off = code - d.base;
  if (d.shift === 0) return d.entries[off]!;
  const h = 2 ** d.shift;
  const i = Math.floor(off / h);
  const frac = off - i * h;
  const a = d.entries[i]!;
  const span = Math.abs(d.entries[i + 1]! - a);
  const step = Math.floor((span * frac + h / 2) / h);
  return a + dir * step;
}

function segmentError(s: Samples, e: number[], shift: number, base: number, seg: number): number {
  const h = 2 ** shift;
  const start = base + seg * h;
  const first = Math.max(0, start - s.low);
  const last = Math.min(s.high - s.low, start + h - 1 - s.low);
  const a = e[seg]!;
  const span = Math.abs(e[seg + 1]! - a);
  let worst = 0;
  for (let k = first; k <= last; k++) {
    const frac = s.low + k - start;
    const y = a + s.dir * Math.floor((span * frac + h / 2) / h);
    const err = errAt(s, k, y);
    if (err > worst) worst = err;
  }
  return worst;
}

function monotoneOk(e: number[], j: number, dir: 1 | -1): boolean {
  const prev = e[j - 1];
  const next = e[j + 1];
  const v = e[j]!;
  if (prev !== undefined && (v - prev) * dir < 0) return false;
  if (next !== undefined && (next - v) * dir < 0) return false;
  return true;
}

/** Best table at one spacing, or undefined when it cannot be represented. */
export function designTable(s: Samples, shift: number, start: (code: number) => number = (code) => modelAt(s, code)): { design: TableDesign; maxErr: number } | undefined {
  const n = s.high - s.low + 1;
  if (shift === 0) {
    const entries = Array.from(s.f, (v) => Math.round(v));
    // Entries of a direct table need only the trim-aware rounding: search +-2 units per entry.
    for (let k = 0; k < n; k++) {
      let best = entries[k]!;
      let bestErr = errAt(s, k, best);
      for (let dv = -2; dv <= 2; dv++) {
        const err = errAt(s, k, entries[k]! + dv);
        if (err < bestErr - 1e-9) { best = entries[k]! + dv; bestErr = err; }
      }
      entries[k] = best;
    }
    if (!entries.every(fitsInt32)) return undefined;
    let maxErr = 0;
    for (let k = 0; k < n; k++) maxErr = Math.max(maxErr, errAt(s, k, entries[k]!));
    const entryBits = entries.every(fitsInt16) ? 16 : 32;
    return { design: { kind: 'table', shift, base: s.low, entries, entryBits, mulBits: 16, spanMax: 0 }, maxErr };
  }
  const h = 2 ** shift;
  const base = Math.floor(s.low / h) * h;
  const segs = Math.floor((s.high - base) / h) + 1;
  const e: number[] = [];
  for (let i = 0; i <= segs; i++) e.push(Math.round(start(base + i * h)));
  if (!e.every(fitsInt32)) return undefined;
  const err = Array.from({ length: segs }, (_, i) => segmentError(s, e, shift, base, i));
  // Coordinate search: move one entry while the worse of its two segments improves.
  for (let pass = 0; pass < 60; pass++) {
    let improved = false;
    for (let j = 0; j <= segs; j++) {
      for (const step of [1, -1]) {
        for (let tries = 0; tries < 4096; tries++) {
          const left = j > 0 ? err[j - 1]! : 0;
          const right = j < segs ? err[j]! : 0;
          const cur = Math.max(left, right);
          e[j]! += step;
          if (!monotoneOk(e, j, s.dir) || !fitsInt32(e[j]!)) { e[j]! -= step; break; }
          const nl = j > 0 ? segmentError(s, e, shift, base, j - 1) : 0;
          const nr = j < segs ? segmentError(s, e, shift, base, j) : 0;
          if (Math.max(nl, nr) < cur - 1e-9) {
            if (j > 0) err[j - 1] = nl;
            if (j < segs) err[j] = nr;
            improved = true;
          } else {
            e[j]! -= step;
            break;
          }
        }
      }
    }
    if (!improved) break;
  }
  let spanMax = 0;
  for (let i = 0; i < segs; i++) spanMax = Math.max(spanMax, Math.abs(e[i + 1]! - e[i]!));
  if (spanMax > 0xffffffff / h) return undefined;
  const entryBits = e.every((v) => v >= INT16_MIN && v <= INT16_MAX) ? 16 : 32;
  const mulBits = spanMax * (h - 1) + h / 2 <= 0xffff ? 16 : 32;
  const maxErr = Math.max(0, ...err);
  return { design: { kind: 'table', shift, base, entries: e, entryBits, mulBits, spanMax }, maxErr };
}
