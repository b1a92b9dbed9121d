// The thermocouple channel's forward model, its exact inverse, and its spreads for the error budget.
//
// Model (the thermocouple law of intermediate temperatures with the ITS-90 reference functions,
// NIST Monograph 175: the EMF of a thermocouple between T_hot and T_cj is E(T_hot) − E(T_cj), E
// the reference function with its reference junction at 0 °C):
//   V_in  = E(T_hot) − E(T_terminals) + V_detect + V_os
//   V_adc = gain × V_in + offset                       (the channel's `gain` and `offset`)
// T_terminals is the cold-junction temperature; nominally `nominalColdJunctionK` (25 °C, the usual
// datasheet reference temperature, clamped into the cold-junction channel's range: a rule of ours,
// common practice, no source). On a simulated board the terminals sit off the cold-junction
// channel's reading by that channel's own error and the isothermal difference (`terminalShiftK`).
// V_detect is the open-detection current (the channel's bias) through the loop resistance: a
// burnout current I gives I × R_loop; a pull-up R from V gives V × R_loop / (R + R_loop) (the far
// leg of the loop at the amplifier's 0 V reference and no input current: our assumption). V_os is
// the amplifier's input offset (0 nominally; drawn in the budget).
import type { SensedPoint } from '../../analysis/sense';
import type { Contributor } from '../../analysis/budget-types';
import type { ChannelDef } from '../../model/types';
import type { ElementContributor } from '../kind';
import { trimNumber, formatSI } from '../../model/read-value';
import { channelBudget } from '../../budget/budget';
import { emf, kelvinAtEmf, referenceRange, seebeck } from './its90';
import { classRange, toleranceK } from './tolerance';
import { coldJunctionChannel, tcChannel, type ThermocoupleDef } from './types';

const ZERO_C = 273.15;
const ROOM_K = 25 + ZERO_C;

/** The cold-junction temperature the sweep, figures and budget use: 25 °C within the cold-junction channel's range. */
export function nominalColdJunctionK(c: ChannelDef): number {
  const cj = coldJunctionChannel(c);
  return Math.min(cj.highK, Math.max(cj.lowK, ROOM_K));
}

/** The open-detection current through the loop, A (the channel's bias). */
export function detectAmps(c: ChannelDef): number {
  const b = c.bias;
  if (b.kind === 'current') return b.amps.value;
  return b.supply.value / (b.ohms.value + tcChannel(c).loopOhms);
}

/** The offset the open-detection current adds at the amplifier input, V. */
export function detectVolts(c: ChannelDef): number {
  return detectAmps(c) * tcChannel(c).loopOhms;
}

const gainOf = (c: ChannelDef) => c.amplifier?.gain ?? 1;
const offsetOf = (c: ChannelDef) => c.amplifier?.offsetVolts ?? 0;

/**
 * The hot junction's EMF with the class tolerance drawn: the reference function at T + draw ×
 * tolerance(T) (the tolerance at the nearest end of the class's range outside it). A board's
 * thermocouple then reads `draw × tolerance` off, as IEC 60584-1 bounds it.
 */
function hotEmf(s: ThermocoupleDef, kelvin: number): number {
  const d = s.classDraw ?? 0;
  if (d === 0 || !s.toleranceClass) return emf(s.params.type, kelvin);
  return emf(s.params.type, kelvin + d * classTolK(s, kelvin));
}

/** The class tolerance at a temperature, K; at the nearest end of the class's range outside it; 0 without a class. */
export function classTolK(s: ThermocoupleDef, kelvin: number): number {
  if (!s.toleranceClass) return 0;
  const r = classRange(s.params.type, s.toleranceClass);
  if (!r) return 0;
  return toleranceK(s.params.type, s.toleranceClass, Math.min(r.highK, Math.max(r.lowK, kelvin))) ?? 0;
}

export function tcSense(c: ChannelDef, kelvin: number): SensedPoint {
  const s = c.sensor as ThermocoupleDef;
  const t = tcChannel(c);
  const terminals = nominalColdJunctionK(c) + (t.terminalShiftK ?? 0);
  const vin = hotEmf(s, kelvin) - emf(s.params.type, terminals) + detectVolts(c) + (t.offsetDrawVolts ?? 0);
  const g = gainOf(c);
  return {
    volts: g * vin + offsetOf(c),
    amps: detectAmps(c),
    slope: g * seebeck(s.params.type, kelvin),
    // The detection current's heat in the loop is far below a milliwatt and spread along the wire.
    powerW: 0,
    // An amplifier drives the ADC pin (a low-impedance source); without one the ADC sees the loop.
    sourceOhms: c.amplifier ? 0 : t.loopOhms,
  };
}

/** Exact inverse at the nominal cold junction: the amplifier and the detection offset undone, then the reference function inverted. */
export function tcKelvinAtVolts(c: ChannelDef, volts: number): number {
  const s = c.sensor as ThermocoupleDef;
  return kelvinAtHotEmf(s, (volts - offsetOf(c)) / gainOf(c) - detectVolts(c) + emf(s.params.type, nominalColdJunctionK(c)));
}

function kelvinAtHotEmf(s: ThermocoupleDef, e: number): number {
  return kelvinAtEmf(s.params.type, e);
}

