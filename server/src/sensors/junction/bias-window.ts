// bias-current-low / bias-current-high: the bias current over the range against the channel's
// `current_window`, the current range where the junction law holds well (CURRENT_RANGE in the
// catalogue); by default 1 µA .. 1 mA (common practice for small-signal junctions; see the catalogue).
import { operatingPoint } from './physics';
import { nearestE24 } from '../../analysis/eseries';
import type { ChannelDef } from '../../model/types';
import type { CheckContext } from '../../checks/context';
import { fmtA, fmtC, fmtOhm } from '../../checks/format';
import { currentRangeText } from '../../diagnostics/catalogue';
import type { ChannelResult } from '../../analysis/types';
import type { JunctionDef } from './types';

/** Whether the bias current stays inside the channel's `current_window` over the whole range. */
export function insideCurrentRange(r: Pick<ChannelResult, 'channel' | 'summary'>): boolean {
  return r.summary.ampsMin >= r.channel.windowLowA && r.summary.ampsMax <= r.channel.windowHighA;
}

/** The channel's current range in words, with its figures. */
export function currentRangeOf(c: ChannelDef): string {
  return currentRangeText(fmtA(c.windowLowA), fmtA(c.windowHighA));
}

export function checkBiasWindow({ channel: c, result, sink, reported }: CheckContext): void {
  // The current range is a junction rule; resistive sensors are judged on self-heating instead.
  if (reported.has('supply-too-low')) return;
  if (insideCurrentRange({ channel: c, summary: result.summary })) return;
  const { ampsMin, ampsMax } = result.summary;
  const { ampsMin: atMin, ampsMax: atMax } = result.summary.at;
  const suggestion = suggestResistor(c);
  const fix = suggestion ? `; a resistor of ${fmtOhm(suggestion.ohms)} (E24) gives ${fmtA(suggestion.ampsMin)} .. ${fmtA(suggestion.ampsMax)}` : '';
  const data = suggestion ? { suggestedOhms: suggestion.ohms } : undefined;
  if (ampsMin < c.windowLowA) {
    reported.add('bias-current-low');
    sink.report('bias-current-low', c.file, c.bias.span,
      `bias current falls to ${fmtA(ampsMin)} at ${fmtC(atMin.celsius)}, below ${currentRangeOf(c)}: leakage and noise dominate${c.bias.kind === 'resistor' ? fix : `; raise the current to at least ${fmtA(c.windowLowA)}`}`, data);
  }
  if (ampsMax > c.windowHighA) {
    reported.add('bias-current-high');
    sink.report('bias-current-high', c.file, c.bias.span,
      `bias current reaches ${fmtA(ampsMax)} at ${fmtC(atMax.celsius)}, above ${currentRangeOf(c)}: self-heating and series-resistance error${c.bias.kind === 'resistor' ? fix : `; lower the current to at most ${fmtA(c.windowHighA)}`}`, data);
  }
}

/**
 * The E24 resistor that centres the bias current in the current range (geometric mean of its ends),
 * with the currents it gives at the two ends of the range; null when no resistor can.
 */
export function suggestResistor(c: ChannelDef): { ohms: number; ampsMin: number; ampsMax: number } | null {
  if (c.bias.kind !== 'resistor') return null;
  const p = (c.sensor as JunctionDef).params;
  const supply = c.bias.supply.value;
  const target = Math.sqrt(c.windowLowA * c.windowHighA);
  const mid = (c.lowK + c.highK) / 2;
  const vj = operatingPoint(p, { kind: 'current', amps: target }, mid).volts;
  if (!(supply > vj)) return null;
  const ohms = nearestE24((supply - vj) / target);
  const bias = { kind: 'resistor' as const, ohms, supply };
  const a = operatingPoint(p, bias, c.lowK).amps;
  const b = operatingPoint(p, bias, c.highK).amps;
  return { ohms, ampsMin: Math.min(a, b), ampsMax: Math.max(a, b) };
}
