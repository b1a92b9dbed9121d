// code-saturated: the range reaches code 0 or the converter's full-scale code 2^bits - 1 while the
// voltage stays inside 0 .. reference (clip-high and clip-low cover the voltage leaving it). Code 0
// stands for every voltage below 1 LSB and the full-scale code for every voltage above
// (2^bits - 1) LSB, so the temperatures beyond read alike and the generated code calls them out
// of range (analysis/sensor-faults.ts usableCodes).
import { kelvinAtVolts } from '../analysis/inverse';
import { ZERO_CELSIUS_K } from '../physics/constants';
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { fmtC, fmtV } from './format';

export function checkSaturation({ channel: c, result, sink, reported }: CheckContext): void {
  const s = result.summary;
  const top = 2 ** c.adc.bits - 1;
  const lsb = s.lsbVolts;
  const span = fieldSpan(c, 'adc');
  const from = (volts: number, fallback: number) => {
    const k = kelvinAtVolts(c, volts);
    return Number.isFinite(k) ? k - ZERO_CELSIUS_K : fallback;
  };
  // Same conditions as checks/clip.ts (which does not mark `reported`): a clipping channel has its
  // own message.
  const vref = c.adc.reference.value;
  if (reported.has('supply-too-low')) return;
  if (s.codeMax === top && s.voltsMax < vref * (1 - c.adc.reference.tolerance)) {
    const end = s.at.voltsMax.celsius;
    const edge = from(top * lsb, end);
    sink.report('code-saturated', c.file, span,
      `from ${fmtC(Math.min(edge, end))} to ${fmtC(Math.max(edge, end))} the sensed voltage (up to ${fmtV(s.voltsMax)}) is at or above ${top} LSB = ${fmtV(top * lsb)}, so '${c.adc.name}' reads its full-scale code ${top} for all of them: those temperatures cannot be told apart, and the generated code reports code ${top} as outside the range; lower the sensed voltage or raise the reference`,
      { code: top });
  }
  if (s.codeMin === 0 && s.voltsMin >= 0) {
    const end = s.at.voltsMin.celsius;
    const edge = from(lsb, end);
    sink.report('code-saturated', c.file, span,
      `from ${fmtC(Math.min(edge, end))} to ${fmtC(Math.max(edge, end))} the sensed voltage (down to ${fmtV(s.voltsMin)}) is below 1 LSB = ${fmtV(lsb)}, so '${c.adc.name}' reads code 0 for all of them: those temperatures cannot be told apart, and the generated code reports code 0 as outside the range; raise the sensed voltage (or add an offset) above 1 LSB`,
      { code: 0 });
  }
}
