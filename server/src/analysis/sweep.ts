// Sweeps a channel over its range: operating point, ADC code and resolution at each step.
import { ZERO_CELSIUS_K } from '../physics/constants';
import { sense } from './sense';
import type { ChannelDef } from '../model/types';
import type { ChannelResult, ChannelSummary, SweepPoint } from './types';
import { nonlinearity } from './nonlinearity';

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

export function pointAt(c: ChannelDef, kelvin: number): SweepPoint {
  const p = sense(c, kelvin);
  const countsPerKelvin = (Math.abs(p.slope) * 2 ** c.adc.bits) / c.adc.reference.value;
  return {
    celsius: kelvin - ZERO_CELSIUS_K,
    kelvin,
    volts: p.volts,
    amps: p.amps,
    code: adcCode(p.volts, c.adc.reference.value, c.adc.bits),
    slope: p.slope,
    countsPerKelvin,
    celsiusPerCount: countsPerKelvin > 0 ? 1 / countsPerKelvin : Infinity,
    selfHeatingK: p.powerW * c.thetaJA,
    sourceOhms: p.sourceOhms,
  };
}

export function analyseChannel(c: ChannelDef): ChannelResult {
  const sweep = sweepKelvins(c).map((k) => pointAt(c, k));
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
