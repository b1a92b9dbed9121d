// Hover of a junction definition: its SPICE parameters, a reference operating point, rated range,
// thermal resistance and the channels using it.
import type { Analysis } from '../../analysis/result';
import { operatingPoint } from './physics';
import { ZERO_CELSIUS_K } from '../../physics/constants';
import { formatSI, trimNumber } from '../../model/read-value';
import * as f from '../../analysis/figures';
import type { JunctionDef } from './types';
import type { ChannelResult } from '../../analysis/types';
import { currentRangeOf, insideCurrentRange } from './bias-window';

const ROOM_K = 25 + ZERO_CELSIUS_K;

export function junctionHover(a: Analysis, j: JunctionDef): string {
  const p = j.params;
  // A reference operating point, 10 µA at 25 °C, so parts can be compared at a glance.
  const op = operatingPoint(p, { kind: 'current', amps: 10e-6 }, ROOM_K);
  const users = f.channelsUsing(a, j.name, 'sensor').map((r) => `\`${r.channel.name}\``);
  return [
    `**junction ${j.name}** (${p.kind})`,
    `IS ${f.amps(p.IS)}${j.isTolerance ? ` ± ${f.percent(j.isTolerance)}` : ''}, N ${f.trimNumber(p.N, 4)}, EG ${f.trimNumber(p.EG, 4)} eV, XTI ${f.trimNumber(p.XTI, 4)}` +
      (p.kind === 'diode' ? '' : `, BF ${f.trimNumber(p.BF, 4)}, XTB ${f.trimNumber(p.XTB, 4)}`) +
      `, TNOM ${f.kelvinToCelsius(p.TNOM)}, RS ${f.ohms(p.RS)}`,
    `At 10 µA and 25 °C: ${f.volts(op.volts)}, slope ${f.slopeMv(op.slope)}`,
    `Rated ${f.kelvinToCelsius(j.ratedLowK)} .. ${f.kelvinToCelsius(j.ratedHighK)}; θJA ${f.trimNumber(j.thetaJA, 4)} K/W`,
    users.length ? `Used by ${users.join(', ')}` : 'Used by no channel in this file',
  ].join('\n\n');
}

/** One line for completion of a `sensor = ` value. */
export function junctionSummary(j: JunctionDef): string {
  return `${j.params.kind}, IS ${formatSI(j.params.IS, 'A')}, N ${trimNumber(j.params.N, 4)}`;
}

/** The bias hover's line on the current range (`current_window`), judged as bias-window.ts judges it. */
export function junctionBiasLines(r: ChannelResult): string[] {
  const inside = insideCurrentRange(r);
  return [`Current ${f.ampsSpan(r.summary.ampsMin, r.summary.ampsMax)}: ${inside ? 'inside' : '**outside**'} ${currentRangeOf(r.channel)}, set by \`current_window\``];
}