/** The channel range must lie inside the type's reference function (NIST Monograph 175). */
export function tcRangeProblem(s: ThermocoupleDef, lowK: number, highK: number): string | null {
  const r = referenceRange(s.params.type);
  if (lowK >= r.lowK - 1e-9 && highK <= r.highK + 1e-9) return null;
  return `the range leaves the type ${s.params.type} reference function of '${s.name}', ${trimNumber(r.lowK - ZERO_C, 5)} °C .. ${trimNumber(r.highK - ZERO_C, 5)} °C (NIST Monograph 175): narrow the range or choose a type whose table covers it`;
}

// ---- error budget

/** The class tolerance as a board spread: a draw of -1 .. 1 of the tolerance at each temperature. */
export function tcContributors(s: ThermocoupleDef): ElementContributor[] {
  if (!s.toleranceClass) return [];
  return [{ id: 'element-class', label: `IEC 60584-1 class ${s.toleranceClass} tolerance of type ${s.params.type}`, amount: 1 }];
}

export function perturbTc(s: ThermocoupleDef, d: ReadonlyMap<string, number>): ThermocoupleDef {
  const draw = d.get('element-class') ?? 0;
  return draw === 0 ? s : { ...s, classDraw: draw };
}

/** Largest distance of the board (the cold-junction channel's range) from 25 °C, K: what the offset drift acts over. */
export function boardSpanK(c: ChannelDef): number {
  const cj = coldJunctionChannel(c);
  return Math.max(Math.abs(cj.lowK - ROOM_K), Math.abs(cj.highK - ROOM_K));
}

const cjErrors = new WeakMap<ChannelDef, number>();

/**
 * The cold-junction channel's own worst-case error over its range, K, for its stated calibration
 * (its error budget's worst case, budget/budget.ts); a fact attached to that definition object.
 */
export function coldJunctionErrorK(c: ChannelDef): number {
  const cj = coldJunctionChannel(c);
  let k = cjErrors.get(cj);
  if (k === undefined) {
    try {
      k = channelBudget(cj, { runs: 0 }).stated.worstAbsK;
    } catch {
      k = NaN;
    }
    if (!Number.isFinite(k)) k = 0;
    cjErrors.set(cj, k);
  }
  return k;
}

/** The channel's own board contributors: amplifier input offset and drift, isothermal difference, the cold-junction channel's error. */
export function tcChannelContributors(c: ChannelDef): Contributor[] {
  const t = tcChannel(c);
  const cj = coldJunctionChannel(c);
  const drift = t.offsetDriftVoltsPerK * boardSpanK(c);
  const out: Contributor[] = [
    { id: 'tc-input-offset', label: `amplifier input offset ± ${formatSI(t.inputOffsetVolts, 'V')}`, scope: 'board', amount: t.inputOffsetVolts > 0 ? 1 : 0, unit: 'relative' },
    { id: 'tc-offset-drift', label: `input offset drift ± ${formatSI(t.offsetDriftVoltsPerK, 'V')}/K over ± ${trimNumber(boardSpanK(c), 3)} K of board temperature (± ${formatSI(drift, 'V')})`, scope: 'board', amount: drift > 0 ? 1 : 0, unit: 'relative' },
    { id: 'tc-isothermal', label: `isothermal difference ± ${trimNumber(t.isothermalK, 3)} K`, scope: 'board', amount: t.isothermalK, unit: 'K' },
    { id: 'tc-cold-junction', label: `cold-junction channel '${cj.name}' worst case ± ${trimNumber(coldJunctionErrorK(c), 3)} K`, scope: 'board', amount: coldJunctionErrorK(c), unit: 'K' },
  ];
  return out.filter((k) => k.amount > 0);
}

export function perturbTcChannel(c: ChannelDef, d: ReadonlyMap<string, number>): ChannelDef {
  const t = tcChannel(c);
  const offset = (d.get('tc-input-offset') ?? 0) * t.inputOffsetVolts + (d.get('tc-offset-drift') ?? 0) * t.offsetDriftVoltsPerK * boardSpanK(c);
  const shift = (d.get('tc-isothermal') ?? 0) + (d.get('tc-cold-junction') ?? 0);
  if (offset === 0 && shift === 0) return c;
  return { ...c, kindFields: { ...t, offsetDrawVolts: offset, terminalShiftK: shift } };
}

/** Largest class tolerance over the range, K (null without a class). */
export function tcClassToleranceK(c: ChannelDef): number | null {
  const s = c.sensor as ThermocoupleDef;
  if (!s.toleranceClass) return null;
  return Math.max(classTolK(s, c.lowK), classTolK(s, c.highK));
}

/** Kind-specific inputs of the JSON report (base SI units). */
export function tcReportInputs(c: ChannelDef): Record<string, unknown> {
  const s = c.sensor as ThermocoupleDef;
  const t = tcChannel(c);
  return {
    thermocouple: {
      type: s.params.type,
      toleranceClass: s.toleranceClass,
      coldJunctionChannel: coldJunctionChannel(c).name,
      nominalColdJunctionK: nominalColdJunctionK(c),
      inputVoltsPerCount: c.adc.reference.value / 2 ** c.adc.bits / gainOf(c),
      gain: gainOf(c),
      gainTolerance: c.amplifier?.gainTolerance ?? 0,
      outputOffsetVolts: offsetOf(c),
      inputOffsetVolts: t.inputOffsetVolts,
      offsetDriftVoltsPerK: t.offsetDriftVoltsPerK,
      outputSwing: t.swing,
      isothermalK: t.isothermalK,
      loopOhms: t.loopOhms,
      detectAmps: detectAmps(c),
      detectVolts: detectVolts(c),
      coldJunctionErrorK: coldJunctionErrorK(c),
    },
  };
}
