// Junction physics of a forward-biased diode or diode-connected BJT (base tied to collector,
// VBC = 0) fed by a constant current or by a resistor from a supply. Pure functions, SI units.
//
// Simplifications, stated once: Early effect, high injection (IKF), base-emitter leakage
// (ISE/NE), breakdown and self-heating are ignored; RS is lumped and temperature-independent.
// For pnp devices all quantities are magnitudes (the caller mirrors signs).

import { thermalVoltage } from '../../physics/constants';
import { lambertW0OfExp } from '../../physics/lambertw';
import type { Bias, JunctionParams, OperatingPoint } from '../../physics/types';

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

// Error messages are built by the functions below, never inside a check: on Node 20 a template
// literal in a hot function, even in a throw branch never taken, made the whole junction sweep
// about 2.5 times slower (measured on the generated 200-channel benchmark spec).

/** "junction: <name> must be a finite number[ >= min unit] (got value)". */
function finiteError(name: string, value: number, min?: number, minIncluded?: boolean, unit = ''): RangeError {
  const bound = min === undefined ? '' : ` ${minIncluded ? '>=' : '>'} ${min}${unit}`;
  return new RangeError(`junction: ${name} must be a finite number${bound} (got ${value})`);
}

function satAmpsError(p: JunctionParams, kelvin: number): RangeError {
  return new RangeError(
    `the saturation current IS cannot be computed at ${kelvin.toPrecision(4)} K: too far from TNOM (${p.TNOM.toPrecision(5)} K) for a double`,
  );
}

function betaFError(p: JunctionParams, kelvin: number): RangeError {
  return new RangeError(`the transistor's gain BF cannot be computed at ${kelvin.toPrecision(4)} K with XTB = ${p.XTB}: too far from TNOM for a double`);
}

function solverArgsError(isx: number, rt: number, nvt: number): RangeError {
  void isx, rt, nvt;
  return new RangeError('the resistor bias cannot be solved for these IS, N and bias values; check them against their stated ranges');
}

function solverOverflowError(): RangeError {
  return new RangeError('the resistor bias cannot be solved: the bias resistor or supply is too large for the junction\'s IS and N; check the bias');
}

function solverSupplyError(supply: number): RangeError {
  void supply;
  return new RangeError('the bias supply must be a voltage from 0 V to 1000 V');
}

function requireFinite(name: string, value: number, min: number, minIncluded: boolean, unit: string): void {
  const ok = Number.isFinite(value) && (minIncluded ? value >= min : value > min);
  if (!ok) throw finiteError(name, value, min, minIncluded, unit);
}

/** Throws unless the temperature is a finite number > 0 K (the first check of checkParams). */
function checkTemperature(kelvin: number): void {
  requireFinite('temperature', kelvin, 0, false, ' K');
}

/**
 * Checks the temperature, then the parameters. Only the first depends on the temperature: a sweep
 * checks the parameters with its first temperature and then only each further temperature.
 */
function checkParams(p: JunctionParams, kelvin: number): void {
  checkTemperature(kelvin);
  requireFinite('IS', p.IS, 0, false, ' A');
  requireFinite('N', p.N, 0, false, '');
  requireFinite('TNOM', p.TNOM, 0, false, ' K');
  requireFinite('EG', p.EG, 0, true, ' eV');
  requireFinite('RS', p.RS, 0, true, ' ohm');
  if (!Number.isFinite(p.XTI)) throw finiteError('XTI', p.XTI);
  if (p.kind !== 'diode') {
    requireFinite('BF', p.BF, 0, false, '');
    if (!Number.isFinite(p.XTB)) throw finiteError('XTB', p.XTB);
  }
}

/**
 * ln(IS(T)/IS).
 * Published SPICE temperature laws (G. Massobrio, P. Antognetti, Semiconductor Device Modeling
 * with SPICE, 2nd ed., McGraw-Hill 1993, the BJT's and the diode's temperature dependence; cited
 * from memory). BJT (Gummel-Poon):
 *   IS(T) = IS * exp((T/TNOM - 1) * EG / Vt(T)) * (T/TNOM)^XTI
 * Diode (SPICE diode model, the same text):
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

// The arithmetic below is split into small functions of numbers, one per step of the model.

/** IS(T) before its range check, A (SPICE temperature law, see satLog). */
function satAmpsAt(p: JunctionParams, kelvin: number): number {
  return p.IS * Math.exp(satLog(p, kelvin));
}

