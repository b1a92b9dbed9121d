import { describe, expect, it } from 'vitest';
import { ZERO_CELSIUS_K } from '../../../server/src/physics/constants';
import {
  operatingPoint,
  solveResistorBiasAmps,
  solveResistorBiasNewton,
} from '../../../server/src/sensors/junction/physics';
import type { JunctionParams } from '../../../server/src/physics/types';
import { INVENTED_DIODE, INVENTED_NPN } from './fixtures';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe('resistor bias, Lambert-W closed form', () => {
  it('matches high-precision roots of Vs = I Rt + nVt ln(I/Isx + 1)', () => {
    // Reference: the same equation (Banwell & Jayakumar, Electron. Lett. 36(4), 2000) solved by
    // bisection at 50 digits with mpmath 1.3.0 findroot; values rounded to 20 digits.
    const table: Array<[number, number, number, number, number]> = [
      // isx A, rt ohm, nVt V, supply V, current A
      [1.01e-14, 1e4, 0.025852, 3.3, 2.679512306787266e-4],
      [1.01e-14, 1e4, 0.025852, 0.05, 5.976897751434112e-14],
      [1.01e-14, 1e4, 0.025852, 1e-6, 3.906929949627625e-19],
      [1e-14, 1e7, 0.0365, 24, 2.329677601172566e-6],
      [1e-9, 100, 0.03, 0.3, 2.05660680998693e-5],
      [1e-14, 1e3, 0.025, 1000, 0.9991941153726903],
      [1e-30, 1e5, 0.02, 5, 3.821892538923545e-5],
      [2e-7, 1e7, 0.036, 0.02, 1.964806081916312e-9],
    ];
    for (const [isx, rt, nvt, vs, amps] of table) {
      expect(rel(solveResistorBiasAmps(isx, rt, nvt, vs), amps)).toBeLessThan(1e-14);
    }
  });

  it('equals the independent Newton solve to 1e-12 V over a design grid', () => {
    // Reference: solveResistorBiasNewton, damped Newton on the junction voltage (same equation,
    // different unknown and algorithm). Grid: 0.3..24 V, 100 ohm..10 Mohm, -55..150 degC, RS 0..100 ohm.
    const supplies = [0.3, 0.5, 1.2, 1.8, 3.3, 5, 12, 24];
    const resistors = [100, 1e3, 1e4, 1e5, 1e6, 1e7];
    const celsius = [-55, -20, 0, 25, 60, 85, 125, 150];
    const seriesOhms = [0, 1, 10, 100];
    let worstVolts = 0;
    let worstAmpsRel = 0;
    for (const base of [INVENTED_NPN, INVENTED_DIODE]) {
      for (const RS of seriesOhms) {
        const p: JunctionParams = { ...base, RS };
        for (const c of celsius) {
          const T = ZERO_CELSIUS_K + c;
          for (const supply of supplies) {
            for (const ohms of resistors) {
              const op = operatingPoint(p, { kind: 'resistor', supply, ohms }, T);
              const ref = solveResistorBiasNewton(p, supply, ohms, T);
              worstVolts = Math.max(worstVolts, Math.abs(op.volts - ref.volts));
              worstAmpsRel = Math.max(worstAmpsRel, rel(op.amps, ref.amps));
              // V = Vs - I R (Kirchhoff's voltage law around the bias loop).
              expect(Math.abs(op.volts - (supply - op.amps * ohms))).toBeLessThan(1e-12 * Math.max(1, supply));
            }
          }
        }
      }
    }
    expect(worstVolts).toBeLessThan(1e-12);
    expect(worstAmpsRel).toBeLessThan(1e-12);
  });

  it('stays correct and positive below the knee', () => {
    // Reference: solveResistorBiasNewton (independent solve of the same equation).
    for (const supply of [0.05, 0.01, 1e-4, 1e-9]) {
      for (const ohms of [100, 1e4, 1e7]) {
        for (const T of [218.15, 300, 423.15]) {
          const op = operatingPoint(INVENTED_DIODE, { kind: 'resistor', supply, ohms }, T);
          const ref = solveResistorBiasNewton(INVENTED_DIODE, supply, ohms, T);
          expect(op.amps).toBeGreaterThan(0);
          expect(rel(op.amps, ref.amps)).toBeLessThan(1e-12);
        }
      }
    }
    expect(solveResistorBiasAmps(1e-14, 1e3, 0.025, 0)).toBe(0);
  });

  it('never returns NaN for in-domain raw arguments', () => {
    // Kirchhoff's voltage law bounds the current: 0 <= I <= Vs/Rt, since the junction drop is >= 0.
    for (const isx of [1e-300, 1e-30, 1e-14, 1e-3]) {
      for (const rt of [1e-3, 1, 1e4, 1e9]) {
        for (const nvt of [1e-3, 0.025, 0.1]) {
          for (const vs of [1e-12, 0.05, 3.3, 1e3]) {
            const amps = solveResistorBiasAmps(isx, rt, nvt, vs);
            expect(Number.isFinite(amps) && amps >= 0 && amps <= vs / rt).toBe(true);
          }
        }
      }
    }
    expect(() => solveResistorBiasAmps(0, 1e3, 0.025, 1)).toThrow(RangeError);
    expect(() => solveResistorBiasAmps(1e-14, 1e3, 0.025, Number.NaN)).toThrow(RangeError);
  });
});
