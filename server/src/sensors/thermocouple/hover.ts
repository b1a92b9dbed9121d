// Hover of a thermocouple definition and the lines of a thermocouple channel's hover. The Seebeck
// coefficient is the derivative of the ITS-90 reference function (NIST Monograph 175); class
// tolerances from IEC 60584-1 (tolerance.ts).
import type { Analysis } from '../../analysis/result';
import type { ChannelResult } from '../../analysis/types';
import * as f from '../../analysis/figures';
import { emf, referenceRange, seebeck } from './its90';
import { classRange } from './tolerance';
import { boardSpanK, classTolK, coldJunctionErrorK, detectAmps, detectVolts, nominalColdJunctionK } from './model';
import { coldJunctionChannel, tcChannel, type ThermocoupleDef } from './types';

const ZERO_C = 273.15;

/** Safety cautions where heat and mains meet (shown in hovers and under reports). */
export const TC_CAUTIONS = [
  'Caution (thermocouple): a thermocouple in a furnace, kiln or heater may touch live heating elements or mains-referenced metal; isolate the measuring circuit from mains (an isolated amplifier or supply, rated creepage and clearance) as the applicable safety standards and local codes require.',
  'Caution (thermocouple): the heater needs an independent over-temperature cut-out with its own sensor, acting on the supply directly; a failed thermocouple reads low or drifts and this channel must not be the only protection.',
] as const;

const uv = (v: number) => f.formatSI(v, 'V');

export function tcHover(a: Analysis, s: ThermocoupleDef): string {
  const t = s.params.type;
  const table = referenceRange(t);
  const cls = s.toleranceClass;
  const cr = cls ? classRange(t, cls) : null;
  const classLine = !cls
    ? 'No IEC 60584-1 class stated'
    : cr
      ? `IEC 60584-1 class ${cls}: ±${f.trimNumber(classTolK(s, Math.max(cr.lowK, Math.min(cr.highK, 25 + ZERO_C))), 3)} K near room temperature, ±${f.trimNumber(classTolK(s, cr.highK), 3)} K at ${f.kelvinToCelsius(cr.highK)}; given for ${f.kelvinToCelsius(cr.lowK)} .. ${f.kelvinToCelsius(cr.highK)}`
      : `IEC 60584-1 gives type ${t} no class ${cls}`;
  const seebeckAt = [0, 100, 500, 1000].map((c) => c + ZERO_C).filter((k) => k >= table.lowK && k <= table.highK);
  const users = a.channels.filter((r) => r.channel.sensor.name === s.name);
  return [
    `**thermocouple ${s.name}**: type ${t}${cls ? `, class ${cls}` : ''}, ${uv(seebeck(t, 25 + ZERO_C))}/K at 25 °C`,
    `ITS-90 reference function (NIST Monograph 175): ${f.kelvinToCelsius(table.lowK)} .. ${f.kelvinToCelsius(table.highK)}, ${uv(emf(t, table.highK))} at the top`,
    `Seebeck coefficient: ${seebeckAt.map((k) => `${uv(seebeck(t, k))}/K at ${f.kelvinToCelsius(k)}`).join(', ')}`,
    classLine,
    `Rated ${f.kelvinToCelsius(s.ratedLowK)} .. ${f.kelvinToCelsius(s.ratedHighK)}`,
    users.length ? `Used by ${users.map((r) => `\`${r.channel.name}\` (cold junction \`${coldJunctionChannel(r.channel).name}\`)`).join(', ')}` : 'Used by no analysed channel in this file',
    ...TC_CAUTIONS,
  ].join('\n\n');
}

export function tcChannelLines(r: ChannelResult): string[] {
  const c = r.channel;
  const s = c.sensor as ThermocoupleDef;
  const t = tcChannel(c);
  const cj = coldJunctionChannel(c);
  const lsb = r.summary.lsbVolts;
  const g = c.amplifier?.gain ?? 1;
  const uvPerCount = lsb / g;
  const seebeckMin = Math.min(seebeck(s.params.type, c.lowK), seebeck(s.params.type, c.highK), seebeck(s.params.type, (c.lowK + c.highK) / 2));
  const out = [
    `Thermocouple input: **${f.trimNumber(uvPerCount * 1e6, 4)} µV per count** at the thermocouple (1 LSB ${f.volts(lsb)} / gain ${f.trimNumber(g, 4)}); the EMF over the range is ${uv(r.summary.voltsMin / g)} .. ${uv(r.summary.voltsMax / g)} referred to the input`,
    `Cold junction: channel \`${cj.name}\` (${cj.sensor.kind} \`${cj.sensor.name}\`, ${f.kelvinToCelsius(cj.lowK)} .. ${f.kelvinToCelsius(cj.highK)}), taken at ${f.kelvinToCelsius(nominalColdJunctionK(c))} for these figures; its own worst case ±${f.kelvinDelta(coldJunctionErrorK(c))} and the isothermal difference ±${f.kelvinDelta(t.isothermalK)} enter the budget`,
    `Amplifier: V_adc = ${f.trimNumber(g, 4)}${c.amplifier?.gainTolerance ? ` (± ${f.percent(c.amplifier.gainTolerance)})` : ''} × (E(T) − E(T_cj) + V_detect)${c.amplifier?.offsetVolts ? ` ${c.amplifier.offsetVolts < 0 ? '−' : '+'} ${f.volts(Math.abs(c.amplifier.offsetVolts))}` : ''}; input offset ±${uv(t.inputOffsetVolts)}, drift ±${uv(t.offsetDriftVoltsPerK)}/K over ±${f.kelvinDelta(boardSpanK(c))} of board${t.swing ? `; output swing ${f.volts(t.swing.lowV)} .. ${f.volts(t.swing.highV)}` : ''}`,
    `Open detection: ${c.bias.kind === 'current' ? 'burnout current' : 'pull-up'} of ${f.amps(detectAmps(c))} through the ${f.ohms(t.loopOhms)} loop adds ${uv(detectVolts(c))} (${f.kelvinDelta(detectVolts(c) / seebeckMin)} at the least sensitive point; the conversion takes it off)`,
  ];
  return out;
}
