// The thermocouple channel's own checks.
//   tc-swing: the sensed voltage (the amplifier's output) leaves the amplifier's stated output swing.
//   tc-class-range: the range leaves the range IEC 60584-1 gives the stated class of the type.
//   tc-open-offset: the open-detection current through the loop adds an offset; the conversion takes
//     off the stated value, but the loop resistance changes with cable length and with the wire's
//     temperature, so a 50 % change of it (a rule of ours, common practice, no source) is compared
//     with 10 % of the accuracy target (0.1 K without one), as lead-resistance does for two-wire RTDs.
import type { CheckContext } from '../../checks/context';
import { fieldSpan } from '../../checks/context';
import { fmtC, fmtV, formatSI, trimNumber } from '../../checks/format';
import { seebeck } from './its90';
import { classRange } from './tolerance';
import { detectAmps, detectVolts } from './model';
import { tcChannel, type ThermocoupleDef } from './types';

const ZERO_C = 273.15;

export function checkSwing({ channel: c, result, sink }: CheckContext): void {
  const sw = tcChannel(c).swing;
  if (!sw) return;
  const s = result.summary;
  if (s.voltsMax > sw.highV) {
    sink.report('tc-swing', c.file, fieldSpan(c, 'output_swing'),
      `the amplifier must reach ${fmtV(s.voltsMax)} at ${fmtC(s.at.voltsMax.celsius)}, above its ${fmtV(sw.highV)} output swing: the reading clips there; lower the gain or the offset`,
      { needed: s.voltsMax });
  }
  if (s.voltsMin < sw.lowV) {
    sink.report('tc-swing', c.file, fieldSpan(c, 'output_swing'),
      `the amplifier must reach ${fmtV(s.voltsMin)} at ${fmtC(s.at.voltsMin.celsius)}, below its ${fmtV(sw.lowV)} output swing: the reading clips there; raise the output offset or narrow the range`,
      { needed: s.voltsMin });
  }
}

export function checkClassRange({ channel: c, sink }: CheckContext): void {
  const s = c.sensor as ThermocoupleDef;
  if (!s.toleranceClass) return;
  const r = classRange(s.params.type, s.toleranceClass);
  const eps = 1e-9;
  if (r && c.lowK >= r.lowK - eps && c.highK <= r.highK + eps) return;
  sink.report('tc-class-range', c.file, fieldSpan(c, 'range'),
    r
      ? `range ${fmtC(c.lowK - ZERO_C)} .. ${fmtC(c.highK - ZERO_C)} leaves ${fmtC(r.lowK - ZERO_C)} .. ${fmtC(r.highK - ZERO_C)}, where IEC 60584-1 gives type ${s.params.type} class ${s.toleranceClass} its tolerance; beyond it the error budget takes the tolerance at the nearest end, which is not guaranteed: narrow the range or choose a class that covers it`
      : `IEC 60584-1 gives type ${s.params.type} no class ${s.toleranceClass}; the error budget counts no class tolerance: state a class the type has`);
}

/** Share of the accuracy target the loop-resistance change may stand for; 0.1 K when no target (a rule of ours). */
const OPEN_SHARE = 0.1;
/** The change of loop resistance we allow for (cable length, the wire warming): a rule of ours. */
const LOOP_CHANGE = 0.5;

export function checkOpenOffset({ channel: c, sink }: CheckContext): void {
  const s = c.sensor as ThermocoupleDef;
  const v = detectVolts(c);
  if (!(v > 0)) return;
  // Kelvin per volt is largest where the Seebeck coefficient is smallest over the range.
  const ends = [c.lowK, (c.lowK + c.highK) / 2, c.highK];
  const seebeckMin = Math.min(...ends.map((k) => seebeck(s.params.type, k)));
  const kelvins = v / seebeckMin;
  const limit = c.accuracyK !== null ? OPEN_SHARE * c.accuracyK : 0.1;
  if (kelvins * LOOP_CHANGE <= limit) return;
  const scheme = c.bias.kind === 'current' ? 'burnout current' : 'pull-up current';
  sink.report('tc-open-offset', c.file, fieldSpan(c, 'bias'),
    `the open-detection ${scheme} of ${formatSI(detectAmps(c), 'A')} through the ${formatSI(tcChannel(c).loopOhms, 'Ω')} loop adds ${fmtV(v)}, ${trimNumber(kelvins, 3)} K where the thermocouple is least sensitive; the conversion takes off the stated value, but a ${LOOP_CHANGE * 100} % change of the loop (cable length, the wire warming) moves the reading ${trimNumber(kelvins * LOOP_CHANGE, 3)} K, over the ${trimNumber(limit, 3)} K allowed: use a smaller detection current (a larger pull-up) or a shorter loop`,
    { offsetVolts: v, kelvin: kelvins });
}
