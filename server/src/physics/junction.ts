// Junction physics of a forward-biased diode or diode-connected BJT (base tied to collector,
// VBC = 0) fed by a constant current or by a resistor from a supply. Pure functions, SI units.
//
// Simplifications, stated once: Early effect, high injection (IKF), base-emitter leakage
// (ISE/NE), breakdown and self-heating are ignored; RS is lumped and temperature-independent.
// For pnp devices all quantities are magnitudes (the caller mirrors signs).

import { thermalVoltage } from './constants';
import { lambertW0OfExp } from './lambertw';
import type { Bias, JunctionParams, OperatingPoint } from './types';

/** Per-temperature constants of one junction: compute once, reuse for every bias. */
export interface JunctionAtTemperature {
  /** Temperature, K. */
  kelvin: number;
  /** N * kT/q, V. */
  nVt: number;
  /** IS(T), A. */
  satAmps: number;
  /** BF(T); Infinity for a plain diode (no base current). */
  betaF: number;
  /** Terminal-current prefactor: IS(T) * (1 + 1/BF(T)) for a BJT, IS(T) for a diode, A. */
  isx: number;
  /** d ln(isx) / dT, 1/K. */
  dLnIsxDT: number;
  /** Series resistance RS, ohm. */
  seriesOhms: number;
}

function requireFinite(name: string, value: number, min: number, minIncluded: boolean, unit: string): void {
  const ok = Number.isFinite(value) && (minIncluded ? value >= min : value > min);
  if (!ok) {
    const rel = minIncluded ? '>=' : '>';
    throw new RangeError(`junction: ${name} must be a finite number ${rel} ${min}${unit} (got ${value})`);
  }
}

function checkParams(p: JunctionParams, kelvin: number): void {
  requireFinite('temperature', kelvin, 0, false, ' K');
  requireFinite('IS', p.IS, 0, false, ' A');
  requireFinite('N', p.N, 0, false, '');
  requireFinite('TNOM', p.TNOM, 0, false, ' K');
  requireFinite('EG', p.EG, 0, true, ' eV');
  requireFinite('RS', p.RS, 0, true, ' ohm');
  if (!Number.isFinite(p.XTI)) throw new RangeError(`junction: XTI must be a finite number (got ${p.XTI})`);
  if (p.kind !== 'diode') {
    requireFinite('BF', p.BF, 0, false, '');
    if (!Number.isFinite(p.XTB)) throw new RangeError(`junction: XTB must be a finite number (got ${p.XTB})`);
  }
}

/**
 * ln(IS(T)/IS).
 * BJT (SPICE Gummel-Poon, ngspice src/spicelib/devices/bjt/bjttemp.c, BJTtemp):
 *   IS(T) = IS * exp((T/TNOM - 1) * EG / Vt(T)) * (T/TNOM)^XTI
 * Diode (SPICE diode, ngspice src/spicelib/devices/dio/diotemp.c, DIOtempUpdate):
 *   IS(T) = IS * exp((T/TNOM - 1) * EG / (N Vt(T))) * (T/TNOM)^(XTI/N)
 * With m = 1 (BJT) or N (diode), and (T/TNOM - 1)/Vt(T) = (q/k)(1/TNOM - 1/T):
 *   d ln IS(T)/dT = (EG/Vt(T) + XTI) / (m T).
 */
function satLog(p: JunctionParams, kelvin: number): number {
  const ratio = kelvin / p.TNOM;
  const m = p.kind === 'diode' ? p.N : 1;
  return ((ratio - 1) * p.EG / thermalVoltage(kelvin) + p.XTI * Math.log(ratio)) / m;
}

/** d ln IS(T) / dT, 1/K (derivative of satLog, see above). */
function satLogSlope(p: JunctionParams, kelvin: number): number {
  const m = p.kind === 'diode' ? p.N : 1;
  return (p.EG / thermalVoltage(kelvin) + p.XTI) / (m * kelvin);
}

/** IS(T), A (SPICE temperature law, see satLog). */
export function saturationCurrent(p: JunctionParams, kelvin: number): number {
  checkParams(p, kelvin);
  const is = p.IS * Math.exp(satLog(p, kelvin));
  if (!(is > 0 && is < Infinity)) {
    throw new RangeError(
      `junction: IS(T) at ${kelvin} K leaves the double range (TNOM ${p.TNOM} K); temperature too far from TNOM`,
    );
  }
  return is;
}

/** BF(T) = BF * (T/TNOM)^XTB (ngspice bjttemp.c, TLEV = 0). Infinity for a plain diode. */
export function forwardBeta(p: JunctionParams, kelvin: number): number {
  checkParams(p, kelvin);
  return p.kind === 'diode' ? Infinity : p.BF * Math.pow(kelvin / p.TNOM, p.XTB);
}

