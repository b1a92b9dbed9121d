// ITS-90 thermocouple reference functions and inverses (server/src/sensors/thermocouple/its90.ts),
// checked against NIST Monograph 175 (1993): its tables (EMF in mV at t90 in °C, reference junction
// at 0 °C, tabulated to 1 µV) and the error bands it states for its inverse polynomials.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  TC_TYPES,
  emf,
  emfMv,
  emfRange,
  inverseBandC,
  inverseBands,
  inverseKelvinAtEmf,
  its90Data,
  kelvinAtEmf,
  referenceRange,
  seebeck,
  type TcType,
  type TypeData,
} from '../../../../server/src/sensors/thermocouple/its90';

const K0 = 273.15;

/**
 * Table values, [°C, mV], of the Monograph's table for each type:
 *  - `found`: read from a reproduction of the NIST ITS-90 table found while writing this (type T's
 *    table as NIST distributes it, type_t.tab; type K's table as a supplier's site reproduces it);
 *  - `ends`: the EMFs of the ranges' ends in the Monograph's table of inverse functions (found in
 *    NIST's coefficient file); given to 1 µV, some cut rather than rounded, so they agree within 1 µV;
 *  - `fromMemory`: recalled values of the Monograph's tables, not read from a document here.
 * Every table reads 0.000 mV at 0 °C (the reference junction's temperature).
 */
const TABLE: Record<TcType, { found: [number, number][]; ends: [number, number][]; fromMemory: [number, number][] }> = {
  B: {
    found: [[0, 0]],
    ends: [[250, 0.291], [700, 2.431], [1820, 13.82]],
    fromMemory: [[100, 0.033], [200, 0.178], [300, 0.431], [400, 0.787], [500, 1.242], [600, 1.792], [800, 3.154], [1000, 4.834], [1200, 6.786], [1400, 8.956], [1600, 11.263], [1800, 13.591]],
  },
  E: {
    found: [[0, 0]],
    ends: [[-200, -8.825], [1000, 76.373]],
    fromMemory: [[-270, -9.835], [-100, -5.237], [100, 6.319], [200, 13.421], [300, 21.036], [400, 28.946], [500, 37.005], [600, 45.093], [800, 61.017]],
  },
  J: {
    found: [[0, 0]],
    ends: [[-210, -8.095], [760, 42.919], [1200, 69.553]],
    fromMemory: [[-100, -4.633], [100, 5.269], [200, 10.779], [300, 16.327], [400, 21.848], [500, 27.393], [600, 33.102], [700, 39.132], [1000, 57.953]],
  },
  K: {
    found: [[-270, -6.458], [-200, -5.891], [-150, -4.913], [0, 0]],
    ends: [[500, 20.644], [1372, 54.886]],
    fromMemory: [[-100, -3.554], [100, 4.096], [200, 8.138], [300, 12.209], [400, 16.397], [600, 24.905], [800, 33.275], [1000, 41.276], [1200, 48.838]],
  },
  N: {
    found: [[0, 0]],
    ends: [[-200, -3.99], [600, 20.613], [1300, 47.513]],
    fromMemory: [[-270, -4.345], [-100, -2.407], [100, 2.774], [200, 5.913], [300, 9.341], [400, 12.974], [500, 16.748], [800, 28.455], [1000, 36.256]],
  },
  R: {
    found: [[0, 0]],
    ends: [[-50, -0.226], [250, 1.923], [1200, 13.228], [1664.5, 19.739], [1768.1, 21.103]],
    fromMemory: [[100, 0.647], [200, 1.469], [300, 2.401], [400, 3.408], [500, 4.471], [600, 5.583], [800, 7.95], [1000, 10.506], [1600, 18.849]],
  },
  S: {
    found: [[0, 0]],
    ends: [[-50, -0.235], [250, 1.874], [1200, 11.95], [1664.5, 17.536], [1768.1, 18.693]],
    fromMemory: [[-50, -0.236], [100, 0.646], [200, 1.441], [300, 2.323], [400, 3.259], [500, 4.233], [600, 5.239], [800, 7.345], [1000, 9.587], [1200, 11.951], [1400, 14.373], [1600, 16.777]],
  },
  T: {
    found: [[-270, -6.258], [-200, -5.603], [-100, -3.379], [-50, -1.819], [0, 0]],
    ends: [[400, 20.872]],
    fromMemory: [[100, 4.279], [200, 9.288], [300, 14.862]],
  },
};

