// resolution-short: counts per kelvin at the worst point against the required resolution.
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { fmtC, fmtV, trimNumber } from './format';
import { effectiveOversamplingBits } from '../budget/oversampling';

export function checkResolution({ channel: c, result, sink }: CheckContext): void {
  const need = c.resolutionKPerCount;
  // Two-current channels: checks/two-current.ts (it names the gain or oversampling needed).
  if (need === null || c.secondBias) return;
  const w = result.summary.worst;
  // Oversampling with enough noise divides the count (budget/oversampling.ts).
  const os = effectiveOversamplingBits(c);
  const perCount = w.celsiusPerCount / 2 ** os;
  if (perCount <= need) return;
  // Counts per kelvin scale with 2^bits / Vref: what would meet the target at the worst point?
  const factor = perCount / need;
  const bits = c.adc.bits + os + Math.ceil(Math.log2(factor));
  const maxRef = c.adc.reference.value / factor;
  const refFits = maxRef > result.summary.voltsMax;
  // No count changes over a kelvin at the worst point: no converter width is a sound answer.
  if (!Number.isFinite(perCount) || !(bits <= 32)) {
    sink.report('resolution-short', c.file, fieldSpan(c, 'resolution'),
      `the ADC code does not change by one count per kelvin at ${fmtC(w.celsius)}, far coarser than the required ${trimNumber(need, 3)} °C per count; check the reference (${fmtV(c.adc.reference.value)}) against the sensed voltage and the bias`);
    return;
  }
  sink.report('resolution-short', c.file, fieldSpan(c, 'resolution'),
    `worst resolution is ${trimNumber(perCount, 3)} °C per count (${trimNumber(w.countsPerKelvin * 2 ** os, 3)} counts/K${os ? ` with ${os} bits of oversampling` : ''}) at ${fmtC(w.celsius)}, coarser than the required ${trimNumber(need, 3)} °C per count; ` +
      (refFits ? `a reference of at most ${fmtV(maxRef)} or ` : '') + `an ADC of ${bits} bits would meet it`,
    { neededBits: bits, ...(refFits ? { maxReference: maxRef } : {}) });
}
