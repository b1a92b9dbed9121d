// ITS-90 thermocouple reference functions and their approximate inverses, letter types B, E, J, K,
// N, R, S, T. Source: G. W. Burns, M. G. Scroger, G. F. Strouse, M. C. Croarkin, W. F. Guthrie,
// "Temperature-Electromotive Force Reference Functions and Tables for the Letter-Designated
// Thermocouple Types Based on the ITS-90", NIST Monograph 175 (1993): the reference-function
// coefficients c_i (E in mV, t90 in °C; reference junction at 0 °C), type K's extra term above 0 °C
//   E = sum c_i t^i + a0 exp(a1 (t - a2)^2),
// and the inverse polynomials t90 = sum d_i E^i with their ranges and error bands, as the
// Monograph gives them (also distributed by NIST's ITS-90 thermocouple database). Every coefficient
// was cross-checked against two independent transcriptions of the NIST data; the tests check the
// functions against the Monograph's tables and the inverses against their stated error bands.
// Public interface in SI units (kelvin, volts); the coefficients stay in the Monograph's units.

import { ZERO_CELSIUS_K } from '../../physics/constants';

export type TcType = 'B' | 'E' | 'J' | 'K' | 'N' | 'R' | 'S' | 'T';
export const TC_TYPES: readonly TcType[] = ['B', 'E', 'J', 'K', 'N', 'R', 'S', 'T'];

export interface Segment {
  /** Upper end of the segment, °C (the lower end is the previous segment's, or the range's). */
  highC: number;
  /** c_0 .. c_n, mV / °C^i. */
  c: readonly number[];
}

export interface InverseBand {
  lowC: number;
  highC: number;
  lowMv: number;
  highMv: number;
  /** Error range of the inverse, °C, as stated (inverse minus reference). */
  errLowC: number;
  errHighC: number;
  /** d_0 .. d_n, °C / mV^i. */
  d: readonly number[];
}

export interface TypeData {
  lowC: number;
  segments: readonly Segment[];
  /** Type K only: a0 (mV), a1 (1/°C^2), a2 (°C), applied above 0 °C. */
  exp?: { a0: number; a1: number; a2: number };
  inverse: readonly InverseBand[];
}

