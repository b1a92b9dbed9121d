// Sweeps a channel over its range: operating point, ADC code and resolution at each step.
import { ZERO_CELSIUS_K } from '../physics/constants';
import { sense, senseEach } from './sense';
import type { ChannelDef } from '../model/types';
import type { ChannelResult, ChannelSummary, SweepColumns, SweepPoint } from './types';
import { nonlinearity } from './nonlinearity';

/** Temperatures of the sweep, K: from low to high by step, the high end always included. */
export function sweepKelvins(c: ChannelDef): number[] {
  const n = Math.max(1, Math.ceil((c.highK - c.lowK) / c.stepK - 1e-9));
  const out = column(n + 1);
  for (let i = 0; i < n; i++) out[i] = c.lowK + i * c.stepK;
  out[n] = c.highK;
  return out;
}

/**
 * An array for `n` numbers, written in index order. Made at its full size: grown by pushes, it
 * costs about three times its size in copies (V8 grows an array by half its length each time).
 * Above 50,000 the array starts empty and each write appends, since V8 makes a preallocated array
 * that large a slow dictionary (limit from memory: 100,000).
 */
function column(n: number): number[] {
  return n <= 50_000 ? new Array<number>(n) : [];
}

/** Ideal ADC code of a voltage: floor(V / Vref * 2^bits), clamped to the converter's codes. */
export function adcCode(volts: number, vref: number, bits: number): number {
  const full = 2 ** bits;
  const code = Math.floor((volts / vref) * full);
  return Math.min(full - 1, Math.max(0, code));
}

export function pointAt(c: ChannelDef, kelvin: number): SweepPoint {
  const p = sense(c, kelvin);
  return pointOf(c, kelvin, p.volts, p.amps, p.slope, p.powerW, p.sourceOhms);
}

function pointOf(c: ChannelDef, kelvin: number, volts: number, amps: number, slope: number, powerW: number, sourceOhms: number): SweepPoint {
  const countsPerKelvin = (Math.abs(slope) * 2 ** c.adc.bits) / c.adc.reference.value;
  return {
    celsius: kelvin - ZERO_CELSIUS_K,
    kelvin,
    volts,
    amps,
    code: adcCode(volts, c.adc.reference.value, c.adc.bits),
    slope,
    countsPerKelvin,
    celsiusPerCount: countsPerKelvin > 0 ? 1 / countsPerKelvin : Infinity,
    selfHeatingK: powerW * c.thetaJA,
    sourceOhms,
  };
}

/**
 * The sweep held as columns, one array per figure. A sweep of 200 channels has tens of
 * thousands of points; as objects (each number boxed) they cost several times the physics, and
 * the checks need only the summary. Points are made when something asks for them (hover, plots,
 * reports) and then kept.
 */
export interface SweepTable extends SweepColumns {}
// The columns are typed by SweepColumns alone (the interface above merges into the class).
// Typed arrays: their numbers live outside the JS heap, so the collector never copies them. A cold
// 200-channel analysis keeps 1.6 MB of them; as plain arrays each young-generation collection
// copied them again (measured over 60 cold analyses: 14–24 % less time in those collections).
export class SweepTable {
  private made: SweepPoint[] | undefined;

  constructor(readonly channel: ChannelDef, readonly kelvin: number[]) {
    const n = kelvin.length;
    // One buffer, five views: making a typed array's buffer costs more than filling this one.
    const buffer = new ArrayBuffer(5 * n * Float64Array.BYTES_PER_ELEMENT);
    const view = (k: number) => new Float64Array(buffer, k * n * Float64Array.BYTES_PER_ELEMENT, n);
    const columns = { volts: view(0), amps: view(1), slope: view(2), powerW: view(3), sourceOhms: view(4) };
    Object.assign(this, columns);
    senseEach(channel, kelvin, columns);
  }

  get length(): number {
    return this.kelvin.length;
  }

