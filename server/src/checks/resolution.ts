// resolution-short: counts per kelvin at the worst point against the required resolution.
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { fmtC, fmtV, trimNumber } from './format';

export function checkResolution({ channel: c, result, sink }: CheckContext): void {
  const need = c.resolutionKPerCount;
  if (need === null) return;
  const w = result.summary.worst;
  if (w.celsiusPerCount <= need) return;
  // Counts per kelvin scale with 2^bits / Vref: what would meet the target at the worst point?
  const factor = w.celsiusPerCount / need;
  const bits = c.adc.bits + Math.ceil(Math.log2(factor));
  const maxRef = c.adc.reference.value / factor;
  const refFits = maxRef > result.summary.voltsMax;
  sink.report('resolution-short', c.file, fieldSpan(c, 'resolution'),
    `worst resolution is ${trimNumber(w.celsiusPerCount, 3)} °C per count (${trimNumber(w.countsPerKelvin, 3)} counts/K) at ${fmtC(w.celsius)}, coarser than the required ${trimNumber(need, 3)} °C per count; ` +
      (refFits ? `a reference of at most ${fmtV(maxRef)} or ` : '') + `an ADC of ${bits} bits would meet it`,
    { neededBits: bits, ...(refFits ? { maxReference: maxRef } : {}) });
}
