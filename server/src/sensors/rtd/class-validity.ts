// class-validity: an RTD with an IEC 60751 tolerance class used over a range the class is not
// specified for. IEC 60751:2008 (table 3) gives each class a temperature range of validity, wider for
// wire-wound than for film elements (values in physics/callendar-van-dusen.ts RTD_CLASSES, from
// memory). Outside it the class tolerance ±(a + b|t|) is not guaranteed, so the error budget's element
// spread (taken from the class) is optimistic there. The rtd's `element` field says how the element is
// built; when it is absent the note fires when the range leaves the film range and says whether it
// also leaves the wire-wound one.
import type { CheckContext } from '../../checks/context';
import { fieldSpan } from '../../checks/context';
import { fmtC } from '../../checks/format';
import { RTD_CLASSES } from '../../physics/callendar-van-dusen';
import type { RtdDef } from './types';

export function checkClassValidity({ channel: c, sink }: CheckContext): void {
  const s = c.sensor as RtdDef;
  if (!s.toleranceClass) return;
  const k = RTD_CLASSES[s.toleranceClass];
  const lowC = c.lowK - 273.15;
  const highC = c.highK - 273.15;
  // A hair of slack so a range written exactly at a limit (e.g. 300 °C) does not fire on rounding.
  const eps = 1e-9;
  const leaves = (lo: number, hi: number) => lowC < lo - eps || highC > hi + eps;
  const wire = leaves(k.wireLowC, k.wireHighC);
  if (s.element === 'wire') {
    if (!wire) return;
    sink.report('class-validity', c.file, fieldSpan(c, 'range'),
      `range ${fmtC(lowC)} .. ${fmtC(highC)} leaves the range IEC 60751 specifies class ${s.toleranceClass} of the wire-wound '${s.name}' for: ${fmtC(k.wireLowC)} .. ${fmtC(k.wireHighC)}; ` +
      `outside it the class tolerance is not guaranteed and the error budget's element spread is optimistic: narrow the range or choose a class valid there (limits from memory; check the element's datasheet)`);
    return;
  }
  if (!leaves(k.filmLowC, k.filmHighC)) return;
  sink.report('class-validity', c.file, fieldSpan(c, 'range'),
    `range ${fmtC(lowC)} .. ${fmtC(highC)} leaves the range IEC 60751 specifies class ${s.toleranceClass} of '${s.name}' for: ` +
    `${fmtC(k.filmLowC)} .. ${fmtC(k.filmHighC)} for film elements` +
    (wire ? ` and ${fmtC(k.wireLowC)} .. ${fmtC(k.wireHighC)} for wire-wound ones` : ` (wire-wound elements: ${fmtC(k.wireLowC)} .. ${fmtC(k.wireHighC)}, which the range stays within)`) +
    `; outside it the class tolerance is not guaranteed and the error budget's element spread is optimistic: ` +
    `narrow the range, or choose ${wire ? 'a class valid there' : 'a wire-wound element or a class valid there'} (limits from memory; check the element's datasheet)`);
}
