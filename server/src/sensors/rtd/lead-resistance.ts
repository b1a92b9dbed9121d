// lead-resistance: a two-wire RTD's leads in series with the element. The conversion subtracts the
// stated lead resistance, but any change of it (cable length, copper's temperature coefficient,
// about +0.39 %/K, from memory) reads as temperature 1:1; three wires cancel matched leads and four
// wires remove them (the connection drawings of IEC 60751).
import { rtdModel } from './model';
import type { RtdDef } from './types';
import type { CheckContext } from '../../checks/context';
import { fieldSpan } from '../../checks/context';
import { fmtOhm, trimNumber } from '../../checks/format';

/** Share of the accuracy target the leads may stand for; 0.1 K when no target (a rule of ours). */
export const LEAD_SHARE = 0.1;

export function checkLeadResistance({ channel: c, sink }: CheckContext): void {
  const s = c.sensor as RtdDef;
  const w = c.wiring;
  if (!w || w.wires !== 2 || !(w.leadOhms > 0)) return;
  const tc = (c.lowK + c.highK) / 2;
  const leads = 2 * w.leadOhms;
  const kelvins = leads / rtdModel.element.at(s, tc).slope;
  const limit = c.accuracyK !== null ? LEAD_SHARE * c.accuracyK : 0.1;
  if (kelvins * 0.1 <= limit) return;
  sink.report('lead-resistance', c.file, fieldSpan(c, 'wiring'),
    `two wires put ${fmtOhm(leads)} of leads in series with '${s.name}', which reads as ${trimNumber(kelvins, 3)} K at the range centre; the conversion subtracts the stated value, but a 10 % change of the leads (length, copper warming) is ${trimNumber(kelvins * 0.1, 3)} K, over the ${trimNumber(limit, 3)} K allowed; use \`wiring = 3 wires ${trimNumber(w.leadOhms, 4)} ohm\` (matched leads cancel) or 4 wires`,
    { leadKelvin: kelvins });
}
