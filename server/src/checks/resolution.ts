// resolution-short: counts per kelvin at the worst point against the required resolution.
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { fmtC, fmtV, trimNumber } from './format';
import { effectiveOversamplingBits } from '../budget/oversampling';
import { blockSpec, fieldSpec } from '../model/schema';

/** The domain the adc block accepts for a field (model/schema.ts, the one definition). */
function adcDomain(field: string, end: 'min' | 'max'): number {
  const form = fieldSpec(blockSpec('adc')!, field)!.form;
  return form.form === 'quantity' ? form[end] : NaN;
}

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
  const MAX_BITS = adcDomain('bits', 'max');
  const MIN_REFERENCE_V = adcDomain('reference', 'min');
  // A reference the spec accepts (at least 1 mV, model/schema.ts) that stays above the signal.
  const refFits = maxRef > result.summary.voltsMax && maxRef >= MIN_REFERENCE_V;
  // No count changes over a kelvin at the worst point: no converter width is a sound answer.
  if (!Number.isFinite(perCount) || !(bits <= 32)) {
    sink.report('resolution-short', c.file, fieldSpan(c, 'resolution'),
      `the ADC code does not change by one count per kelvin at ${fmtC(w.celsius)}, far coarser than the required ${trimNumber(need, 3)} °C per count; check the reference (${fmtV(c.adc.reference.value)}) against the sensed voltage and the bias`);
    return;
  }
  // Only what the spec can hold is proposed: bits accept 1 to 24 (model/schema.ts).
  const bitsFit = bits <= MAX_BITS;
  const ways = [refFits ? `a reference of at most ${fmtV(maxRef)}` : null, bitsFit ? `an ADC of ${bits} bits` : null].filter((x) => x !== null);
  sink.report('resolution-short', c.file, fieldSpan(c, 'resolution'),
    `worst resolution is ${trimNumber(perCount, 3)} °C per count (${trimNumber(w.countsPerKelvin * 2 ** os, 3)} counts/K${os ? ` with ${os} bits of oversampling` : ''}) at ${fmtC(w.celsius)}, coarser than the required ${trimNumber(need, 3)} °C per count; ` +
      (ways.length ? `${ways.join(' or ')} would meet it` : `out of reach of the converter: it would take ${bits} bits (bits accept 1 to ${MAX_BITS}) and no reference keeps the signal under full scale; check the range, the bias and the sensor`) +
      (ways.length && !bitsFit ? ` (more bits cannot: it would take ${bits}, and bits accept 1 to ${MAX_BITS})` : ''),
    { ...(bitsFit ? { neededBits: bits } : {}), ...(refFits ? { maxReference: maxRef } : {}) });
}