/** Tables round to 1 µV: a value agrees when within half of it (plus float noise). */
const HALF_DIGIT_MV = 0.0005 + 1e-9;

function tableMisses(d: TypeData, points: readonly [number, number][], within = HALF_DIGIT_MV): string[] {
  return points.filter(([c, mv]) => !(Math.abs(emfMv(d, c) - mv) <= within)).map(([c, mv]) => `${c} °C: ${emfMv(d, c).toFixed(5)} mV, table ${mv}`);
}

/** Half a unit of the last decimal a band's end is stated to (the Monograph rounds its error bands). */
function halfLastDigit(x: number): number {
  const decimals = (String(Math.abs(x)).split('.')[1] ?? '').length;
  return 0.5 * 10 ** -decimals;
}

/**
 * Inverse polynomial minus the reference function's temperature, over each band's temperature
 * range on a grid: outside the stated band (widened by half its last digit) is a miss.
 */
function bandMisses(d: TypeData, steps = 2000): string[] {
  const misses: string[] = [];
  for (const b of d.inverse) {
    const lo = b.errLowC - halfLastDigit(b.errLowC) - 1e-9;
    const hi = b.errHighC + halfLastDigit(b.errHighC) + 1e-9;
    for (let i = 0; i <= steps; i++) {
      const t = b.lowC + ((b.highC - b.lowC) * i) / steps;
      const err = inverseBandC(b, emfMv(d, t)) - t;
      if (!(err >= lo && err <= hi)) {
        misses.push(`${b.lowC}..${b.highC} °C at ${t.toFixed(2)} °C: ${err.toFixed(5)} outside ${b.errLowC}..${b.errHighC}`);
        break;
      }
    }
  }
  return misses;
}

describe('ITS-90 reference functions (NIST Monograph 175)', () => {
  for (const t of TC_TYPES) {
    it(`type ${t}: the Monograph's table values (found)`, () => {
      expect(tableMisses(its90Data(t), TABLE[t].found)).toEqual([]);
    });
    it(`type ${t}: the EMFs of the inverse ranges' ends (found), within 1 µV`, () => {
      expect(tableMisses(its90Data(t), TABLE[t].ends, 0.001 + 1e-9)).toEqual([]);
    });
    it(`type ${t}: the Monograph's table values (from memory)`, () => {
      expect(tableMisses(its90Data(t), TABLE[t].fromMemory)).toEqual([]);
    });
  }

  it('is 0 at 0 °C for every type (reference junction at 0 °C; type K to its exponential term)', () => {
    // NIST Monograph 175: every table reads 0.000 mV at 0 °C.
    for (const t of TC_TYPES) expect(Math.abs(emf(t, K0))).toBeLessThan(0.5e-6);
  });

  it('returns volts, and NaN outside the reference range', () => {
    // Monograph 175 ranges: B 0..1820, E -270..1000, J -210..1200, K -270..1372, N -270..1300,
    // R and S -50..1768.1, T -270..400 °C.
    const ranges: Record<TcType, [number, number]> = { B: [0, 1820], E: [-270, 1000], J: [-210, 1200], K: [-270, 1372], N: [-270, 1300], R: [-50, 1768.1], S: [-50, 1768.1], T: [-270, 400] };
    for (const t of TC_TYPES) {
      const r = referenceRange(t);
      expect(r.lowK).toBeCloseTo(ranges[t][0] + K0, 9);
      expect(r.highK).toBeCloseTo(ranges[t][1] + K0, 9);
      expect(emf(t, r.lowK - 0.01)).toBeNaN();
      expect(emf(t, r.highK + 0.01)).toBeNaN();
      expect(seebeck(t, r.highK + 0.01)).toBeNaN();
      expect(Number.isFinite(emf(t, r.lowK))).toBe(true);
      expect(Number.isFinite(emf(t, r.highK))).toBe(true);
      expect(emf(t, NaN)).toBeNaN();
      expect(emf(t, Infinity)).toBeNaN();
    }
    expect(emf('K', 100 + K0)).toBeCloseTo(4.096e-3, 6); // type K table, 100 °C, from memory
  });

  it('has the Seebeck coefficient of its derivative (central difference)', () => {
    // Reference: numerical differentiation of the reference function, h = 1e-3 K.
    for (const t of TC_TYPES) {
      const { lowK, highK } = referenceRange(t);
      for (let i = 1; i < 40; i++) {
        const k = lowK + ((highK - lowK) * i) / 40;
        const num = (emf(t, k + 1e-3) - emf(t, k - 1e-3)) / 2e-3;
        expect(Math.abs(seebeck(t, k) - num)).toBeLessThan(1e-10);
      }
    }
    // Type K near 25 °C: about 40.6 µV/K (slope of the type K table, 24..26 °C: (1.041 - 0.960) mV / 2 K, from memory).
    expect(seebeck('K', 25 + K0) * 1e6).toBeCloseTo(40.6, 0);
  });
});

