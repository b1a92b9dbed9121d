// beta-extrapolated: a beta-model thermistor used well outside the two temperatures its beta was
// specified between. The beta model is the Steinhart-Hart equation with C = 0 (steinhart-hart.ts);
// real NTC curves bend away from it, so datasheets quote beta per temperature pair (beta 25/50,
// 25/85...) and the error grows away from that pair (common practice, no source).
import type { CheckContext } from '../../checks/context';
import { fieldSpan } from '../../checks/context';
import { fmtC, trimNumber } from '../../checks/format';
import type { ThermistorDef } from './types';

/** How far past the beta pair the range may reach before the note, K (a rule of ours). */
export const BETA_MARGIN_K = 10;

export function checkBetaExtrapolated({ channel: c, sink }: CheckContext): void {
  const s = c.sensor as ThermistorDef;
  if (!s.beta) return;
  const below = s.beta.lowK - c.lowK;
  const above = c.highK - s.beta.highK;
  if (below <= BETA_MARGIN_K && above <= BETA_MARGIN_K) return;
  sink.report('beta-extrapolated', c.file, fieldSpan(c, 'range'),
    `range ${fmtC(c.lowK - 273.15)} .. ${fmtC(c.highK - 273.15)} reaches ${trimNumber(Math.max(below, above), 3)} K ${below > above ? 'below' : 'above'} the ${fmtC(s.beta.lowK - 273.15)} .. ${fmtC(s.beta.highK - 273.15)} that beta of '${s.name}' was specified between; the beta model is exact only at 25 °C and for that pair, so give the datasheet's Steinhart-Hart coefficients or three measured points (point_1..point_3) for the whole range`);
}