// NIST Monograph 175, reference functions (table of coefficients per type) and inverse functions.
const DATA: Readonly<Record<TcType, TypeData>> = {
  B: {
    lowC: 0,
    segments: [
      { highC: 630.615, c: [0, -0.246508183460e-3, 0.590404211710e-5, -0.132579316360e-8, 0.156682919010e-11, -0.169445292400e-14, 0.629903470940e-18] },
      { highC: 1820, c: [-0.389381686210e1, 0.285717474700e-1, -0.848851047850e-4, 0.157852801640e-6, -0.168353448640e-9, 0.111097940130e-12, -0.445154310330e-16, 0.989756408210e-20, -0.937913302890e-24] },
    ],
    inverse: [
      { lowC: 250, highC: 700, lowMv: 0.291, highMv: 2.431, errLowC: -0.02, errHighC: 0.03,
        d: [9.8423321e1, 6.997150e2, -8.4765304e2, 1.0052644e3, -8.3345952e2, 4.5508542e2, -1.5523037e2, 2.988675e1, -2.474286] },
      // The Monograph's text gives this range as 700 °C to 1800 °C but its EMFs run to 13.820 mV,
      // which is 1820 °C; the range is taken to the reference function's end.
      { lowC: 700, highC: 1820, lowMv: 2.431, highMv: 13.82, errLowC: -0.01, errHighC: 0.02,
        d: [2.1315071e2, 2.8510504e2, -5.2742887e1, 9.9160804, -1.2965303, 1.119587e-1, -6.0625199e-3, 1.8661696e-4, -2.4878585e-6] },
    ],
  },
  E: {
    lowC: -270,
    segments: [
      { highC: 0, c: [0, 0.586655087080e-1, 0.454109771240e-4, -0.779980486860e-6, -0.258001608430e-7, -0.594525830570e-9, -0.932140586670e-11, -0.102876055340e-12, -0.803701236210e-15, -0.439794973910e-17, -0.164147763550e-19, -0.396736195160e-22, -0.558273287210e-25, -0.346578420130e-28] },
      { highC: 1000, c: [0, 0.586655087100e-1, 0.450322755820e-4, 0.289084072120e-7, -0.330568966520e-9, 0.650244032700e-12, -0.191974955040e-15, -0.125366004970e-17, 0.214892175690e-20, -0.143880417820e-23, 0.359608994810e-27] },
    ],
    inverse: [
      { lowC: -200, highC: 0, lowMv: -8.825, highMv: 0, errLowC: -0.01, errHighC: 0.03,
        d: [0, 1.6977288e1, -4.351497e-1, -1.5859697e-1, -9.2502871e-2, -2.6084314e-2, -4.1360199e-3, -3.403403e-4, -1.156489e-5] },
      { lowC: 0, highC: 1000, lowMv: 0, highMv: 76.373, errLowC: -0.02, errHighC: 0.02,
        d: [0, 1.7057035e1, -2.3301759e-1, 6.5435585e-3, -7.3562749e-5, -1.7896001e-6, 8.4036165e-8, -1.3735879e-9, 1.0629823e-11, -3.2447087e-14] },
    ],
  },
  J: {
    lowC: -210,
    segments: [
      { highC: 760, c: [0, 0.503811878150e-1, 0.304758369300e-4, -0.856810657200e-7, 0.132281952950e-9, -0.170529583370e-12, 0.209480906970e-15, -0.125383953360e-18, 0.156317256970e-22] },
      { highC: 1200, c: [0.296456256810e3, -0.149761277860e1, 0.317871039240e-2, -0.318476867010e-5, 0.157208190040e-8, -0.306913690560e-12] },
    ],
    inverse: [
      { lowC: -210, highC: 0, lowMv: -8.095, highMv: 0, errLowC: -0.05, errHighC: 0.03,
        d: [0, 1.9528268e1, -1.2286185, -1.0752178, -5.9086933e-1, -1.7256713e-1, -2.8131513e-2, -2.396337e-3, -8.3823321e-5] },
      { lowC: 0, highC: 760, lowMv: 0, highMv: 42.919, errLowC: -0.04, errHighC: 0.04,
        d: [0, 1.978425e1, -2.001204e-1, 1.036969e-2, -2.549687e-4, 3.585153e-6, -5.344285e-8, 5.09989e-10] },
      { lowC: 760, highC: 1200, lowMv: 42.919, highMv: 69.553, errLowC: -0.04, errHighC: 0.03,
        d: [-3.11358187e3, 3.00543684e2, -9.9477323, 1.7027663e-1, -1.43033468e-3, 4.73886084e-6] },
    ],
  },
  K: {
    lowC: -270,
    segments: [
      { highC: 0, c: [0, 0.394501280250e-1, 0.236223735980e-4, -0.328589067840e-6, -0.499048287770e-8, -0.675090591730e-10, -0.574103274280e-12, -0.310888728940e-14, -0.104516093650e-16, -0.198892668780e-19, -0.163226974860e-22] },
      { highC: 1372, c: [-0.176004136860e-1, 0.389212049750e-1, 0.185587700320e-4, -0.994575928740e-7, 0.318409457190e-9, -0.560728448890e-12, 0.560750590590e-15, -0.320207200030e-18, 0.971511471520e-22, -0.121047212750e-25] },
    ],
    exp: { a0: 0.1185976, a1: -0.1183432e-3, a2: 0.1269686e3 },
    inverse: [
      { lowC: -200, highC: 0, lowMv: -5.891, highMv: 0, errLowC: -0.02, errHighC: 0.04,
        d: [0, 2.5173462e1, -1.1662878, -1.0833638, -8.977354e-1, -3.7342377e-1, -8.6632643e-2, -1.0450598e-2, -5.1920577e-4] },
      { lowC: 0, highC: 500, lowMv: 0, highMv: 20.644, errLowC: -0.05, errHighC: 0.04,
        d: [0, 2.508355e1, 7.860106e-2, -2.503131e-1, 8.31527e-2, -1.228034e-2, 9.804036e-4, -4.41303e-5, 1.057734e-6, -1.052755e-8] },
      { lowC: 500, highC: 1372, lowMv: 20.644, highMv: 54.886, errLowC: -0.05, errHighC: 0.06,
        d: [-1.318058e2, 4.830222e1, -1.646031, 5.464731e-2, -9.650715e-4, 8.802193e-6, -3.11081e-8] },
    ],
  },
  N: {
    lowC: -270,
    segments: [
      { highC: 0, c: [0, 0.261591059620e-1, 0.109574842280e-4, -0.938411115540e-7, -0.464120397590e-10, -0.263033577160e-11, -0.226534380030e-13, -0.760893007910e-16, -0.934196678350e-19] },
      { highC: 1300, c: [0, 0.259293946010e-1, 0.157101418800e-4, 0.438256272370e-7, -0.252611697940e-9, 0.643118193390e-12, -0.100634715190e-14, 0.997453389920e-18, -0.608632456070e-21, 0.208492293390e-24, -0.306821961510e-28] },
    ],
    inverse: [
      { lowC: -200, highC: 0, lowMv: -3.99, highMv: 0, errLowC: -0.02, errHighC: 0.03,
        d: [0, 3.8436847e1, 1.1010485, 5.2229312, 7.2060525, 5.8488586, 2.7754916, 7.7075166e-1, 1.1582665e-1, 7.3138868e-3] },
      { lowC: 0, highC: 600, lowMv: 0, highMv: 20.613, errLowC: -0.02, errHighC: 0.03,
        d: [0, 3.86896e1, -1.08267, 4.70205e-2, -2.12169e-6, -1.17272e-4, 5.3928e-6, -7.98156e-8] },
      { lowC: 600, highC: 1300, lowMv: 20.613, highMv: 47.513, errLowC: -0.04, errHighC: 0.02,
        d: [1.972485e1, 3.300943e1, -3.915159e-1, 9.855391e-3, -1.274371e-4, 7.767022e-7] },
    ],
  },
  R: {
    lowC: -50,
    segments: [
      { highC: 1064.18, c: [0, 0.528961729765e-2, 0.139166589782e-4, -0.238855693017e-7, 0.356916001063e-10, -0.462347666298e-13, 0.500777441034e-16, -0.373105886191e-19, 0.157716482367e-22, -0.281038625251e-26] },
      { highC: 1664.5, c: [0.295157925316e1, -0.252061251332e-2, 0.159564501865e-4, -0.764085947576e-8, 0.205305291024e-11, -0.293359668173e-15] },
      { highC: 1768.1, c: [0.152232118209e3, -0.268819888545, 0.171280280471e-3, -0.345895706453e-7, -0.934633971046e-14] },
    ],
    // The Monograph's second and third inverse ranges overlap (1064 °C to 1200 °C); the conversion
    // takes the third from where it starts.
    inverse: [
      { lowC: -50, highC: 250, lowMv: -0.226, highMv: 1.923, errLowC: -0.02, errHighC: 0.02,
        d: [0, 1.889138e2, -9.383529e1, 1.3068619e2, -2.270358e2, 3.5145659e2, -3.89539e2, 2.8239471e2, -1.2607281e2, 3.1353611e1, -3.3187769] },
      { lowC: 250, highC: 1200, lowMv: 1.923, highMv: 13.228, errLowC: -0.005, errHighC: 0.005,
        d: [1.334584505e1, 1.472644573e2, -1.844024844e1, 4.031129726, -6.24942836e-1, 6.468412046e-2, -4.458750426e-3, 1.994710149e-4, -5.31340179e-6, 6.481976217e-8] },
      { lowC: 1064, highC: 1664.5, lowMv: 11.361, highMv: 19.739, errLowC: -0.0005, errHighC: 0.001,
        d: [-8.199599416e1, 1.553962042e2, -8.342197663, 4.279433549e-1, -1.19157791e-2, 1.492290091e-4] },
      { lowC: 1664.5, highC: 1768.1, lowMv: 19.739, highMv: 21.103, errLowC: -0.001, errHighC: 0.002,
        d: [3.406177836e4, -7.023729171e3, 5.582903813e2, -1.952394635e1, 2.560740231e-1] },
    ],
  },
  S: {
    lowC: -50,
    segments: [
      { highC: 1064.18, c: [0, 0.540313308631e-2, 0.125934289740e-4, -0.232477968689e-7, 0.322028823036e-10, -0.331465196389e-13, 0.255744251786e-16, -0.125068871393e-19, 0.271443176145e-23] },
      { highC: 1664.5, c: [0.132900444085e1, 0.334509311344e-2, 0.654805192818e-5, -0.164856259209e-8, 0.129989605174e-13] },
      { highC: 1768.1, c: [0.146628232636e3, -0.258430516752, 0.163693574641e-3, -0.330439046987e-7, -0.943223690612e-14] },
    ],
    // As for type R, the second and third inverse ranges overlap; the third is taken from its start.
    inverse: [
      { lowC: -50, highC: 250, lowMv: -0.235, highMv: 1.874, errLowC: -0.02, errHighC: 0.02,
        d: [0, 1.8494946e2, -8.00504062e1, 1.0223743e2, -1.52248592e2, 1.88821343e2, -1.59085941e2, 8.2302788e1, -2.34181944e1, 2.7978626] },
      { lowC: 250, highC: 1200, lowMv: 1.874, highMv: 11.95, errLowC: -0.01, errHighC: 0.01,
        d: [1.291507177e1, 1.466298863e2, -1.534713402e1, 3.145945973, -4.163257839e-1, 3.187963771e-2, -1.2916375e-3, 2.183475087e-5, -1.447379511e-7, 8.211272125e-9] },
      { lowC: 1064, highC: 1664.5, lowMv: 10.332, highMv: 17.536, errLowC: -0.0002, errHighC: 0.0002,
        d: [-8.087801117e1, 1.621573104e2, -8.536869453, 4.719686976e-1, -1.441693666e-2, 2.08161889e-4] },
      { lowC: 1664.5, highC: 1768.1, lowMv: 17.536, highMv: 18.693, errLowC: -0.002, errHighC: 0.002,
        d: [5.333875126e4, -1.235892298e4, 1.092657613e3, -4.265693686e1, 6.24720542e-1] },
    ],
  },
  T: {
    lowC: -270,
    segments: [
      { highC: 0, c: [0, 0.387481063640e-1, 0.441944343470e-4, 0.118443231050e-6, 0.200329735540e-7, 0.901380195590e-9, 0.226511565930e-10, 0.360711542050e-12, 0.384939398830e-14, 0.282135219250e-16, 0.142515947790e-18, 0.487686622860e-21, 0.107955392700e-23, 0.139450270620e-26, 0.797951539270e-30] },
      { highC: 400, c: [0, 0.387481063640e-1, 0.332922278800e-4, 0.206182434040e-6, -0.218822568460e-8, 0.109968809280e-10, -0.308157587720e-13, 0.454791352900e-16, -0.275129016730e-19] },
    ],
    inverse: [
      { lowC: -200, highC: 0, lowMv: -5.603, highMv: 0, errLowC: -0.02, errHighC: 0.04,
        d: [0, 2.5949192e1, -2.1316967e-1, 7.9018692e-1, 4.2527777e-1, 1.3304473e-1, 2.0241446e-2, 1.2668171e-3] },
      { lowC: 0, highC: 400, lowMv: 0, highMv: 20.872, errLowC: -0.03, errHighC: 0.03,
        d: [0, 2.5928e1, -7.602961e-1, 4.637791e-2, -2.165394e-3, 6.048144e-5, -7.293422e-7] },
    ],
  },
};