describe('NIST inverse polynomials against their published error bands', () => {
  for (const t of TC_TYPES) {
    it(`type ${t}: inverse minus reference function stays in each stated band`, () => {
      expect(bandMisses(its90Data(t))).toEqual([]);
    });
  }

  it('bands as published: kelvin ranges, error in K, EMFs in volts', () => {
    const k = inverseBands('K');
    expect(k.map((b) => [b.lowK - K0, b.highK - K0])).toEqual([[-200, 0], [0, 500], [500, 1372]].map(([a, b]) => [expect.closeTo(a!, 9), expect.closeTo(b!, 9)]));
    expect(k[2]).toMatchObject({ errorLowK: -0.05, errorHighK: 0.06 }); // Monograph 175, type K inverse, 500..1372 °C
    expect(k[1]!.highV).toBeCloseTo(20.644e-3, 9);
    expect(Math.abs(inverseKelvinAtEmf('K', 20.644e-3) - K0 - 500)).toBeLessThan(0.06);
    expect(inverseKelvinAtEmf('K', 60e-3)).toBeNaN();
    expect(inverseKelvinAtEmf('B', 0.1e-3)).toBeNaN(); // type B's inverse starts at 0.291 mV
  });
});

describe('a wrong coefficient fails these checks', () => {
  // Alter one coefficient at a time by as much as moves its function by 2 µV somewhere in its range
  // (twice the tables' last digit), or an inverse by its band's width, and require that the checks
  // above notice. A slip that moves nothing by that much changes no table value and no band.
  function alter(d: TypeData, where: 'c' | 'd', seg: number, i: number, factor: number): TypeData {
    const copy = structuredClone(d) as TypeData & { segments: { c: number[] }[]; inverse: { d: number[] }[] };
    if (where === 'c') copy.segments[seg]!.c[i]! *= factor;
    else copy.inverse[seg]!.d[i]! *= factor;
    return copy;
  }
  /** Largest |c x^i| over lo..hi. */
  const termMax = (c: number, i: number, lo: number, hi: number) => Math.max(Math.abs(c * lo ** i), Math.abs(c * hi ** i));
  for (const t of TC_TYPES) {
    it(`type ${t}: every coefficient matters`, () => {
      const d = its90Data(t);
      const points = [...TABLE[t].found, ...TABLE[t].fromMemory];
      const unseen: string[] = [];
      let lo = d.lowC;
      d.segments.forEach((s, si) => {
        s.c.forEach((c, i) => {
          if (c === 0) return;
          for (const sign of [1, -1]) {
            const x = alter(d, 'c', si, i, 1 + (sign * 0.002) / termMax(c, i, lo, s.highC));
            if (tableMisses(x, points).length === 0 && tableMisses(x, TABLE[t].ends, 0.001 + 1e-9).length === 0 && bandMisses(x, 400).length === 0) unseen.push(`c${i} of segment ${si} (${sign > 0 ? '+' : '-'})`);
          }
        });
        lo = s.highC;
      });
      d.inverse.forEach((b, bi) =>
        b.d.forEach((c, i) => {
          if (c === 0) return;
          for (const sign of [1, -1]) {
            const x = alter(d, 'd', bi, i, 1 + (sign * (b.errHighC - b.errLowC)) / termMax(c, i, b.lowMv, b.highMv));
            if (bandMisses(x, 400).length === 0) unseen.push(`d${i} of band ${bi} (${sign > 0 ? '+' : '-'})`);
          }
        }),
      );
      expect(unseen).toEqual([]);
    });
  }
});

