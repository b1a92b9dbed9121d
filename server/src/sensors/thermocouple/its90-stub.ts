// TEMPORARY stub of t1's its90.ts for type K only (TC-CONTRACT.md API); removed when t1's physics is merged.
// NIST Monograph 175 (1993), type K reference function and its exponential term, coefficients from memory.
export type TcType = 'B' | 'E' | 'J' | 'K' | 'N' | 'R' | 'S' | 'T';
export const TC_TYPES: readonly TcType[] = ['B', 'E', 'J', 'K', 'N', 'R', 'S', 'T'];
const Z = 273.15;
const NEG = [0, 0.394501280250e-1, 0.236223735980e-4, -0.328589067840e-6, -0.499048287770e-8, -0.675090591730e-10, -0.574103274280e-12, -0.310888728940e-14, -0.104516093650e-16, -0.198892668780e-19, -0.163226974860e-22];
const POS = [-0.176004136860e-1, 0.389212049750e-1, 0.185587700320e-4, -0.994575928740e-7, 0.318409457190e-9, -0.560728448890e-12, 0.560750590590e-15, -0.320207200030e-18, 0.971511471520e-22, -0.121047212750e-25];
const A0 = 0.1185976, A1 = -0.1183432e-3, A2 = 0.1269686e3;
function only(t: TcType): void { if (t !== 'K') throw new Error('stub: type K only'); }
export function referenceRange(t: TcType): { lowK: number; highK: number } { only(t); return { lowK: -270 + Z, highK: 1372 + Z }; }
function mv(c: number): number {
  const k = c < 0 ? NEG : POS;
  let s = 0;
  for (let i = k.length - 1; i >= 0; i--) s = s * c + k[i]!;
  return c < 0 ? s : s + A0 * Math.exp(A1 * (c - A2) ** 2);
}
export function emf(t: TcType, kelvin: number): number {
  const r = referenceRange(t);
  if (!(kelvin >= r.lowK && kelvin <= r.highK)) return NaN;
  return mv(kelvin - Z) / 1000;
}
export function seebeck(t: TcType, kelvin: number): number {
  const h = 1e-3;
  const r = referenceRange(t);
  const a = Math.max(r.lowK, kelvin - h), b = Math.min(r.highK, kelvin + h);
  return (emf(t, b) - emf(t, a)) / (b - a);
}
export function kelvinAtEmf(t: TcType, volts: number): number {
  const r = referenceRange(t);
  let a = r.lowK, b = r.highK;
  if (!(volts >= emf(t, a) && volts <= emf(t, b))) return NaN;
  for (let i = 0; i < 200 && b - a > 1e-10; i++) { const m = (a + b) / 2; if (emf(t, m) < volts) a = m; else b = m; }
  return (a + b) / 2;
}
