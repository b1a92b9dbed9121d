// bias-current-low / bias-current-high: the bias current over the range against the sound window.
// Default window 1 µA .. 1 mA (common practice for small-signal junctions; see the catalogue).
import { operatingPoint } from './physics';
import { nearestE24 } from '../../analysis/eseries';
import type { ChannelDef } from '../../model/types';
import type { CheckContext } from '../../checks/context';
import { fmtA, fmtC, fmtOhm } from '../../checks/format';
import type { JunctionDef } from './types';

export function checkBiasWindow({ channel: c, result, sink, reported }: CheckContext): void {
  // The window is a junction rule; resistive sensors are judged on self-heating instead.
  if (reported.has('supply-too-low')) return;
  const { ampsMin, ampsMax } = result.summary;
  if (ampsMin >= c.windowLowA && ampsMax <= c.windowHighA) return;
  const { ampsMin: atMin, ampsMax: atMax } = result.summary.at;
  const suggestion = suggestResistor(c);
  const fix = suggestion ? `; a resistor of ${fmtOhm(suggestion.ohms)} (E24) gives ${fmtA(suggestion.ampsMin)} .. ${fmtA(suggestion.ampsMax)}` : '';
  const data = suggestion ? { suggestedOhms: suggestion.ohms } : undefined;
  if (ampsMin < c.windowLowA) {
    reported.add('bias-current-low');
    sink.report('bias-current-low', c.file, c.bias.span,
      `bias current falls to ${fmtA(ampsMin)} at ${fmtC(atMin.celsius)}, below the sound window's ${fmtA(c.windowLowA)} (leakage and noise dominate)${c.bias.kind === 'resistor' ? fix : `; raise the current to at least ${fmtA(c.windowLowA)}`}`, data);
  }
  if (ampsMax > c.windowHighA) {
    reported.add('bias-current-high');
    sink.report('bias-current-high', c.file, c.bias.span,
      `bias current reaches ${fmtA(ampsMax)} at ${fmtC(atMax.celsius)}, above the sound window's ${fmtA(c.windowHighA)} (self-heating and series-resistance error)${c.bias.kind === 'resistor' ? fix : `; lower the current to at most ${fmtA(c.windowHighA)}`}`, data);
  }
}

/**
 * The E24 resistor that centres the bias current in the window (geometric mean of its ends),
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
