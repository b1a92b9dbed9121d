// Formatting of computed figures for hovers, inlay hints and fix titles: SI prefixes and
// sensible precision (3 significant digits), temperatures in °C, small rises in mK.
import { formatSI, trimNumber } from '../model/read-value';
import { ZERO_CELSIUS_K } from '../physics/constants';
import type { Analysis } from './result';
import type { ChannelResult } from './types';

export { formatSI, trimNumber };

export const volts = (v: number) => formatSI(v, 'V');
export const amps = (a: number) => formatSI(a, 'A');
export const ohms = (r: number) => formatSI(r, 'Ω');
/** A reference voltage with four significant digits, so that 1.024 V and 1.025 V read apart. */
export const reference = (v: number) => formatSI(v, 'V', 4);
/** A current over the range; one figure when it does not change (a constant-current bias). */
export const ampsSpan = (lo: number, hi: number) => (amps(lo) === amps(hi) ? `${amps(lo)}, constant` : `${amps(lo)} .. ${amps(hi)}`);
export const celsius = (c: number) => `${trimNumber(c, 4)} °C`;
export const kelvinToCelsius = (k: number) => celsius(k - ZERO_CELSIUS_K);
export const slopeMv = (voltsPerKelvin: number) => `${trimNumber(voltsPerKelvin * 1000, 3)} mV/K`;
export const perCount = (cPerCount: number) => (Number.isFinite(cPerCount) ? `${trimNumber(cPerCount, 3)} °C/count` : 'no counts per kelvin');
export const percent = (ratio: number) => `${trimNumber(ratio * 100, 3)} %`;

/** A temperature rise: mK below 1 K, else K. */
export function rise(k: number): string {
  return Math.abs(k) < 1 ? `${trimNumber(k * 1000, 3)} mK` : `${trimNumber(k, 3)} K`;
}

/** A temperature difference or error in K (3 significant digits). */
export const kelvinDelta = (k: number) => `${trimNumber(k, 3)} K`;

/** The analysed channel of this name in the entry file, if it could be analysed. */
export function channelResult(a: Analysis, name: string): ChannelResult | undefined {
  return a.channels.find((r) => r.channel.name === name);
}

/** Channels (analysed) that use a junction or ADC definition. */
export function channelsUsing(a: Analysis, name: string, as: 'sensor' | 'adc'): ChannelResult[] {
  return a.channels.filter((r) => (as === 'sensor' ? r.channel.sensor.name : r.channel.adc.name) === name);
}

/** Where the signal leaves the converter's input span, in words; null when it stays inside. */
export function clipText(r: ChannelResult): string | null {
  const vref = r.channel.adc.reference.value;
  const high = r.sweep.filter((p) => p.volts >= vref);
  const low = r.sweep.filter((p) => p.volts < 0);
  const where = (ps: ChannelResult['sweep']) => (ps.length === 1 ? `at ${celsius(ps[0]!.celsius)}` : `from ${celsius(ps[0]!.celsius)} to ${celsius(ps[ps.length - 1]!.celsius)}`);
  const parts = [
    high.length ? `clips ${where(high)} (above the ${reference(vref)} reference)` : null,
    low.length ? `clips ${where(low)} (below 0 V)` : null,
  ].filter((x) => x !== null);
  return parts.length ? parts.join('; ') : null;
}