/** N * kT/q, V. */
function emissionVoltage(p: JunctionParams, kelvin: number): number {
  return p.N * thermalVoltage(kelvin);
}

/** Throws unless IS(T) is a positive finite double. */
function checkSatAmps(p: JunctionParams, kelvin: number, satAmps: number): void {
  if (!(satAmps > 0 && satAmps < Infinity)) throw satAmpsError(p, kelvin);
}

/**
 * BF(T) = BF * (T/TNOM)^XTB (the SPICE BJT's XTB law, same text as satLog), before its range check.
 * XTB = 0 (the SPICE default) skips the power: (T/TNOM)^0 is exactly 1 (ECMA-262 Math.pow), so
 * the result is BF either way.
 */
function betaFAt(p: JunctionParams, kelvin: number): number {
  return p.XTB === 0 ? p.BF : p.BF * Math.pow(kelvin / p.TNOM, p.XTB);
}

/** Collector plus base current prefactor of the diode-connected BJT: IS(T)(e^(Vj/nVt) - 1)(1 + 1/BF(T)). */
function bjtIsx(satAmps: number, betaF: number): number {
  return satAmps * (1 + 1 / betaF);
}

/** d ln isx/dT of the BJT: d ln(1 + 1/BF)/dT = -(1/BF)(XTB/T)/(1 + 1/BF) = -XTB / (T (BF + 1)). */
function bjtDLnIsxDT(p: JunctionParams, kelvin: number, dLnSatDT: number, betaF: number): number {
  return dLnSatDT - p.XTB / (kelvin * (betaF + 1));
}

/** Throws unless BF(T) and isx are finite (and BF(T) > 0). */
function checkBetaF(p: JunctionParams, kelvin: number, betaF: number, isx: number): void {
  if (!(betaF > 0 && betaF < Infinity && isx < Infinity)) throw betaFError(p, kelvin);
}

/** IS(T), A (SPICE temperature law, see satLog). */
export function saturationCurrent(p: JunctionParams, kelvin: number): number {
  checkParams(p, kelvin);
  const is = satAmpsAt(p, kelvin);
  checkSatAmps(p, kelvin, is);
  return is;
}

/** BF(T) = BF * (T/TNOM)^XTB (SPICE BJT XTB law, see satLog). Infinity for a plain diode. */
export function forwardBeta(p: JunctionParams, kelvin: number): number {
  checkParams(p, kelvin);
  return p.kind === 'diode' ? Infinity : betaFAt(p, kelvin);
}

/** Validates once and precomputes everything that depends only on temperature. */
export function junctionAtTemperature(p: JunctionParams, kelvin: number): JunctionAtTemperature {
  checkParams(p, kelvin);
  const satAmps = satAmpsAt(p, kelvin);
  const dLnSatDT = satLogSlope(p, kelvin);
  const nVt = emissionVoltage(p, kelvin);
  checkSatAmps(p, kelvin, satAmps);
  if (p.kind === 'diode') {
    return { kelvin, nVt, satAmps, betaF: Infinity, isx: satAmps, dLnIsxDT: dLnSatDT, seriesOhms: p.RS };
  }
  const betaF = betaFAt(p, kelvin);
  const isx = bjtIsx(satAmps, betaF);
  const dLnIsxDT = bjtDLnIsxDT(p, kelvin, dLnSatDT, betaF);
  checkBetaF(p, kelvin, betaF, isx);
  return { kelvin, nVt, satAmps, betaF, isx, dLnIsxDT, seriesOhms: p.RS };
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
  checkSolveArgs(isx, rt, nvt, supply);
  return solveChecked(isx, rt, nvt, supply);
}

/** Throws what solveResistorBiasAmps throws for these arguments, before any solving. */
function checkSolveArgs(isx: number, rt: number, nvt: number, supply: number): void {
  if (!(isx > 0 && isx < Infinity && rt > 0 && rt < Infinity && nvt > 0 && nvt < Infinity)) {
    throw solverArgsError(isx, rt, nvt);
  }
  if (!(supply >= 0 && supply < Infinity)) throw solverSupplyError(supply);
  if (supply === 0) return;
  if (!(rt / nvt < Infinity && isx * (rt / nvt) < Infinity && supply / nvt < Infinity)) throw solverOverflowError();
}