  point(i: number): SweepPoint {
    return pointOf(this.channel, this.kelvin[i]!, this.volts[i]!, this.amps[i]!, this.slope[i]!, this.powerW[i]!, this.sourceOhms[i]!);
  }

  points(): SweepPoint[] {
    if (!this.made) this.made = Array.from({ length: this.length }, (_, i) => this.point(i));
    return this.made;
  }
}

/**
 * `sweep` of every channel result: one getter function for all. A getter closure per result gave
 * each result a hidden class of its own; V8 keeps hidden classes until a full collection, and
 * through them each result's table outlived the young-generation collections after it died
 * (measured: about 1 MB per 200-channel analysis promoted to the old generation).
 */
const SWEEP = { enumerable: true, configurable: true, get(this: ChannelResult): SweepPoint[] { return this.table.points(); } };

/** A channel's result over a sweep table; `sweep` (the points) is made on first read. */
export function channelResult(channel: ChannelDef, table: SweepColumns, summary: ChannelSummary): ChannelResult {
  const result = { channel, table, summary } as ChannelResult;
  Object.defineProperty(result, 'sweep', SWEEP);
  return result;
}

export function analyseChannel(c: ChannelDef): ChannelResult {
  const table = new SweepTable(c, sweepKelvins(c));
  return channelResult(c, table, summarise(c, table));
}

function summarise(c: ChannelDef, t: SweepTable): ChannelSummary {
  const n = t.length;
  let worst = 0;
  const at = { voltsMin: 0, voltsMax: 0, ampsMin: 0, ampsMax: 0, selfHeatingMax: 0 };
  let sourceOhmsMax = 0;
  const vref = c.adc.reference.value;
  for (let i = 0; i < n; i++) {
    if (t.volts[i]! < t.volts[at.voltsMin]!) at.voltsMin = i;
    if (t.volts[i]! > t.volts[at.voltsMax]!) at.voltsMax = i;
    if (t.amps[i]! < t.amps[at.ampsMin]!) at.ampsMin = i;
    if (t.amps[i]! > t.amps[at.ampsMax]!) at.ampsMax = i;
    if (t.powerW[i]! > t.powerW[at.selfHeatingMax]!) at.selfHeatingMax = i;
    // Counts per kelvin are |slope| times a constant of the channel: the worst point has the smallest |slope|.
    if (Math.abs(t.slope[i]!) < Math.abs(t.slope[worst]!)) worst = i;
    if (t.sourceOhms[i]! > sourceOhmsMax) sourceOhmsMax = t.sourceOhms[i]!;
  }
  // Extremes often share a temperature (lowest voltage and highest current both at the hot end):
  // one point object per temperature, as every point is kept as long as the result.
  const made: SweepPoint[] = [];
  const point = (i: number): SweepPoint => made.find((p) => p.kelvin === t.kelvin[i]) ?? (made[made.length] = t.point(i));
  const heat = point(at.selfHeatingMax);
  return {
    points: n,
    voltsMin: t.volts[at.voltsMin]!,
    voltsMax: t.volts[at.voltsMax]!,
    ampsMin: t.amps[at.ampsMin]!,
    ampsMax: t.amps[at.ampsMax]!,
    // The ideal code is a non-decreasing function of the voltage: its extremes are at the voltage's.
    codeMin: adcCode(t.volts[at.voltsMin]!, vref, c.adc.bits),
    codeMax: adcCode(t.volts[at.voltsMax]!, vref, c.adc.bits),
    worst: point(worst),
    selfHeatingMaxK: Math.max(0, heat.selfHeatingK),
    sourceOhmsMax,
    nonlinearity: nonlinearity(t.volts, t.kelvin, ZERO_CELSIUS_K),
    lsbVolts: vref / 2 ** c.adc.bits,
    at: { voltsMin: point(at.voltsMin), voltsMax: point(at.voltsMax), ampsMin: point(at.ampsMin), ampsMax: point(at.ampsMax), selfHeatingMax: heat },
  };
}
