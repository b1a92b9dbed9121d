// two-current-unresolved: one ADC count of the two-current difference spans more temperature than
// the resolution target (or 0.5 K when none is given); names the gain or oversampling that fixes it.
import type { CheckContext } from '../../checks/context';
import { fieldSpan } from '../../checks/context';
import { fmtC, trimNumber } from '../../checks/format';
import { effectiveOversamplingBits, samplesForExtraBits } from '../../budget/oversampling';

/** Resolution asked of a two-current channel without a resolution target, K per count. */
export const DEFAULT_TWO_CURRENT_K_PER_COUNT = 0.5;

export function checkTwoCurrent({ channel: c, result, sink }: CheckContext): void {
  if (!c.secondBias) return;
  const need = c.resolutionKPerCount ?? DEFAULT_TWO_CURRENT_K_PER_COUNT;
  const w = result.summary.worst;
  const os = effectiveOversamplingBits(c);
  const perCount = w.celsiusPerCount / 2 ** os;
  if (perCount <= need) return;
  const factor = perCount / need;
  // An amplifier of gain G before the ADC multiplies counts per kelvin by G; it must keep the
  // largest difference voltage below the reference.
  const gain = Math.ceil(factor * 10) / 10;
  const maxGain = c.adc.reference.value / result.summary.voltsMax;
  const extra = os + Math.ceil(Math.log2(factor));
  const options = [
    gain <= maxGain ? `an amplifier gain of at least ${trimNumber(gain, 3)} (at most ${trimNumber(maxGain, 3)} keeps the difference under the reference)` : null,
    extra <= 8 ? `${extra} bits of oversampling (${samplesForExtraBits(extra)} readings per result, with at least 0.5 LSB rms noise)` : null,
  ].filter((x): x is string => x !== null);
  sink.report('two-current-unresolved', c.file, fieldSpan(c, c.resolutionKPerCount !== null ? 'resolution' : 'bias'),
    `the two-current difference moves ${trimNumber(Math.abs(w.slope) * 1e6, 3)} µV/K: one count is ${trimNumber(perCount, 3)} °C at ${fmtC(w.celsius)}, coarser than ${trimNumber(need, 3)} °C per count${c.resolutionKPerCount === null ? ' (the default for this method)' : ''}; ` +
      (options.length ? `${options.join(' or ')} would resolve it` : 'a converter with a lower reference or more bits is needed'),
    { gain, oversamplingBits: extra });
}
