// Hover figures of resistive sensors (thermistor and rtd blocks) and the resistive parts of a
// channel (divider, ratiometric reading, amplifier, lead wiring). Pure: definitions in, markdown out.
// Equations: the element's R(T) from analysis/sense.ts elementAt (Steinhart-Hart; IEC 60751
// Callendar-Van Dusen); alpha = (R100 - R0) / (100 °C · R0), the mean temperature coefficient over
// 0..100 °C defined in IEC 60751 (0.00385 /°C for the standard's coefficients); class tolerance
// ±(a + b|t|) from physics/callendar-van-dusen.ts (IEC 60751 table, from memory).
import type { Analysis } from '../engine';
import type { ChannelResult } from '../analysis/types';
import type { ChannelDef, RtdDef, ThermistorDef } from '../model/types';
import { elementAt } from '../analysis/sense';
import { classToleranceC, cvdResistance, RTD_CLASSES } from '../physics/callendar-van-dusen';
import { ZERO_CELSIUS_K } from '../physics/constants';
import * as f from './figures';

/** Mean temperature coefficient between 0 °C and 100 °C: (R100 - R0) / (100 · R0), 1/°C. */
export function rtdAlpha(s: RtdDef): number {
  const r0 = s.params.R0;
  return (cvdResistance(r0, s.params, 100) - r0) / (100 * r0);
}

/** Half-width of the RTD's class tolerance at t °C, or null without a class. */
export function rtdClassToleranceC(s: RtdDef, celsius: number): number | null {
  return s.toleranceClass ? classToleranceC(s.toleranceClass, celsius) : null;
}

/** The element's resistance at the two ends of each analysed channel that uses it. */
export function rangeEndOhms(a: Analysis, s: ThermistorDef | RtdDef): { channel: string; lowC: number; highC: number; lowOhms: number; highOhms: number }[] {
  return f.channelsUsing(a, s.name, 'sensor').map((r) => ({
    channel: r.channel.name,
    lowC: r.channel.lowK - ZERO_CELSIUS_K,
    highC: r.channel.highK - ZERO_CELSIUS_K,
    lowOhms: elementAt(s, r.channel.lowK).ohms,
    highOhms: elementAt(s, r.channel.highK).ohms,
  }));
}

const sci = (v: number) => (v === 0 || !Number.isFinite(v) ? f.trimNumber(v, 5) : Number(v.toPrecision(5)).toExponential().replace('e+', 'e'));
const tol = (t: number) => (t ? ` ± ${f.percent(t)}` : '');
const dissipation = (thetaJA: number) => `dissipation constant ${f.formatSI(1 / thetaJA, 'W/K')} (${f.trimNumber(thetaJA, 4)} K/W)`;

function endsTable(a: Analysis, s: ThermistorDef | RtdDef, extra?: (c: number) => string): string {
  const rows = rangeEndOhms(a, s);
  if (rows.length === 0) return 'Used by no analysed channel in this file';
  const head = extra ? '| channel | low end | R | class tolerance | high end | R | class tolerance |\n|---|---:|---:|---:|---:|---:|---:|' : '| channel | low end | R | high end | R |\n|---|---:|---:|---:|---:|';
  const lines = rows.map((x) => extra
    ? `| \`${x.channel}\` | ${f.celsius(x.lowC)} | ${f.ohms(x.lowOhms)} | ${extra(x.lowC)} | ${f.celsius(x.highC)} | ${f.ohms(x.highOhms)} | ${extra(x.highC)} |`
    : `| \`${x.channel}\` | ${f.celsius(x.lowC)} | ${f.ohms(x.lowOhms)} | ${f.celsius(x.highC)} | ${f.ohms(x.highOhms)} |`);
  return `Resistance at the range ends of the channels using it:\n\n${head}\n${lines.join('\n')}`;
}