/** Kelvin within this of a range end counts as the end (a °C value converted to kelvin and back). */
const END_SLACK_K = 1e-9;

function horner(c: readonly number[], x: number): number {
  let s = 0;
  for (let i = c.length - 1; i >= 0; i--) s = s * x + c[i]!;
  return s;
}

function hornerSlope(c: readonly number[], x: number): number {
  let s = 0;
  for (let i = c.length - 1; i >= 1; i--) s = s * x + i * c[i]!;
  return s;
}

/** °C inside the range (ends clamped within the slack), or NaN. */
function celsiusIn(d: TypeData, kelvin: number): number {
  if (!Number.isFinite(kelvin)) return NaN;
  const lowK = d.lowC + ZERO_CELSIUS_K;
  const highK = d.segments[d.segments.length - 1]!.highC + ZERO_CELSIUS_K;
  if (kelvin < lowK - END_SLACK_K || kelvin > highK + END_SLACK_K) return NaN;
  return Math.min(Math.max(kelvin - ZERO_CELSIUS_K, d.lowC), d.segments[d.segments.length - 1]!.highC);
}

/** The segment whose range holds t (°C): segments close at their upper end, as the Monograph lists them. */
function segmentAt(d: TypeData, t: number): Segment {
  for (const s of d.segments) if (t <= s.highC) return s;
  return d.segments[d.segments.length - 1]!;
}

