// Sweeps a channel over its range: operating point, ADC code and resolution at each step.
import { ZERO_CELSIUS_K } from '../physics/constants';
import { operatingPoint } from '../physics/junction';
import type { Bias, OperatingPoint } from '../physics/types';
import type { ChannelDef } from '../model/types';
import type { ChannelResult, ChannelSummary, SweepPoint } from './types';
import { nonlinearity } from './nonlinearity';

export function nominalBias(c: ChannelDef): Bias {
  return c.bias.kind === 'current'
    ? { kind: 'current', amps: c.bias.amps.value }
    : { kind: 'resistor', ohms: c.bias.ohms.value, supply: c.bias.supply.value };
}

/** Temperatures of the sweep, K: from low to high by step, the high end always included. */
export function sweepKelvins(c: ChannelDef): number[] {
  const n = Math.max(1, Math.ceil((c.highK - c.lowK) / c.stepK - 1e-9));
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(c.lowK + i * c.stepK);
  out.push(c.highK);
  return out;
}

/** Ideal ADC code of a voltage: floor(V / Vref * 2^bits), clamped to the converter's codes. */
export function adcCode(volts: number, vref: number, bits: number): number {
  const full = 2 ** bits;
  const code = Math.floor((volts / vref) * full);
  return Math.min(full - 1, Math.max(0, code));
}

export function pointAt(c: ChannelDef, kelvin: number, bias: Bias = nominalBias(c)): SweepPoint {
  const op: OperatingPoint = operatingPoint(c.sensor.params, bias, kelvin);
  const vref = c.adc.reference.value;
  const perVolt = 2 ** c.adc.bits / vref;
  const countsPerKelvin = Math.abs(op.slope) * perVolt;
  // Power in the sensor: terminal voltage times current (junction plus RS).
  const selfHeatingK = op.volts * op.amps * c.thetaJA;
  const sourceOhms = bias.kind === 'resistor' ? parallel(bias.ohms, op.dynamicOhms) : op.dynamicOhms;
  return {
    celsius: kelvin - ZERO_CELSIUS_K,
    kelvin,
    volts: op.volts,
    amps: op.amps,
    code: adcCode(op.volts, vref, c.adc.bits),
    slope: op.slope,
    countsPerKelvin,
    celsiusPerCount: countsPerKelvin > 0 ? 1 / countsPerKelvin : Infinity,
    selfHeatingK,
    sourceOhms,
  };
}

function parallel(a: number, b: number): number {
  return (a * b) / (a + b);
}

export function analyseChannel(c: ChannelDef): ChannelResult {
  const bias = nominalBias(c);
  const sweep = sweepKelvins(c).map((k) => pointAt(c, k, bias));
  return { channel: c, sweep, summary: summarise(c, sweep) };
}

function summarise(c: ChannelDef, sweep: SweepPoint[]): ChannelSummary {
  let worst = sweep[0]!;
  const s: ChannelSummary = {
    points: sweep.length,
    voltsMin: Infinity,
    voltsMax: -Infinity,
    ampsMin: Infinity,
    ampsMax: -Infinity,
    codeMin: Infinity,
    codeMax: -Infinity,
    worst,
    selfHeatingMaxK: 0,
    sourceOhmsMax: 0,
    nonlinearity: nonlinearity(sweep),
    lsbVolts: c.adc.reference.value / 2 ** c.adc.bits,
  };
  for (const p of sweep) {
    s.voltsMin = Math.min(s.voltsMin, p.volts);
    s.voltsMax = Math.max(s.voltsMax, p.volts);
    s.ampsMin = Math.min(s.ampsMin, p.amps);
    s.ampsMax = Math.max(s.ampsMax, p.amps);
    s.codeMin = Math.min(s.codeMin, p.code);
    s.codeMax = Math.max(s.codeMax, p.code);
    s.selfHeatingMaxK = Math.max(s.selfHeatingMaxK, p.selfHeatingK);
    s.sourceOhmsMax = Math.max(s.sourceOhmsMax, p.sourceOhms);
    if (p.countsPerKelvin < worst.countsPerKelvin) worst = p;
  }
  s.worst = worst;
  return s;
}
