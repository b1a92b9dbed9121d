import { describe, expect, it } from 'vitest';
import { ZERO_CELSIUS_K, thermalVoltage } from '../../../server/src/physics/constants';
import {
  forwardBeta,
  junctionAtTemperature,
  operatingPoint,
  saturationCurrent,
} from '../../../server/src/sensors/junction/physics';
import type { Bias, JunctionParams } from '../../../server/src/physics/types';
import { INVENTED_DIODE, INVENTED_NPN } from './fixtures';

const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
const ROOM = ZERO_CELSIUS_K + 25;

describe('saturation current IS(T)', () => {
  it('equals IS at TNOM', () => {
    // SPICE temperature laws (Massobrio & Antognetti, Semiconductor Device Modeling with SPICE, 2nd
    // ed. 1993; from memory): both factors are 1 at T = TNOM.
    expect(saturationCurrent(INVENTED_NPN, INVENTED_NPN.TNOM)).toBe(INVENTED_NPN.IS);
    expect(saturationCurrent(INVENTED_DIODE, INVENTED_DIODE.TNOM)).toBe(INVENTED_DIODE.IS);
  });

  it('follows the SPICE BJT and diode laws', () => {
    // SPICE BJT law (same text): IS(T) = IS exp((T/TNOM-1) EG/Vt) (T/TNOM)^XTI;
    // evaluated at 50 digits with mpmath 1.3.0 for T = 350 K, TNOM = 300.15 K, EG = 1.11, XTI = 3.
    expect(rel(saturationCurrent(INVENTED_NPN, 350) / INVENTED_NPN.IS, 715.73608742919079522)).toBeLessThan(1e-13);
    // SPICE diode law (same text): exponent and XTI divided by N; N = 1.8, same T.
    expect(rel(saturationCurrent(INVENTED_DIODE, 350) / INVENTED_DIODE.IS, 38.545514026642594645)).toBeLessThan(1e-13);
  });

  it('roughly doubles every ~5 K near room temperature (EG = 1.11 eV, XTI = 3)', () => {
    // Common practice, no source: "IS doubles about every 5 K". The SPICE law gives
    // ln 2 / ((EG/Vt + XTI)/T) = 4.5 K at 25 degC, so the band checked is 4..6 K.
    const p: JunctionParams = { ...INVENTED_NPN, XTB: 0 };
    const T = ROOM;
    const growthPerK = Math.log(saturationCurrent(p, T + 0.5) / saturationCurrent(p, T - 0.5));
    const doubling = Math.LN2 / growthPerK;
    expect(doubling).toBeGreaterThan(4);
    expect(doubling).toBeLessThan(6);
    // Closed-form derivative of the SPICE law (see sensors/junction/physics.ts): (EG/Vt + XTI)/T.
    expect(rel(growthPerK, (1.11 / thermalVoltage(T) + 3) / T)).toBeLessThan(1e-5);
  });

  it('scales BF as (T/TNOM)^XTB', () => {
    // SPICE BJT XTB law (same text): BF(T) = BF exp(XTB ln(T/TNOM)).
    expect(rel(forwardBeta(INVENTED_NPN, 400), 100 * Math.pow(400 / 300.15, 1.5))).toBeLessThan(1e-15);
    expect(forwardBeta(INVENTED_NPN, INVENTED_NPN.TNOM)).toBe(100);
  });
});

describe('constant-current bias', () => {
  it('has a slope between -1.5 and -2.5 mV/K at 10..100 uA near 25 degC', () => {
    // Common practice, no source: a silicon junction at constant current moves about -2 mV/K.
    for (const p of [INVENTED_NPN, { ...INVENTED_NPN, kind: 'diode' as const }]) {
      for (const amps of [10e-6, 30e-6, 100e-6]) {
        const op = operatingPoint(p, { kind: 'current', amps }, ROOM);
        expect(op.slope).toBeLessThan(-1.5e-3);
        expect(op.slope).toBeGreaterThan(-2.5e-3);
        expect(op.volts).toBeGreaterThan(0.45);
        expect(op.volts).toBeLessThan(0.75);
      }
    }
  });

  it('follows V = N Vt ln(I/Isx + 1) + I RS', () => {
    // Shockley diode law as used by the SPICE diode model (same text), inverted; RS in series.
    const p: JunctionParams = { ...INVENTED_DIODE, RS: 20 };
    const T = 320;
    const op = operatingPoint(p, { kind: 'current', amps: 1e-4 }, T);
    const is = saturationCurrent(p, T);
    const v = 1.8 * thermalVoltage(T) * Math.log(1e-4 / is + 1) + 1e-4 * 20;
    expect(rel(op.volts, v)).toBeLessThan(1e-14);
    // Small-signal resistance: derivative of the same law, N Vt/(I + IS) + RS.
    expect(rel(op.dynamicOhms, (1.8 * thermalVoltage(T)) / (1e-4 + is) + 20)).toBeLessThan(1e-14);
  });

  it('gives about 1.86 ADC counts per kelvin on a 10-bit, 1.1 V converter', () => {
    // Common practice, no source: LSB = Vref / 2^bits = 1.1/1024 = 1.074 mV; 2 mV/K / LSB = 1.86.
    const lsb = 1.1 / 1024;
    expect(lsb).toBeCloseTo(1.074e-3, 6);
    expect(2e-3 / lsb).toBeCloseTo(1.86, 2);
    const op = operatingPoint(INVENTED_NPN, { kind: 'current', amps: 100e-6 }, ROOM);
    const countsPerK = Math.abs(op.slope) / lsb;
    expect(countsPerK).toBeGreaterThan(1);
    expect(countsPerK).toBeGreaterThan(1.4);
    expect(countsPerK).toBeLessThan(2.4);
  });
});