/** E(t), mV, of a type's data (exported for the tests, which also check altered copies). */
export function emfMv(d: TypeData, t: number): number {
  let e = horner(segmentAt(d, t).c, t);
  if (d.exp && t > 0) e += d.exp.a0 * Math.exp(d.exp.a1 * (t - d.exp.a2) ** 2);
  return e;
}

/** dE/dt, mV/°C. */
function slopeMv(d: TypeData, t: number): number {
  let s = hornerSlope(segmentAt(d, t).c, t);
  if (d.exp && t > 0) {
    const u = t - d.exp.a2;
    s += d.exp.a0 * Math.exp(d.exp.a1 * u * u) * 2 * d.exp.a1 * u;
  }
  return s;
}

export function referenceRange(t: TcType): { lowK: number; highK: number } {
  const d = DATA[t];
  return { lowK: d.lowC + ZERO_CELSIUS_K, highK: d.segments[d.segments.length - 1]!.highC + ZERO_CELSIUS_K };
}

/** Reference function: EMF in volts with the reference junction at 0 °C. NaN outside referenceRange. */
export function emf(t: TcType, kelvin: number): number {
  const d = DATA[t];
  const c = celsiusIn(d, kelvin);
  return Number.isNaN(c) ? NaN : emfMv(d, c) * 1e-3;
}

