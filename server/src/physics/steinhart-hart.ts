// NTC thermistor models in Steinhart-Hart form, 1/T = A + B ln R + C (ln R)^3 (T in K, R in ohm).
// Source of the equation: J. S. Steinhart and S. R. Hart, "Calibration curves for thermistors",
// Deep-Sea Research 15 (1968) 497-503. The beta model R = R0 exp(beta (1/T - 1/T0)) is the special
// case A = 1/T0 - ln(R0)/beta, B = 1/beta, C = 0 (take the log of the beta model and solve for 1/T).

/** Steinhart-Hart coefficients: 1/T = A + B ln R + C (ln R)^3, T in K, R in ohm. */
export interface ShCoefficients {
  A: number;
  B: number;
  C: number;
}

/** The Steinhart-Hart form of the beta model R(T) = r0 exp(beta (1/T - 1/t0)). Exact, not a fit. */
export function betaToSteinhartHart(r0: number, beta: number, t0K: number): ShCoefficients {
  return { A: 1 / t0K - Math.log(r0) / beta, B: 1 / beta, C: 0 };
}

/** Beta between two temperatures from the resistances there: ln(R1/R2) / (1/T1 - 1/T2). */
export function betaBetween(r1: number, t1K: number, r2: number, t2K: number): number {
  return Math.log(r1 / r2) / (1 / t1K - 1 / t2K);
}

/** Kelvin at a resistance (the Steinhart-Hart equation itself, closed form). */
export function shKelvinAt(c: ShCoefficients, ohms: number): number {
  const L = Math.log(ohms);
  return 1 / (c.A + c.B * L + c.C * L * L * L);
}

/** d(ln R)/d(1/T) = 1/(B + 3 C L^2): the local beta at ln R = L. */
export function shLocalBeta(c: ShCoefficients, L: number): number {
  return 1 / (c.B + 3 * c.C * L * L);
}

/**
 * Resistance at a temperature: the real root L = ln R of C L^3 + B L + (A - 1/T) = 0.
 * C = 0: linear. Otherwise Cardano's formula for the depressed cubic L^3 + pL + q = 0 (one real root when
 * p > 0, i.e. when B/C > 0), then two Newton steps on the cubic to remove the cancellation left by
 * the two cube roots. Newton from the linear guess when p <= 0 (a fit with C < 0; the caller has
 * checked monotonicity over its range).
 */
export function shResistanceAt(c: ShCoefficients, kelvin: number): number {
  const g = c.A - 1 / kelvin;
  let L: number;
  if (c.C === 0) return Math.exp(-g / c.B);
  const p = c.B / c.C;
  const q = g / c.C;
  if (p > 0) {
    const d = Math.sqrt((q / 2) ** 2 + (p / 3) ** 3);
    L = Math.cbrt(-q / 2 + d) + Math.cbrt(-q / 2 - d);
  } else {
    L = -g / c.B;
  }
  for (let i = 0; i < 8; i++) {
    const f = c.C * L * L * L + c.B * L + g;
    const df = 3 * c.C * L * L + c.B;
    const step = f / df;
    L -= step;
    if (Math.abs(step) < 1e-15 * Math.max(1, Math.abs(L))) break;
  }
  return Math.exp(L);
}

/** dR/dT at a temperature: from 1/T = A + B L + C L^3, dL/dT = -1/(T^2 (B + 3 C L^2)). */
export function shResistanceSlope(c: ShCoefficients, kelvin: number): number {
  const R = shResistanceAt(c, kelvin);
  const L = Math.log(R);
  return (-R / (kelvin * kelvin)) * shLocalBeta(c, L);
}

/**
 * The coefficients through three (kelvin, ohm) points exactly: the 3x3 linear system
 * [1, L_i, L_i^3] (A, B, C)^T = 1/T_i, solved by Gaussian elimination with partial pivoting and one
 * step of iterative refinement. Returns a message when the points cannot define a thermistor.
 */
