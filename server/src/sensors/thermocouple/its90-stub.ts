// TEMPORARY stand-in for its90.ts (helper t1's), type K only, with the TC-CONTRACT.md API, so the
// generated-code work can start before the real module lands. Coefficients: NIST Monograph 175
// (1993), type K reference function, recalled from memory. Delete when its90.ts is merged.
export type TcType = 'B' | 'E' | 'J' | 'K' | 'N' | 'R' | 'S' | 'T';
export const TC_TYPES: readonly TcType[] = ['K'];

const K_NEG = [0, 0.39450128025e-1, 0.236223735980e-4, -0.328589067840e-6, -0.499048287770e-8, -0.675090591730e-10, -0.574103274280e-12, -0.310888728940e-14, -0.104516093650e-16, -0.198892668780e-19, -0.163226974860e-22];
const K_POS = [-0.176004136860e-1, 0.389212049750e-1, 0.185587700320e-4, -0.994575928740e-7, 0.318409457190e-9, -0.560728448890e-12, 0.560750590590e-15, -0.320207200030e-18, 0.971511471520e-22, -0.121047212750e-25];
const K_A = [0.1185976, -0.1183432e-3, 0.1269686e3];

export function referenceRange(t: TcType): { lowK: number; highK: number } {
  if (t !== 'K') throw new Error(`stub: type ${t} not available`);
  return { lowK: 273.15 - 270, highK: 273.15 + 1372 };
}

export function emf(t: TcType, kelvin: number): number {
  const r = referenceRange(t);
  if (!(kelvin >= r.lowK && kelvin <= r.highK)) return NaN;
  const c = kelvin - 273.15;
  const co = c < 0 ? K_NEG : K_POS;
  let mv = 0;
  for (let i = co.length - 1; i >= 0; i--) mv = mv * c + co[i]!;
  if (c >= 0) mv += K_A[0]! * Math.exp(K_A[1]! * (c - K_A[2]!) ** 2);
  return mv / 1000;
}

export function seebeck(t: TcType, kelvin: number): number {
  const h = 1e-3;
  return (emf(t, kelvin + h) - emf(t, kelvin - h)) / (2 * h);
}

export function kelvinAtEmf(t: TcType, volts: number): number {
  const r = referenceRange(t);
  let lo = r.lowK;
  let hi = r.highK;
  const elo = emf(t, lo);
  const ehi = emf(t, hi);
  if (!(volts >= elo && volts <= ehi)) return NaN;
  for (let i = 0; i < 200 && hi - lo > 1e-10; i++) {
    const m = (lo + hi) / 2;
    if (emf(t, m) < volts) lo = m;
    else hi = m;
  }
  return (lo + hi) / 2;
}
