import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { IEC60751, classToleranceC, cvdCelsiusAt, cvdResistance, cvdSlope } from '../../../server/src/physics/callendar-van-dusen';

const pt100 = (t: number) => cvdResistance(100, IEC60751, t);

describe('Callendar-Van Dusen, IEC 60751 coefficients', () => {
  it('gives the standard table values of a Pt100', () => {
    // Source: IEC 60751:2008 table of Pt100 resistance vs temperature / the CVD equation with its
    // coefficients (A = 3.9083e-3, B = -5.775e-7, C = -4.183e-12), evaluated by hand to 7 digits.
    expect(pt100(0)).toBe(100); // R0 by definition (IEC 60751:2008, 4.2)
    expect(pt100(100)).toBeCloseTo(138.5055, 4); // IEC 60751:2008 table / CVD equation
    expect(pt100(-100)).toBeCloseTo(60.2558, 4); // IEC 60751:2008 table / CVD equation
    // Table values recalled to 2 decimals (from memory): 200 °C 175.86, -200 °C 18.52, 850 °C 390.48.
    expect(pt100(200)).toBeCloseTo(175.86, 2); // from memory; equation gives 175.856
    expect(pt100(-200)).toBeCloseTo(18.52, 2); // from memory; equation gives 18.5201
    expect(pt100(850)).toBeCloseTo(390.48, 2); // from memory; equation gives 390.4811
    // The equation evaluated by hand (CVD equation, IEC coefficients): exact decimal arithmetic.
    expect(pt100(200)).toBeCloseTo(175.856, 9);
    expect(pt100(-200)).toBeCloseTo(18.520080, 6); // 1 - 0.78166 - 0.0231 - 4.183e-12*2.4e9
  });

  it('scales with R0 (a Pt1000 is ten Pt100s)', () => {
    // IEC 60751:2008 4.2: R(t) = R0 f(t); the same f for every R0.
    for (const t of [-200, -40, 0, 25, 100, 600]) expect(cvdResistance(1000, IEC60751, t)).toBeCloseTo(10 * pt100(t), 9);
  });

  it('has the slope of its derivative (central difference)', () => {
    // Reference: numerical differentiation of the equation above, h = 1e-3 °C (truncation ~1e-9).
    for (const t of [-199, -100, -1, 1, 100, 500]) {
      const num = (pt100(t + 1e-3) - pt100(t - 1e-3)) / 2e-3;
      expect(Math.abs(cvdSlope(100, IEC60751, t) - num)).toBeLessThan(1e-7);
    }
  });

  it('inverts exactly above and below 0 °C (round trip over -200..850 °C)', () => {
    // Reference: the forward equation (IEC 60751:2008 4.2); the inverse must return the temperature.
    fc.assert(
      fc.property(fc.double({ min: -200, max: 850, noNaN: true }), (t) => {
        const back = cvdCelsiusAt(100, IEC60751, pt100(t));
        return Math.abs(back - t) < 1e-9;
      }),
      { numRuns: 2000 },
    );
    expect(cvdCelsiusAt(100, IEC60751, 100)).toBe(0);
    expect(cvdCelsiusAt(100, IEC60751, 60.2558)).toBeCloseTo(-100, 3); // IEC table value, inverted
  });

  it('below 0 °C differs from the quadratic alone by the C term (so Newton matters)', () => {
    // CVD equation: at -200 °C the C term is R0 * C * (-300) * (-200)^3 = -1.00392 ohm for a Pt100.
    const quadOnly = cvdCelsiusAt(100, { ...IEC60751, C: 0 }, pt100(-200));
    expect(quadOnly - -200).toBeLessThan(-2); // the quadratic alone misreads by more than 2 °C
    expect(cvdCelsiusAt(100, IEC60751, pt100(-200))).toBeCloseTo(-200, 9);
  });

  it('gives the IEC 60751 class tolerances', () => {
    // IEC 60751:2008 table 3 (from memory): B ±(0.3 + 0.005|t|), A ±(0.15 + 0.002|t|),
    // AA ±(0.1 + 0.0017|t|), C ±(0.6 + 0.01|t|).
    expect(classToleranceC('B', 100)).toBeCloseTo(0.8, 12);
    expect(classToleranceC('A', -100)).toBeCloseTo(0.35, 12);
    expect(classToleranceC('AA', 0)).toBeCloseTo(0.1, 12);
    expect(classToleranceC('C', 200)).toBeCloseTo(2.6, 12);
  });
});