describe('exact slope', () => {
  // Reference: central finite difference with h = 1e-3 K (truncation error h^2/6 V''', far below 1e-6).
  // For the resistor bias it is taken on the current, dV/dT = -R dI/dT (V = Vs - I R, Kirchhoff's
  // voltage law): below the knee V barely moves (1e-10 V/K) and differencing V itself would be
  // limited by rounding, while I keeps full relative precision.
  const central = (p: JunctionParams, bias: Bias, T: number): number => {
    const h = 1e-3;
    const hi = operatingPoint(p, bias, T + h);
    const lo = operatingPoint(p, bias, T - h);
    if (bias.kind === 'resistor') return (-bias.ohms * (hi.amps - lo.amps)) / (2 * h);
    return (hi.volts - lo.volts) / (2 * h);
  };
  const biases: Bias[] = [
    { kind: 'current', amps: 1e-6 },
    { kind: 'current', amps: 50e-6 },
    { kind: 'current', amps: 2e-3 },
    { kind: 'resistor', supply: 3.3, ohms: 33e3 },
    { kind: 'resistor', supply: 0.5, ohms: 1e3 },
    { kind: 'resistor', supply: 24, ohms: 4.7e6 },
    { kind: 'resistor', supply: 0.3, ohms: 1e5 },
  ];
  const parts: JunctionParams[] = [
    INVENTED_NPN,
    { ...INVENTED_NPN, kind: 'pnp', RS: 15, BF: 40, XTB: 2 },
    INVENTED_DIODE,
    { ...INVENTED_DIODE, RS: 100 },
  ];
  it('matches a central difference to 1e-6 relative for both biases', () => {
    for (const p of parts) {
      for (const bias of biases) {
        for (const c of [-55, 0, 25, 85, 150]) {
          const T = ZERO_CELSIUS_K + c;
          const exact = operatingPoint(p, bias, T).slope;
          expect(rel(exact, central(p, bias, T))).toBeLessThan(1e-6);
        }
      }
    }
  });
});

describe('last-guard domain errors', () => {
  it('throws RangeError with a clear message instead of returning NaN', () => {
    const bias: Bias = { kind: 'current', amps: 1e-5 };
    expect(() => operatingPoint(INVENTED_NPN, bias, 0)).toThrow(/temperature must be a finite number > 0 K/);
    expect(() => operatingPoint(INVENTED_NPN, bias, Number.NaN)).toThrow(RangeError);
    expect(() => operatingPoint({ ...INVENTED_NPN, IS: 0 }, bias, 300)).toThrow(/IS must be/);
    expect(() => operatingPoint({ ...INVENTED_NPN, N: -1 }, bias, 300)).toThrow(/N must be/);
    expect(() => operatingPoint({ ...INVENTED_NPN, BF: Infinity }, bias, 300)).toThrow(/BF must be/);
    expect(() => operatingPoint({ ...INVENTED_NPN, RS: -1 }, bias, 300)).toThrow(/RS must be/);
    expect(() => operatingPoint(INVENTED_NPN, { kind: 'current', amps: -1 }, 300)).toThrow(/bias current/);
    expect(() => operatingPoint(INVENTED_NPN, { kind: 'resistor', supply: 3.3, ohms: 0 }, 300)).toThrow(/resistor/);
    expect(() => operatingPoint(INVENTED_NPN, { kind: 'resistor', supply: -1, ohms: 1e3 }, 300)).toThrow(/supply/);
    // Far from TNOM the saturation current underflows: reported, not returned as 0 or NaN.
    expect(() => junctionAtTemperature(INVENTED_NPN, 1)).toThrow(/too far from TNOM/);
  });
});
