// fault-in-range: an open or shorted sensor gives a code inside the channel's usable range, so the
// firmware cannot tell the fault from a temperature (analysis/sensor-faults.ts computes the codes).
import { sensorFaults } from '../analysis/sensor-faults';
import type { CheckContext } from './context';
import { fieldSpan } from './context';

export function checkSensorFault({ channel: c, result, sink, reported }: CheckContext): void {
  const s = result.summary;
  // A channel that clips or cannot be biased has its real problem reported already (checks/clip.ts,
  // checks/supply.ts).
  if (reported.has('supply-too-low') || s.voltsMax >= c.adc.reference.value || s.voltsMin < 0) return;
  for (const f of sensorFaults(c, s.codeMin, s.codeMax)) {
    if (f.distinct) continue;
    sink.report('fault-in-range', c.file, fieldSpan(c, 'bias'),
      `${/^[aeiou]/.test(f.what) ? 'an' : 'a'} ${f.what} gives code ${f.code}, which a temperature of the range also gives (the range reads codes ${s.codeMin} .. ${s.codeMax}) (${f.assumption}): the firmware cannot tell the fault from that temperature; change the bias or the reference so that the fault lands outside the range, or detect it another way`,
      { fault: f.kind, code: f.code });
  }
}
