// clip-high / clip-low / clip-tolerance: the sensed voltage against the ADC's input span.
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { fmtC, fmtV } from './format';

export function checkClip({ channel: c, result, sink }: CheckContext): void {
  const vref = c.adc.reference.value;
  const { voltsMax, voltsMin } = result.summary;
  const { voltsMax: hi, voltsMin: lo } = result.summary.at;
  const span = fieldSpan(c, 'adc');
  if (voltsMax >= vref) {
    const neededRef = voltsMax * 1.05;
    sink.report('clip-high', c.file, span,
      `sensed voltage reaches ${fmtV(voltsMax)} at ${fmtC(hi.celsius)}, at or above the ${fmtV(vref)} reference of '${c.adc.name}': the ADC saturates; use a reference of at least ${fmtV(neededRef)} or lower the sensed voltage`,
      { neededReference: neededRef });
  } else if (c.adc.reference.tolerance > 0 && voltsMax >= vref * (1 - c.adc.reference.tolerance)) {
    sink.report('clip-tolerance', c.file, span,
      `sensed voltage reaches ${fmtV(voltsMax)} at ${fmtC(hi.celsius)}; with the reference at the low end of its tolerance (${fmtV(vref * (1 - c.adc.reference.tolerance))}) the ADC saturates`);
  }
  if (voltsMin < 0) {
    sink.report('clip-low', c.file, span, `sensed voltage falls to ${fmtV(voltsMin)} at ${fmtC(lo.celsius)}, below 0 V: the ADC reads zero`);
  }
}
