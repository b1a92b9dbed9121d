// Platinum resistance thermometers: the Callendar-Van Dusen equation of IEC 60751:2008 (clause 4.2),
//   t >= 0 °C:  R(t) = R0 (1 + A t + B t^2)
//   t <  0 °C:  R(t) = R0 (1 + A t + B t^2 + C (t - 100 °C) t^3)
// with the standard's coefficients A = 3.9083e-3 /°C, B = -5.775e-7 /°C², C = -4.183e-12 /°C⁴,
// valid from -200 °C to 850 °C; and the tolerance classes of the same standard (clause 5.1.2,
// table 3): AA ±(0.1 + 0.0017|t|), A ±(0.15 + 0.002|t|), B ±(0.3 + 0.005|t|), C ±(0.6 + 0.01|t|) °C
// (class formulas and validity ranges recalled from the standard, from memory).

export interface CvdCoefficients {
  A: number;
  B: number;
  /** Used below 0 °C only. */
  C: number;
}

/** IEC 60751:2008 coefficients. */
export const IEC60751: CvdCoefficients = { A: 3.9083e-3, B: -5.775e-7, C: -4.183e-12 };

/** Range of the equation in IEC 60751, °C. */
export const CVD_LOW_C = -200;
export const CVD_HIGH_C = 850;

export type RtdClass = 'AA' | 'A' | 'B' | 'C';

/** a + b|t| of each class, °C (IEC 60751:2008 table 3, from memory). */
export const RTD_CLASSES: Record<RtdClass, { a: number; b: number; wireLowC: number; wireHighC: number; filmLowC: number; filmHighC: number }> = {
  AA: { a: 0.1, b: 0.0017, wireLowC: -50, wireHighC: 250, filmLowC: 0, filmHighC: 150 },
  A: { a: 0.15, b: 0.002, wireLowC: -100, wireHighC: 450, filmLowC: -30, filmHighC: 300 },
  B: { a: 0.3, b: 0.005, wireLowC: -196, wireHighC: 600, filmLowC: -50, filmHighC: 500 },
  C: { a: 0.6, b: 0.01, wireLowC: -196, wireHighC: 600, filmLowC: -50, filmHighC: 600 },
};

/** Half-width of the class tolerance at t °C. */
export function classToleranceC(cls: RtdClass, celsius: number): number {
  const k = RTD_CLASSES[cls];
  return k.a + k.b * Math.abs(celsius);
}

/** R(t), ohm. */
export function cvdResistance(r0: number, k: CvdCoefficients, celsius: number): number {
  const t = celsius;
  const poly = 1 + k.A * t + k.B * t * t;
  return t >= 0 ? r0 * poly : r0 * (poly + k.C * (t - 100) * t * t * t);
}

/** dR/dt, ohm/°C (= ohm/K). */
export function cvdSlope(r0: number, k: CvdCoefficients, celsius: number): number {
  const t = celsius;
  const d = k.A + 2 * k.B * t;
  // d/dt [C (t - 100) t^3] = C (4 t^3 - 300 t^2)
  return t >= 0 ? r0 * d : r0 * (d + k.C * (4 * t * t * t - 300 * t * t));
}

/**
 * t at a resistance. At or above R0 (t >= 0) the quadratic's root in the cancellation-free form
 * t = 2 x / (A + sqrt(A^2 + 4 B x)), x = R/R0 - 1 (the textbook root multiplied by its conjugate).
 * Below R0, Newton on the full equation from that quadratic root (the quartic term is a correction
 * of at most ~0.03 °C at -200 °C, so a few steps reach machine precision).
 * NaN when the resistance has no temperature (quadratic discriminant negative: above the curve's peak).
 */
export function cvdCelsiusAt(r0: number, k: CvdCoefficients, ohms: number): number {
  const x = ohms / r0 - 1;
  const disc = k.A * k.A + 4 * k.B * x;
  if (!(disc >= 0)) return NaN;
  const tq = (2 * x) / (k.A + Math.sqrt(disc));
  if (x >= 0) return tq;
  let t = tq;
  for (let i = 0; i < 30; i++) {
    const f = cvdResistance(r0, k, t) - ohms;
    const step = f / cvdSlope(r0, k, t);
    t -= step;
    if (Math.abs(step) < 1e-13 * Math.max(1, Math.abs(t))) break;
  }
  return t;
}