/** dEMF/dT in V/K from the derivative of the reference function. NaN outside referenceRange. */
export function seebeck(t: TcType, kelvin: number): number {
  const d = DATA[t];
  const c = celsiusIn(d, kelvin);
  return Number.isNaN(c) ? NaN : slopeMv(d, c) * 1e-3;
}

/**
 * Lowest temperature (°C) from which E(t) rises all the way to the top of the range. Type B's
 * function falls below zero just above 0 °C (its minimum, near 21 °C, is about -2.6 µV), so an EMF
 * there has two temperatures; the inverse takes the branch above the minimum. Found once per type
 * from the derivative (scan, then bisection on its last sign change).
 */
const monotoneLowC = new Map<TcType, number>();
function risingFromC(t: TcType): number {
  const known = monotoneLowC.get(t);
  if (known !== undefined) return known;
  const d = DATA[t];
  const top = d.segments[d.segments.length - 1]!.highC;
  const step = 0.05;
  let low = d.lowC;
  for (let x = top; x > d.lowC; x -= step) {
    if (slopeMv(d, x) <= 0) {
      let a = x;
      let b = Math.min(x + step, top);
      for (let i = 0; i < 80; i++) {
        const m = (a + b) / 2;
        if (slopeMv(d, m) <= 0) a = m;
        else b = m;
      }
      low = b;
      break;
    }
  }
  monotoneLowC.set(t, low);
  return low;
}

/** The EMF range (volts) over which kelvinAtEmf answers: from the rising branch's foot to the top. */
export function emfRange(t: TcType): { lowV: number; highV: number } {
  const d = DATA[t];
  return { lowV: emfMv(d, risingFromC(t)) * 1e-3, highV: emfMv(d, d.segments[d.segments.length - 1]!.highC) * 1e-3 };
}