/** Validates once and precomputes everything that depends only on temperature. */
export function junctionAtTemperature(p: JunctionParams, kelvin: number): JunctionAtTemperature {
  checkParams(p, kelvin);
  const satAmps = p.IS * Math.exp(satLog(p, kelvin));
  const dLnSatDT = satLogSlope(p, kelvin);
  const nVt = p.N * thermalVoltage(kelvin);
  if (!(satAmps > 0 && satAmps < Infinity)) {
    throw new RangeError(
      `junction: IS(T) at ${kelvin} K leaves the double range (TNOM ${p.TNOM} K); temperature too far from TNOM`,
    );
  }
  if (p.kind === 'diode') {
    return { kelvin, nVt, satAmps, betaF: Infinity, isx: satAmps, dLnIsxDT: dLnSatDT, seriesOhms: p.RS };
  }
  const betaF = p.BF * Math.pow(kelvin / p.TNOM, p.XTB);
  // Collector plus base current of the diode-connected BJT: IS(T)(e^(Vj/nVt) - 1)(1 + 1/BF(T)).
  // d ln(1 + 1/BF)/dT = -(1/BF)(XTB/T)/(1 + 1/BF) = -XTB / (T (BF + 1)).
  const isx = satAmps * (1 + 1 / betaF);
  const dLnIsxDT = dLnSatDT - p.XTB / (kelvin * (betaF + 1));
  if (!(betaF > 0 && betaF < Infinity && isx < Infinity)) {
    throw new RangeError(`junction: BF(T) at ${kelvin} K leaves the double range (XTB ${p.XTB})`);
  }
  return { kelvin, nVt, satAmps, betaF, isx, dLnIsxDT, seriesOhms: p.RS };
}

/** Terminal current at intrinsic junction voltage vj: isx * (exp(vj/nVt) - 1), A. */
export function terminalAmps(j: JunctionAtTemperature, junctionVolts: number): number {
  return j.isx * Math.expm1(junctionVolts / j.nVt);
}

/**
 * Current through R + RS + junction from a supply, A. Exact solution of
 *   supply = I*rt + nvt*ln(I/isx + 1)
 * (Banwell & Jayakumar, "Exact analytical solution for current flow through diode with series
 * resistance", Electronics Letters 36(4) (2000) 291-292):
 *   I = (nvt/rt) * W( (isx*rt/nvt) * exp((supply + isx*rt)/nvt) ) - isx,
 * with W taken in the log domain (its argument overflows above ~18 V).
 * Below the knee W is close to w0 = isx*rt/nvt and the subtraction cancels; there the
 * current is refined with Newton on the same equation written for d = I*rt/nvt,
 *   g(d) = d + ln(1 + d/w0) - supply/nvt = 0   (from (w0 + d) e^(w0+d) = w0 e^w0 e^s),
 * which is concave and increasing, so Newton started below the root (the tangent at 0,
 * d = s*w0/(1+w0)) never overshoots and the result is never negative.
 * Arguments: isx > 0 A, rt > 0 ohm, nvt > 0 V, supply >= 0 V (all finite).
 */
export function solveResistorBiasAmps(isx: number, rt: number, nvt: number, supply: number): number {
  if (!(isx > 0 && isx < Infinity && rt > 0 && rt < Infinity && nvt > 0 && nvt < Infinity)) {
    throw new RangeError(
      `solveResistorBiasAmps: need finite isx > 0 A, rt > 0 ohm, nvt > 0 V (got ${isx}, ${rt}, ${nvt})`,
    );
  }
  if (!(supply >= 0 && supply < Infinity)) {
    throw new RangeError(`solveResistorBiasAmps: supply must be a finite number >= 0 V (got ${supply})`);
  }
  if (supply === 0) return 0;
  const a = rt / nvt;
  const w0 = isx * a;
  const s = supply / nvt;
  if (!(a < Infinity && w0 < Infinity && s < Infinity)) {
    throw new RangeError('solveResistorBiasAmps: rt/nvt, isx*rt/nvt or supply/nvt overflows a double');
  }
  // ln(w0) without underflow when isx*rt/nvt is below the double range.
  const lnW0 = w0 > 0 ? Math.log(w0) : Math.log(isx) + Math.log(a);
  const y = lambertW0OfExp(lnW0 + w0 + s);
  let d = y - w0;
  if (d < w0 && w0 > 0) {
    // Sub-knee: more than one bit lost in y - w0. Polish on g(d) (see above).
    const dTangent = (s * w0) / (1 + w0);
    if (!(d > dTangent)) d = dTangent;
    for (let i = 0; i < 60; i++) {
      const step = (d + Math.log1p(d / w0) - s) / (1 + 1 / (w0 + d));
      d -= step;
      if (!(Math.abs(step) > 2.5e-16 * d)) break;
    }
  }
  return d / a;
}

