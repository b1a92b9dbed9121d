// TEMPORARY stub of t1's tolerance.ts for type K only (TC-CONTRACT.md API); removed when t1's physics is merged.
// IEC 60584-1 tolerance classes for type K, from memory.
import type { TcType } from './its90-stub';
export type TcClass = 1 | 2 | 3;
const Z = 273.15;
export function classRange(t: TcType, cls: TcClass): { lowK: number; highK: number } | null {
  if (t !== 'K') return null;
  return cls === 1 ? { lowK: -40 + Z, highK: 1000 + Z } : cls === 2 ? { lowK: -40 + Z, highK: 1200 + Z } : { lowK: -200 + Z, highK: 40 + Z };
}
export function toleranceK(t: TcType, cls: TcClass, kelvin: number): number | null {
  const r = classRange(t, cls);
  if (!r || kelvin < r.lowK || kelvin > r.highK) return null;
  const c = Math.abs(kelvin - Z);
  return cls === 1 ? Math.max(1.5, 0.004 * c) : cls === 2 ? Math.max(2.5, 0.0075 * c) : Math.max(2.5, 0.015 * c);
}
