// divider-off-optimum: a thermistor divider's fixed resistor far from the value that gives the most
// signal at the centre of the range.
// With the sensor Rt below the fixed Rf, V = Vs Rt/(Rf + Rt) and dV/dT = Vs Rf/(Rf + Rt)^2 dRt/dT
// (resistor above: the same magnitude with the sign flipped). Over Rf, Rf/(Rf + Rt)^2 has
// d/dRf = (Rt - Rf)/(Rf + Rt)^3, zero at Rf = Rt: the slope at Tc is largest when Rf = Rt(Tc)
// (elementary calculus on the unloaded divider). Relative to that optimum, a resistor k Rt gives
// 4k/(1 + k)^2 of the slope.
import { nearestE24 } from '../../analysis/eseries';
import { thermistorModel } from './model';
import type { ThermistorDef } from './types';
import { pointAt, sweepKelvins } from '../../analysis/sweep';
import type { ChannelDef } from '../../model/types';
import type { CheckContext } from '../../checks/context';
import { fmtC, fmtOhm, trimNumber } from '../../checks/format';

/** Below this share of the optimum's centre slope the check fires (a design rule of ours). */
export const DIVIDER_SLOPE_SHARE = 0.8;

export function dividerSlopeShare(fixedOhms: number, sensorOhms: number): number {
  const k = fixedOhms / sensorOhms;
  return (4 * k) / ((1 + k) * (1 + k));
}

export function checkDividerOptimum({ channel: c, result, sink }: CheckContext): void {
  const s = c.sensor as ThermistorDef;
  const b = c.bias;
  if (b.kind !== 'divider') return;
  const tc = (c.lowK + c.highK) / 2;
  const lead = c.wiring?.wires === 2 ? 2 * c.wiring.leadOhms : 0;
  const rt = thermistorModel.element.at(s, tc).ohms + lead;
  const share = dividerSlopeShare(b.ohms.value, rt);
  if (share >= DIVIDER_SLOPE_SHARE) return;
  const better = nearestE24(rt);
  const alt: ChannelDef = { ...c, bias: { ...b, ohms: { ...b.ohms, value: better } } };
  const worstNow = result.summary.worst.celsiusPerCount;
  const worstAlt = Math.max(...sweepKelvins(alt).map((k) => pointAt(alt, k).celsiusPerCount));
  sink.report('divider-off-optimum', c.file, b.ohms.span,
    `the ${fmtOhm(b.ohms.value)} divider resistor gives ${trimNumber(share * 100, 3)} % of the largest possible slope at the range centre (${fmtC(tc - 273.15)}, where '${s.name}' is ${fmtOhm(rt)}); ` +
      `${fmtOhm(better)} (E24, the thermistor's resistance there) gives ${trimNumber(dividerSlopeShare(better, rt) * 100, 3)} %, worst resolution ${trimNumber(worstAlt, 3)} °C per count instead of ${trimNumber(worstNow, 3)}; check its self-heating`,
    { suggestedOhms: better });
}
