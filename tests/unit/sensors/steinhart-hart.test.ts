import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  betaBetween,
  betaToSteinhartHart,
  fitSteinhartHart,
  shKelvinAt,
  shResistanceAt,
  shResistanceSlope,
} from '../../../server/src/physics/steinhart-hart';

const K = (c: number) => c + 273.15;
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('Steinhart-Hart', () => {
  // Widely published coefficients of a generic 10 kΩ NTC (from memory):
  // A = 1.129148e-3, B = 2.34125e-4, C = 8.76741e-8.
  const published = { A: 1.129148e-3, B: 2.34125e-4, C: 8.76741e-8 };

  it('the published 10k coefficients give about 10 kΩ at 25 °C', () => {
    // Steinhart & Hart, Deep-Sea Research 15 (1968): 1/T = A + B ln R + C ln^3 R; coefficients from memory.
    expect(rel(shResistanceAt(published, K(25)), 10000)).toBeLessThan(2e-3);
  });

  it('a fit through three points reproduces them exactly', () => {
    // Reference: the three points themselves (the 3x3 system has one solution; Steinhart & Hart 1968).
    // Invented points of a 10k part: 0 °C 32.65k, 25 °C 10k, 70 °C 1.752k (near a beta-3950 curve).
    const pts: [number, number][] = [[K(0), 32650], [K(25), 10000], [K(70), 1752]];
    const fit = fitSteinhartHart(pts);
    if (typeof fit === 'string') throw new Error(fit);
    for (const [t, r] of pts) {
      expect(rel(shKelvinAt(fit, r), t)).toBeLessThan(1e-13);
      expect(rel(shResistanceAt(fit, t), r)).toBeLessThan(1e-11);
    }
  });

  it('fits random monotonic point sets exactly (property)', () => {
    // Reference: each generated point; the fitted curve must pass through all three.
    fc.assert(
      fc.property(
        fc.double({ min: 2000, max: 5000, noNaN: true }),
        fc.double({ min: 100, max: 1e6, noNaN: true }),
        fc.double({ min: -40, max: 20, noNaN: true }),
        fc.double({ min: 10, max: 60, noNaN: true }),
        fc.double({ min: 10, max: 80, noNaN: true }),
        fc.double({ min: -0.02, max: 0.02, noNaN: true }),
        (beta, r25, t1, d2, d3, wobble) => {
          const b = betaToSteinhartHart(r25, beta, K(25));
          const ts = [K(t1), K(t1 + d2), K(t1 + d2 + d3)];
          const pts = ts.map((t, i) => [t, shResistanceAt(b, t) * (i === 1 ? 1 + wobble * 0.1 : 1)] as [number, number]);
          const fit = fitSteinhartHart(pts);
          if (typeof fit === 'string') return true; // a non-monotonic draw is refused with a message
          return pts.every(([t, r]) => rel(shKelvinAt(fit, r), t) < 1e-11);
        },
      ),
      { numRuns: 500 },
    );
  });

  it('inverse round-trips (R -> T -> R) for the published coefficients', () => {
    // Reference: the forward equation (Steinhart & Hart 1968); Cardano's root must give R back.
    fc.assert(
      fc.property(fc.double({ min: -55, max: 200, noNaN: true }), (c) => {
        const r = shResistanceAt(published, K(c));
        return rel(shKelvinAt(published, r), K(c)) < 1e-14;
      }),
      { numRuns: 2000 },
    );
  });

  it('the beta model agrees with its Steinhart-Hart form at its two reference temperatures', () => {
    // Beta definition (common practice, as printed on NTC datasheets): beta = ln(R1/R2)/(1/T1 - 1/T2);
    // R(T) = R25 exp(beta (1/T - 1/T25)). Its Steinhart-Hart form has A = 1/T25 - ln(R25)/beta,
    // B = 1/beta, C = 0 (algebra on the log of the beta model).
    const r25 = 10000;
    const beta = 3950;
    const sh = betaToSteinhartHart(r25, beta, K(25));
    const betaModel = (t: number) => r25 * Math.exp(beta * (1 / t - 1 / K(25)));
    expect(rel(shResistanceAt(sh, K(25)), r25)).toBeLessThan(1e-14);
    expect(rel(shResistanceAt(sh, K(85)), betaModel(K(85)))).toBeLessThan(1e-13);
    expect(rel(betaBetween(shResistanceAt(sh, K(25)), K(25), shResistanceAt(sh, K(85)), K(85)), beta)).toBeLessThan(1e-12);
    // A full Steinhart-Hart fit through 25 °C, 55 °C and 85 °C of the beta model passes through both
    // reference temperatures exactly (and C comes out ~0).
    const fit = fitSteinhartHart([[K(25), betaModel(K(25))], [K(55), betaModel(K(55))], [K(85), betaModel(K(85))]]);
    if (typeof fit === 'string') throw new Error(fit);
    expect(rel(shResistanceAt(fit, K(25)), r25)).toBeLessThan(1e-11);
    expect(rel(shResistanceAt(fit, K(85)), betaModel(K(85)))).toBeLessThan(1e-11);
    expect(Math.abs(fit.C)).toBeLessThan(1e-15);
  });

  it('slope equals the central difference of the resistance', () => {
    // Reference: numerical differentiation, h = 1e-3 K.
    for (const c of [-40, 0, 25, 100]) {
      const num = (shResistanceAt(published, K(c) + 1e-3) - shResistanceAt(published, K(c) - 1e-3)) / 2e-3;
      expect(rel(shResistanceSlope(published, K(c)), num)).toBeLessThan(1e-6);
    }
  });

  it('refuses points that do not fall with temperature', () => {
    // An NTC's resistance falls as temperature rises (definition of NTC, common practice, no source).
    expect(typeof fitSteinhartHart([[K(0), 1000], [K(25), 10000], [K(50), 500]])).toBe('string');
    expect(typeof fitSteinhartHart([[K(25), 1000], [K(25), 900], [K(50), 500]])).toBe('string');
  });
});
