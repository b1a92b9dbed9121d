// oversampling-noise: oversampling is asked for but the stated noise (or no stated noise) cannot
// toggle the LSB, so the extra bits are not real (Atmel application note AVR121: noise above 0.5 LSB).
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { trimNumber } from './format';
import { MIN_NOISE_LSB_RMS, noiseSuffices, samplesForExtraBits } from '../budget/oversampling';

export function checkOversampling({ channel: c, sink }: CheckContext): void {
  const n = c.oversamplingBits ?? 0;
  if (n <= 0) return;
  const ok = noiseSuffices(c);
  if (ok === true) return;
  const stated = c.adc.noiseLsbRms;
  sink.report('oversampling-noise', c.file, fieldSpan(c, 'oversampling'),
    `${n} bits of oversampling (${samplesForExtraBits(n)} readings summed, shifted right by ${n}) need at least ${MIN_NOISE_LSB_RMS} LSB rms of noise at the input; ` +
      (ok === null ? `adc '${c.adc.name}' states none (add e.g. \`noise = 1 LSB rms\` once measured)` : `adc '${c.adc.name}' states ${trimNumber(stated!, 3)} LSB rms`) +
      ': the extra bits are not credited; add dither or drop the oversampling',
    { neededNoiseLsbRms: MIN_NOISE_LSB_RMS });
}