export function thermistorHover(a: Analysis, s: ThermistorDef): string {
  const p = s.params;
  const curve = s.form === 'beta' && s.beta
    ? `R25 ${f.ohms(s.r25.value)}${tol(s.r25.tolerance)}; β ${f.trimNumber(s.beta.value, 5)} K${tol(s.beta.tolerance)} (between ${f.kelvinToCelsius(s.beta.lowK)} and ${f.kelvinToCelsius(s.beta.highK)})`
    : `R at 25 °C ${f.ohms(s.r25.value)}${tol(s.r25.tolerance)}; curve from ${s.form === 'points' ? 'three measured points (exact Steinhart-Hart fit)' : 'Steinhart-Hart coefficients'}`;
  return [
    `**thermistor ${s.name}** (NTC)`,
    curve,
    `Steinhart-Hart: A ${sci(p.A)}, B ${sci(p.B)}, C ${sci(p.C)} (1/T = A + B ln R + C (ln R)³, R in Ω)`,
    `Rated ${f.kelvinToCelsius(s.ratedLowK)} .. ${f.kelvinToCelsius(s.ratedHighK)}; ${dissipation(s.thetaJA)}`,
    endsTable(a, s),
  ].join('\n\n');
}

export function rtdHover(a: Analysis, s: RtdDef): string {
  const p = s.params;
  const cls = s.toleranceClass;
  const r0 = p.R0;
  const nominal = r0 === 100 || r0 === 1000 ? `, Pt${r0}` : '';
  const classLine = cls
    ? (() => {
      const k = RTD_CLASSES[cls];
      return `IEC 60751 class ${cls}: ±(${k.a} + ${k.b}|t|) °C, ±${f.trimNumber(classToleranceC(cls, 0), 3)} °C at 0 °C; ` +
        `valid ${k.wireLowC} .. ${k.wireHighC} °C wire-wound, ${k.filmLowC} .. ${k.filmHighC} °C film (from memory)`;
    })()
    : 'No IEC 60751 class stated';
  return [
    `**rtd ${s.name}** (platinum${nominal})`,
    `R0 ${f.ohms(r0)}${tol(s.r0.tolerance)}; Callendar-Van Dusen A ${sci(p.A)} /°C, B ${sci(p.B)} /°C², C ${sci(p.C)} /°C⁴ (below 0 °C)`,
    `α = (R100 − R0)/(100 °C · R0) = ${f.trimNumber(rtdAlpha(s), 5)} /°C (R100 ${f.ohms(cvdResistance(r0, p, 100))})`,
    classLine,
    `Rated ${f.kelvinToCelsius(s.ratedLowK)} .. ${f.kelvinToCelsius(s.ratedHighK)}; ${dissipation(s.thetaJA)}`,
    endsTable(a, s, cls ? (c) => `±${f.trimNumber(classToleranceC(cls, c), 3)} °C` : undefined),
  ].join('\n\n');
}

/** Lines of a resistive channel's hover: element, divider, ratiometric reading, amplifier, wiring. */
export function resistiveChannelLines(r: ChannelResult): string[] {
  const c: ChannelDef = r.channel;
  const s = c.sensor;
  if (s.kind === 'junction') return [];
  const lo = elementAt(s, c.lowK).ohms;
  const hi = elementAt(s, c.highK).ohms;
  const out = [`Element: ${f.ohms(lo)} at ${f.kelvinToCelsius(c.lowK)} .. ${f.ohms(hi)} at ${f.kelvinToCelsius(c.highK)}`];
  const b = c.bias;
  if (b.kind === 'divider') {
    out.push(`Divider: fixed ${f.ohms(b.ohms.value)}${tol(b.ohms.tolerance)} ${b.position} the sensor, from ${f.volts(b.supply.value)}${tol(b.supply.tolerance)}; ` +
      `the sensed voltage ${(r.sweep[Math.floor(r.sweep.length / 2)]?.slope ?? 0) < 0 ? 'falls' : 'rises'} as the temperature rises (${s.kind === 'thermistor' ? 'NTC: R falls with T' : 'platinum: R rises with T'})`);
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