describe('kelvinAtEmf: the exact inverse', () => {
  for (const t of TC_TYPES) {
    it(`type ${t}: round trip on a dense grid, monotone, never NaN in range`, () => {
      const { lowV, highV } = emfRange(t);
      const { lowK, highK } = referenceRange(t);
      const n = 20000;
      let prev = -Infinity;
      for (let i = 0; i <= n; i++) {
        const v = lowV + ((highV - lowV) * i) / n;
        const k = kelvinAtEmf(t, v);
        expect(Number.isNaN(k)).toBe(false);
        expect(k).toBeGreaterThanOrEqual(prev);
        expect(k).toBeGreaterThanOrEqual(lowK - 1e-9);
        expect(k).toBeLessThanOrEqual(highK + 1e-9);
        prev = k;
        // Back through the reference function: the EMF again (to float precision).
        // (1e-13 V: the rounding of the longest polynomials near -270 °C; 0.1 pV is no temperature.)
        expect(Math.abs(emf(t, k) - v)).toBeLessThanOrEqual(1e-13);
      }
    });
    it(`type ${t}: temperature → EMF → temperature to 1e-9 K where the function rises`, () => {
      const { highK } = referenceRange(t);
      const footK = kelvinAtEmf(t, emfRange(t).lowV);
      fc.assert(
        fc.property(fc.double({ min: footK, max: highK, noNaN: true }), (k) => {
          const back = kelvinAtEmf(t, emf(t, k));
          const s = seebeck(t, k);
          if (Number.isNaN(back)) return false;
          // Where the slope is tiny (near -270 °C, type B's minimum) the EMF's rounding (1e-13 V)
          // cannot tell temperatures apart: compare EMFs there.
          return Math.abs(back - k) <= 1e-9 || (Math.abs(emf(t, back) - emf(t, k)) <= 1e-13 && Math.abs(back - k) <= 1e-13 / Math.max(Math.abs(s), 1e-12));
        }),
        { seed: 90, numRuns: 3000 },
      );
    });
  }

  it('agrees with the published inverse within its error band', () => {
    // Monograph 175 type K inverse, 0..500 °C: -0.05..0.04 °C.
    for (const mv of [1, 5, 10, 15, 20]) {
      const diff = inverseKelvinAtEmf('K', mv * 1e-3) - kelvinAtEmf('K', mv * 1e-3);
      expect(diff).toBeGreaterThanOrEqual(-0.05);
      expect(diff).toBeLessThanOrEqual(0.04);
    }
  });

  it('NaN outside the EMFs of the range, and for non-numbers', () => {
    for (const t of TC_TYPES) {
      const { lowV, highV } = emfRange(t);
      expect(kelvinAtEmf(t, lowV - 1e-6)).toBeNaN();
      expect(kelvinAtEmf(t, highV + 1e-6)).toBeNaN();
      expect(kelvinAtEmf(t, NaN)).toBeNaN();
      expect(kelvinAtEmf(t, -Infinity)).toBeNaN();
    }
  });

  it("type B: the rising branch above the function's minimum near 21 °C", () => {
    // Monograph 175 type B table: the EMF dips below zero between 0 °C and about 42 °C (minimum
    // about -0.003 mV, from memory), so an EMF there has two temperatures; the inverse answers
    // the upper one and reaches down to the minimum.
    const { lowV } = emfRange('B');
    expect(lowV * 1e3).toBeGreaterThan(-0.003);
    expect(lowV * 1e3).toBeLessThan(-0.002);
    const foot = kelvinAtEmf('B', lowV) - K0;
    expect(foot).toBeGreaterThan(15);
    expect(foot).toBeLessThan(25);
    expect(Math.abs(seebeck('B', foot + K0))).toBeLessThan(1e-9);
    expect(kelvinAtEmf('B', 0) - K0).toBeGreaterThan(40);
  });
});
