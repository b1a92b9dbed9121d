// outside-rated: the channel range against the part's rated temperatures.
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { fmtC } from './format';
import { kindOf } from '../sensors/registry';

export function checkRated({ channel: c, sink }: CheckContext): void {
  const s = c.sensor;
  if (c.lowK >= s.ratedLowK && c.highK <= s.ratedHighK) return;
  sink.report('outside-rated', c.file, fieldSpan(c, 'range'),
    `range ${fmtC(c.lowK - 273.15)} .. ${fmtC(c.highK - 273.15)} reaches beyond the rated ${kindOf(s).ratedRange} of '${s.name}' (${fmtC(s.ratedLowK - 273.15)} .. ${fmtC(s.ratedHighK - 273.15)})`);
}
