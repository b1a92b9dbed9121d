// Hover figures the resistive kinds (thermistor, rtd) share: the element's resistance at the range
// ends of the channels using it, and the resistive parts of a channel (divider, ratiometric reading,
// amplifier, lead wiring). Pure: definitions in, markdown out. The element's R(T) is its kind's curve
// (elementAt).
import type { Analysis } from '../../analysis/result';
import type { ChannelResult } from '../../analysis/types';
import type { ChannelDef, SensorDef } from '../../model/types';
import { elementAt } from './model';
import { ZERO_CELSIUS_K } from '../../physics/constants';
import * as f from '../../analysis/figures';

/** The element's resistance at the two ends of each analysed channel that uses it. */
export function rangeEndOhms(a: Analysis, s: SensorDef): { channel: string; lowC: number; highC: number; lowOhms: number; highOhms: number }[] {
  return f.channelsUsing(a, s.name, 'sensor').map((r) => ({
    channel: r.channel.name,
    lowC: r.channel.lowK - ZERO_CELSIUS_K,
    highC: r.channel.highK - ZERO_CELSIUS_K,
    lowOhms: elementAt(s, r.channel.lowK).ohms,
    highOhms: elementAt(s, r.channel.highK).ohms,
  }));
}

export const sci = (v: number) => (v === 0 || !Number.isFinite(v) ? f.trimNumber(v, 5) : Number(v.toPrecision(5)).toExponential().replace('e+', 'e'));
export const tol = (t: number) => (t ? ` ± ${f.percent(t)}` : '');
export const dissipation = (thetaJA: number) => `dissipation constant ${f.formatSI(1 / thetaJA, 'W/K')} (${f.trimNumber(thetaJA, 4)} K/W)`;

export function endsTable(a: Analysis, s: SensorDef, extra?: (c: number) => string): string {
  const rows = rangeEndOhms(a, s);
  if (rows.length === 0) return 'Used by no analysed channel in this file';
  const head = extra ? '| channel | low end | R | class tolerance | high end | R | class tolerance |\n|---|---:|---:|---:|---:|---:|---:|' : '| channel | low end | R | high end | R |\n|---|---:|---:|---:|---:|';
  const lines = rows.map((x) => extra
    ? `| \`${x.channel}\` | ${f.celsius(x.lowC)} | ${f.ohms(x.lowOhms)} | ${extra(x.lowC)} | ${f.celsius(x.highC)} | ${f.ohms(x.highOhms)} | ${extra(x.highC)} |`
    : `| \`${x.channel}\` | ${f.celsius(x.lowC)} | ${f.ohms(x.lowOhms)} | ${f.celsius(x.highC)} | ${f.ohms(x.highOhms)} |`);
  return `Resistance at the range ends of the channels using it:\n\n${head}\n${lines.join('\n')}`;
}

/**
 * Lines of a resistive channel's hover: element, divider, ratiometric reading, amplifier, wiring.
 * `direction`: how the element's resistance moves with temperature ("NTC: R falls with T").
 */
export function resistiveChannelLines(r: ChannelResult, direction: string): string[] {
  const c: ChannelDef = r.channel;
  const s = c.sensor;
  const lo = elementAt(s, c.lowK).ohms;
  const hi = elementAt(s, c.highK).ohms;
  const out = [`Element: ${f.ohms(lo)} at ${f.kelvinToCelsius(c.lowK)} .. ${f.ohms(hi)} at ${f.kelvinToCelsius(c.highK)}`];
  const b = c.bias;
  if (b.kind === 'divider') {
    out.push(`Divider: fixed ${f.ohms(b.ohms.value)}${tol(b.ohms.tolerance)} ${b.position} the sensor, from ${f.volts(b.supply.value)}${tol(b.supply.tolerance)}; ` +
      `the sensed voltage ${(r.sweep[Math.floor(r.sweep.length / 2)]?.slope ?? 0) < 0 ? 'falls' : 'rises'} as the temperature rises (${direction})`);
  } else if (b.kind === 'current') out.push(`Excitation: constant current ${f.amps(b.amps.value)}${tol(b.amps.tolerance)} through the element`);
  if (c.ratiometric) out.push('Ratiometric: the ADC reference is the divider supply, so the code follows the divider ratio and the supply\'s value and tolerance cancel');
  else out.push(`Not ratiometric: the code follows the absolute voltage, so the ${b.kind === 'current' ? 'current source\'s' : 'supply\'s'} and the reference's errors both count`);
  if (c.amplifier) out.push(`Amplifier: V_adc = ${f.trimNumber(c.amplifier.gain, 4)} × V${c.amplifier.offsetVolts !== 0 ? ` ${c.amplifier.offsetVolts < 0 ? '−' : '+'} ${f.volts(Math.abs(c.amplifier.offsetVolts))}` : ''} (the ADC sees the amplifier's output)`);
  if (c.wiring) {
    const w = c.wiring;
    const slope = Math.abs(elementAt(s, (c.lowK + c.highK) / 2).slope);
    out.push(w.wires === 2
      ? `Wiring: 2 wires, ${f.ohms(w.leadOhms)} per lead; both leads (${f.ohms(2 * w.leadOhms)}) add to the element, about ${f.kelvinDelta((2 * w.leadOhms) / slope)} at mid-range`
      : w.wires === 3
        ? `Wiring: 3 wires, ${f.ohms(w.leadOhms)} per lead; the third lead cancels the lead resistance when the leads match`
        : 'Wiring: 4 wires; the sense pair carries no current, so the leads add no error');
  } else out.push('Wiring: leads not modelled');
  return out;
}
