// Oversampling and decimation: 4^n readings summed and shifted right by n give n extra bits,
// provided the noise at the input toggles the LSB between readings. Source: Atmel application note
// AVR121 "Enhancing ADC resolution by oversampling" (doc8003): for each extra bit the signal is
// oversampled four times (f_os = 4^n f_s), the sum is right-shifted by n; the noise amplitude has to
// exceed 0.5 LSB to toggle the LSB, and 1-2 LSB is better. The same rule is in Microchip
// application note AN2572 "ADC Oversampling with tinyAVR 0- and 1-series, and megaAVR 0-series".
import type { ChannelDef } from '../model/types';

/** Least rms noise at the input, LSB, for the method to work (AVR121: more than 0.5 LSB). */
export const MIN_NOISE_LSB_RMS = 0.5;

/** Readings summed for n extra bits: 4^n (AVR121). */
export function samplesForExtraBits(n: number): number {
  return 4 ** n;
}

/** Extra bits from m readings summed and shifted: floor(log4 m) (AVR121, inverse of the above). */
export function extraBitsForSamples(m: number): number {
  if (!(m >= 1)) return 0;
  let n = 0;
  while (4 ** (n + 1) <= m) n++;
  return n;
}

/** Whether the stated noise lets oversampling work: null when no noise is stated. */
export function noiseSuffices(c: ChannelDef): boolean | null {
  const noise = c.adc.noiseLsbRms;
  if (noise === undefined || noise === null) return null;
  return noise >= MIN_NOISE_LSB_RMS;
}

/** Extra bits credited: the stated oversampling when the stated noise is enough, else 0. */
export function effectiveOversamplingBits(c: ChannelDef): number {
  const n = c.oversamplingBits ?? 0;
  return n > 0 && noiseSuffices(c) === true ? n : 0;
}