export function fitSteinhartHart(points: readonly [number, number][]): ShCoefficients | string {
  if (points.length !== 3) return 'a Steinhart-Hart fit needs exactly three points';
  const sorted = [...points].sort((a, b) => a[0] - b[0]);
  for (const [t, r] of sorted) {
    if (!(t > 0) || !(r > 0) || !Number.isFinite(t) || !Number.isFinite(r)) return 'each point needs a temperature above 0 K and a resistance above 0 Ω';
  }
  for (let i = 1; i < 3; i++) {
    if (!(sorted[i]![0] > sorted[i - 1]![0])) return 'the three points need three different temperatures';
    if (!(sorted[i]![1] < sorted[i - 1]![1])) return 'an NTC thermistor\'s resistance must fall as the temperature rises; the points do not';
  }
  const rows = sorted.map(([t, r]) => {
    const L = Math.log(r);
    return [1, L, L * L * L, 1 / t];
  });
  const x = solve3(rows);
  if (!x) return 'the three points do not determine the coefficients (they lie on one curve of lower order)';
  const [A, B, C] = x;
  return { A, B, C };
}

/** Gaussian elimination with partial pivoting on a 3x4 augmented matrix, with one step of iterative refinement. */
function solve3(rows: number[][]): [number, number, number] | null {
  const base = rows.map((r) => [...r]);
  const x = eliminate(base);
  if (!x) return null;
  // One step of iterative refinement (residual in double) tightens the fit at the three points.
  const resid = rows.map((r) => [r[0]!, r[1]!, r[2]!, r[3]! - (r[0]! * x[0] + r[1]! * x[1] + r[2]! * x[2])]);
  const dx = eliminate(resid);
  return dx ? [x[0] + dx[0], x[1] + dx[1], x[2] + dx[2]] : x;
}

function eliminate(m: number[][]): [number, number, number] | null {
  const a = m.map((r) => [...r]);
  for (let col = 0; col < 3; col++) {
    let piv = col;
    for (let r = col + 1; r < 3; r++) if (Math.abs(a[r]![col]!) > Math.abs(a[piv]![col]!)) piv = r;
    if (a[piv]![col] === 0) return null;
    [a[col], a[piv]] = [a[piv]!, a[col]!];
    for (let r = col + 1; r < 3; r++) {
      const f = a[r]![col]! / a[col]![col]!;
      for (let k = col; k < 4; k++) a[r]![k]! -= f * a[col]![k]!;
    }
  }
  const x = [0, 0, 0];
  for (let r = 2; r >= 0; r--) {
    let s = a[r]![3]!;
    for (let k = r + 1; k < 3; k++) s -= a[r]![k]! * x[k]!;
    x[r] = s / a[r]![r]!;
  }
  if (!x.every(Number.isFinite)) return null;
  return [x[0]!, x[1]!, x[2]!];
}

/**
 * Checks that R(T) falls strictly over [lowK, highK] (B + 3 C L^2 > 0 for every L in the
 * resistance range) and returns a message otherwise.
 */
export function shMonotonicMessage(c: ShCoefficients, lowK: number, highK: number): string | null {
  if (!(c.B > 0)) return `B must be above 0 for a thermistor whose resistance falls with temperature (found ${c.B})`;
  const d = (L: number) => c.B + 3 * c.C * L * L;
  // B + 3CL^2 is monotonic in |L|; checking the two ends of the L range (and 0 when inside) suffices.
  const L1 = Math.log(shResistanceAt(c, highK));
  const L2 = Math.log(shResistanceAt(c, lowK));
  const cand = [L1, L2];
  if (L1 < 0 && L2 > 0) cand.push(0);
  for (const L of cand) if (!(d(L) > 0) || !Number.isFinite(L)) return 'the coefficients do not give a resistance that falls steadily with temperature over the range';
  return null;
}