/**
 * The Monograph states the inverse ranges' EMFs to 1 µV, rounded (or cut) from the EMFs of the
 * ranges' temperatures; the polynomials are taken this far beyond the stated EMFs so that a range's
 * end temperatures are inside it.
 */
const INVERSE_END_SLACK_MV = 0.001;

/** One band's polynomial, °C, or NaN outside the band's EMFs (exported for the tests). */
export function inverseBandC(b: InverseBand, mv: number): number {
  if (!Number.isFinite(mv) || mv < b.lowMv - INVERSE_END_SLACK_MV || mv > b.highMv + INVERSE_END_SLACK_MV) return NaN;
  return horner(b.d, mv);
}

/** The published inverse polynomial's value, °C, or NaN outside its ranges. */
function inverseC(d: TypeData, mv: number): number {
  if (!Number.isFinite(mv)) return NaN;
  const bands = d.inverse;
  if (mv < bands[0]!.lowMv - INVERSE_END_SLACK_MV || mv > bands[bands.length - 1]!.highMv + INVERSE_END_SLACK_MV) return NaN;
  // The last band that starts at or below mv (overlapping bands: the later one from its start).
  let band = bands[0]!;
  for (const b of bands) if (mv >= b.lowMv) band = b;
  return horner(band.d, mv);
}

/** NIST's inverse polynomial (as published), kelvin; NaN outside its ranges. */
export function inverseKelvinAtEmf(t: TcType, volts: number): number {
  const c = inverseC(DATA[t], volts * 1e3);
  return Number.isNaN(c) ? NaN : c + ZERO_CELSIUS_K;
}

/**
 * Exact inverse of emf(), kelvin, to 1e-9 K: Newton from the published inverse (or from linear
 * interpolation where it has no range), kept inside a bracket that shrinks every step, bisecting
 * when a Newton step would leave it. NaN outside the EMFs of the rising branch (see risingFromC).
 */
export function kelvinAtEmf(t: TcType, volts: number): number {
  if (!Number.isFinite(volts)) return NaN;
  const d = DATA[t];
  const target = volts * 1e3;
  let lo = risingFromC(t);
  let hi = d.segments[d.segments.length - 1]!.highC;
  const eLo = emfMv(d, lo);
  const eHi = emfMv(d, hi);
  // Range ends with a little slack for the rounding of a volts value.
  const slack = 1e-12;
  if (target < eLo - slack || target > eHi + slack) return NaN;
  if (target <= eLo) return lo + ZERO_CELSIUS_K;
  if (target >= eHi) return hi + ZERO_CELSIUS_K;
  let x = inverseC(d, target);
  if (!(x > lo && x < hi)) x = lo + ((target - eLo) / (eHi - eLo)) * (hi - lo);
  for (let i = 0; i < 200; i++) {
    const f = emfMv(d, x) - target;
    if (f === 0) return x + ZERO_CELSIUS_K;
    if (f < 0) lo = x;
    else hi = x;
    if (hi - lo <= 1e-10) break;
    const s = slopeMv(d, x);
    let next = s > 0 ? x - f / s : NaN;
    if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    if (Math.abs(next - x) <= 1e-10) {
      x = next;
      break;
    }
    x = next;
  }
  return x + ZERO_CELSIUS_K;
}

/** A type's coefficients as published (read-only; for the tests and for code generators that tabulate them). */
export function its90Data(t: TcType): Readonly<TypeData> {
  return DATA[t];
}

/** The inverse polynomials' published ranges and error bands (°C as NIST states them, here as kelvin and K). */
export function inverseBands(t: TcType): readonly { lowK: number; highK: number; errorLowK: number; errorHighK: number; lowV: number; highV: number }[] {
  return DATA[t].inverse.map((b) => ({
    lowK: b.lowC + ZERO_CELSIUS_K,
    highK: b.highC + ZERO_CELSIUS_K,
    errorLowK: b.errLowC,
    errorHighK: b.errHighC,
    lowV: b.lowMv * 1e-3,
    highV: b.highMv * 1e-3,
  }));
}