/** solveResistorBiasAmps after checkSolveArgs passed (see there). */
function solveChecked(isx: number, rt: number, nvt: number, supply: number): number {
  if (supply === 0) return 0;
  const a = rt / nvt;
  const w0 = isx * a;
  const s = supply / nvt;
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

/** Throws unless the bias is usable: current finite >= 0 A; resistor finite > 0 ohm from a supply finite >= 0 V. */
function checkBias(bias: Bias): void {
  if (bias.kind === 'current') {
    if (!(bias.amps >= 0 && bias.amps < Infinity)) throw finiteError('bias current', bias.amps, 0, true, ' A');
    return;
  }
  if (!(bias.ohms > 0 && bias.ohms < Infinity)) throw finiteError('bias resistor', bias.ohms, 0, false, ' ohm');
  if (!(bias.supply >= 0 && bias.supply < Infinity)) throw finiteError('supply', bias.supply, 0, true, ' V');
}

/** Terminal current under a checked bias, A: the set current, or the resistor solve (solveResistorBiasAmps). */
function biasAmps(bias: Bias, isx: number, nVt: number, seriesOhms: number): number {
  return bias.kind === 'current' ? bias.amps : solveResistorBiasAmps(isx, bias.ohms + seriesOhms, nVt, bias.supply);
}

/** Intrinsic junction voltage Vj = nVt ln(I/isx + 1), V (the terminal law inverted). */
function junctionVoltsAt(nVt: number, amps: number, isx: number): number {
  return nVt * Math.log1p(amps / isx);
}

/**
 * Voltage at the terminals, V: Vj + I*RS. Equal to supply - I*R for the resistor bias, without
 * that subtraction's cancellation.
 */
function terminalVolts(junctionVolts: number, amps: number, seriesOhms: number): number {
  return junctionVolts + amps * seriesOhms;
}

/**
 * dVj/dT at fixed current, V/K, by implicit differentiation. With Vj = nVt(T) ln(I/isx(T) + 1),
 * nVt proportional to T:  dVj/dT|I = Vj/T - nVt * I/(I + isx) * d ln isx/dT.  `u` is I + isx.
 */
function slopeAtFixedAmps(junctionVolts: number, kelvin: number, nVt: number, amps: number, u: number, dLnIsxDT: number): number {
  return junctionVolts / kelvin - nVt * (amps / u) * dLnIsxDT;
}

/**
 * dV/dT at the terminals, V/K. Current bias: V = Vj + I*RS with I and RS fixed, so dVj/dT|I.
 * Resistor bias: G(I,T) = Vs - I*Rt - Vj(I,T) = 0, G_I = -(Rt + nVt/(I+isx)), G_T = -dVj/dT|I;
 * dI/dT = -G_T/G_I = dVj/dT|I / -(Rt + nVt/u); V = Vs - I*R gives dV/dT = -R dI/dT.
 */
function terminalSlope(bias: Bias, seriesOhms: number, dVjdTAtFixedI: number, nVt: number, u: number): number {
  if (bias.kind === 'current') return dVjdTAtFixedI;
  const rt = bias.ohms + seriesOhms;
  return (bias.ohms * dVjdTAtFixedI) / (rt + nVt / u);
}

/** Small-signal resistance of the junction plus RS, ohm: dVj/dI = nVt/(I + isx), plus RS. */
function dynamicOhmsAt(nVt: number, u: number, seriesOhms: number): number {
  return nVt / u + seriesOhms;
}

/** Source impedance the ADC input sees, ohm: the dynamic resistance, in parallel with a bias resistor. */
export function sourceOhmsAt(bias: Bias, dynamicOhms: number): number {
  return bias.kind === 'resistor' ? (bias.ohms * dynamicOhms) / (bias.ohms + dynamicOhms) : dynamicOhms;
}

/** Operating point from per-temperature constants (see operatingPoint). */
export function operatingPointAt(j: JunctionAtTemperature, bias: Bias): OperatingPoint {
  const { kelvin, nVt, isx, dLnIsxDT, seriesOhms } = j;
  checkBias(bias);
  const amps = biasAmps(bias, isx, nVt, seriesOhms);
  const u = amps + isx;
  const junctionVolts = junctionVoltsAt(nVt, amps, isx);
  const volts = terminalVolts(junctionVolts, amps, seriesOhms);
  const slope = terminalSlope(bias, seriesOhms, slopeAtFixedAmps(junctionVolts, kelvin, nVt, amps, u, dLnIsxDT), nVt, u);
  return { kelvin, amps, volts, junctionVolts, slope, dynamicOhms: dynamicOhmsAt(nVt, u, seriesOhms) };
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
