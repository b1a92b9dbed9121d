import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { lambertW0, lambertW0OfExp } from '../../../server/src/physics/lambertw';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe('lambertW0', () => {
  it('W(1) is the omega constant', () => {
    // Omega constant 0.56714329040978387299... (OEIS A030178; Corless et al., Adv. Comput. Math. 5 (1996) 329-359).
    expect(rel(lambertW0(1), 0.5671432904097838)).toBeLessThan(1e-15);
  });

  it('W(e) = 1 and W(0) = 0', () => {
    // Definition W(x) e^W(x) = x (Corless et al. 1996, eq. 1.1): 1 * e^1 = e, 0 * e^0 = 0.
    expect(rel(lambertW0(Math.E), 1)).toBeLessThan(1e-15);
    expect(lambertW0(0)).toBe(0);
  });

  it('matches high-precision reference values', () => {
    // Reference: mpmath 1.3.0 lambertw at 40 significant digits (rounded to 17 here).
    const table: Array<[number, number]> = [
      [1e-7, 9.99999900000015e-8],
      [2e-6, 1.999996000012e-6],
      [0.1, 0.091276527160862264],
      [2, 0.85260550201372549],
      [10, 1.7455280027406994],
      [1e10, 20.028685413304951],
      [1e300, 684.24720862976085],
    ];
    for (const [x, w] of table) expect(rel(lambertW0(x), w)).toBeLessThan(1e-15);
  });

  it('satisfies W e^W = x for x in [1e-300, 1e300]', () => {
    // Definition (Corless et al. 1996, eq. 1.1). The check itself rounds: exp(W) carries a
    // relative error of about W * 2^-53, so the tolerance grows with W.
    fc.assert(
      fc.property(fc.double({ min: -300, max: 300, noNaN: true }), (e10) => {
        const x = Math.pow(10, e10);
        const w = lambertW0(x);
        const residual = Math.abs(w * Math.exp(w) - x) / x;
        return Number.isFinite(w) && w >= 0 && residual <= (4 + 2 * w) * Number.EPSILON;
      }),
      { numRuns: 5000 },
    );
  });

  it('rejects negative and NaN input with a RangeError', () => {
    expect(() => lambertW0(-0.1)).toThrow(RangeError);
    expect(() => lambertW0(Number.NaN)).toThrow(RangeError);
    expect(lambertW0(Infinity)).toBe(Infinity);
  });
});

describe('lambertW0OfExp', () => {
  it('agrees with the direct form where both fit', () => {
    // Identity W0(exp(L)) = W0(x) for x = exp(L) (Corless et al. 1996, eq. 1.1).
    fc.assert(
      fc.property(fc.double({ min: -700, max: 700, noNaN: true }), (L) => {
        const a = lambertW0OfExp(L);
        const b = lambertW0(Math.exp(L));
        return b === 0 ? a === 0 : rel(a, b) <= 4 * Number.EPSILON * Math.max(1, Math.abs(L) / (1 + b));
      }),
      { numRuns: 5000 },
    );
  });

  it('works far beyond the double range of exp(L)', () => {
    // Reference: mpmath 1.3.0 lambertw(exp(L)) at 40 digits.
    expect(rel(lambertW0OfExp(1000), 993.09916947238910)).toBeLessThan(1e-15);
    expect(rel(lambertW0OfExp(1e5), 99988.487189669764)).toBeLessThan(1e-15);
    expect(rel(lambertW0OfExp(1e6), 999986.18450325761)).toBeLessThan(1e-15);
    expect(rel(lambertW0OfExp(5), 3.6934413589606496)).toBeLessThan(1e-15);
    // Defining relation in log form, w + ln w = L (Corless et al. 1996, eq. 1.1, logarithm taken).
    for (const L of [2, 30, 1000, 1e5, 1e6]) {
      const w = lambertW0OfExp(L);
      expect(Math.abs(w + Math.log(w) - L) / L).toBeLessThan(4 * Number.EPSILON);
    }
  });

  it('is never NaN for finite input', () => {
    // W0 is real and >= 0 on x >= 0, i.e. for every real L (Corless et al. 1996, section 1).
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (L) => {
        const w = lambertW0OfExp(L);
        return w >= 0 && !Number.isNaN(w);
      }),
      { numRuns: 5000 },
    );
    expect(lambertW0OfExp(-Infinity)).toBe(0);
    expect(() => lambertW0OfExp(Number.NaN)).toThrow(RangeError);
  });
});