/** Operating point from per-temperature constants (see operatingPoint). */
export function operatingPointAt(j: JunctionAtTemperature, bias: Bias): OperatingPoint {
  const { kelvin, nVt, isx, dLnIsxDT, seriesOhms } = j;
  let amps: number;
  if (bias.kind === 'current') {
    if (!(bias.amps >= 0 && bias.amps < Infinity)) {
      throw new RangeError(`junction: bias current must be a finite number >= 0 A (got ${bias.amps})`);
    }
    amps = bias.amps;
  } else {
    if (!(bias.ohms > 0 && bias.ohms < Infinity)) {
      throw new RangeError(`junction: bias resistor must be a finite number > 0 ohm (got ${bias.ohms})`);
    }
    if (!(bias.supply >= 0 && bias.supply < Infinity)) {
      throw new RangeError(`junction: supply must be a finite number >= 0 V (got ${bias.supply})`);
    }
    amps = solveResistorBiasAmps(isx, bias.ohms + seriesOhms, nVt, bias.supply);
  }
  const u = amps + isx;
  const junctionVolts = nVt * Math.log1p(amps / isx);
  // Equal to supply - amps*R for the resistor bias, without that subtraction's cancellation.
  const volts = junctionVolts + amps * seriesOhms;
  // Slope by implicit differentiation. With Vj = nVt(T) ln(I/isx(T) + 1), nVt proportional to T:
  //   dVj/dT at fixed I = Vj/T - nVt * I/(I + isx) * d ln isx/dT  (= -G_T below).
  const dVjdTAtFixedI = junctionVolts / kelvin - nVt * (amps / u) * dLnIsxDT;
  let slope: number;
  if (bias.kind === 'current') {
    slope = dVjdTAtFixedI; // V = Vj + I*RS, I and RS fixed.
  } else {
    // G(I,T) = Vs - I*Rt - Vj(I,T) = 0:  G_I = -(Rt + nVt/(I+isx)),  G_T = -dVj/dT|I.
    // dI/dT = -G_T/G_I = dVj/dT|I / -(Rt + nVt/u);  V = Vs - I*R  =>  dV/dT = -R dI/dT.
    const rt = bias.ohms + seriesOhms;
    slope = (bias.ohms * dVjdTAtFixedI) / (rt + nVt / u);
  }
  return { kelvin, amps, volts, junctionVolts, slope, dynamicOhms: nVt / u + seriesOhms };
}

/** Solved operating point of the junction `p` under `bias` at `kelvin`. */
export function operatingPoint(p: JunctionParams, bias: Bias, kelvin: number): OperatingPoint {
  return operatingPointAt(junctionAtTemperature(p, kelvin), bias);
}

/** Result of the reference Newton solve. */
export interface NewtonSolution {
  amps: number;
  volts: number;
  junctionVolts: number;
  iterations: number;
}

/**
 * Independent reference for tests: damped Newton on the junction voltage,
 *   F(v) = v + rt*isx*expm1(v/nVt) - supply = 0,
 * started from the upper bound v = nVt ln(1 + supply/(rt isx)) (current cannot exceed
 * supply/rt). F is convex and increasing, so from above Newton decreases monotonically;
 * a backtracking halving guards any step that would raise |F|. Stops when a step moves v by
 * less than 4e-16 relative (a couple of ulp) or |F| is at rounding level: 1e-15 relative.
 */
export function solveResistorBiasNewton(
  p: JunctionParams,
  supply: number,
  ohms: number,
  kelvin: number,
): NewtonSolution {
  const j = junctionAtTemperature(p, kelvin);
  if (!(supply >= 0 && supply < Infinity)) {
    throw new RangeError(`junction: supply must be a finite number >= 0 V (got ${supply})`);
  }
  if (!(ohms > 0 && ohms < Infinity)) {
    throw new RangeError(`junction: bias resistor must be a finite number > 0 ohm (got ${ohms})`);
  }
  const { nVt, isx } = j;
  const k = (ohms + p.RS) * isx;
  const f = (v: number): number => v + k * Math.expm1(v / nVt) - supply;
  // |F| below this is rounding noise of the three terms (each at most `supply` in size).
  const noise = 8 * Number.EPSILON * supply;
  let v = Math.min(supply, nVt * Math.log1p(supply / k));
  let fv = f(v);
  let iterations = 0;
  while (iterations < 500 && fv !== 0) {
    iterations++;
    const step = fv / (1 + (k / nVt) * Math.exp(v / nVt));
    let lambda = 1;
    let vNew = v - step;
    let fNew = f(vNew);
    while (Math.abs(fNew) > Math.abs(fv) && lambda > 1e-6) {
      lambda /= 2;
      vNew = v - lambda * step;
      fNew = f(vNew);
    }
    const moved = Math.abs(vNew - v);
    v = vNew;
    fv = fNew;
    if (!(moved > 4e-16 * Math.abs(v)) || Math.abs(fv) <= noise) break; // converged to a few ulp
  }
  const amps = isx * Math.expm1(v / nVt);
  return { amps, volts: v + amps * p.RS, junctionVolts: v, iterations };
}
