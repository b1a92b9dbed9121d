// The one place that asks a sensor model what the ADC sees at a temperature. Each sensor kind
// answers with the same figures (sensors/kind.ts `sense`), so sweeps, checks, budgets and code
// generation work for every kind. Perturbed copies of a ChannelDef give tolerance corners.
import type { Bias } from '../physics/types';
import type { BiasDef, ChannelDef } from '../model/types';
import { kindOf } from '../sensors/registry';

export interface SensedPoint {
  /** Voltage at the ADC input, V. */
  volts: number;
  /** Current through the sensor, A. */
  amps: number;
  /** dV/dT at the ADC input, V/K. */
  slope: number;
  /** Power dissipated in the sensor, W. */
  powerW: number;
  /** Source impedance seen by the ADC input, ohm. */
  sourceOhms: number;
}

export function nominalBias(c: ChannelDef): Bias {
  return c.bias.kind === 'current'
    ? { kind: 'current', amps: c.bias.amps.value }
    : { kind: 'resistor', ohms: c.bias.ohms.value, supply: c.bias.supply.value };
}

/** The physics bias of one bias definition (nominal values). */
export function physicsBias(b: BiasDef): Bias {
  return b.kind === 'current' ? { kind: 'current', amps: b.amps.value } : { kind: 'resistor', ohms: b.ohms.value, supply: b.supply.value };
}

/** What the ADC sees at one temperature: the sensor kind's forward model (sensors/<kind>/). */
export function sense(c: ChannelDef, kelvin: number): SensedPoint {
  return kindOf(c.sensor).sense(c, kelvin);
}

/** Columns `senseEach` fills, each as long as its temperatures; the ones left out are not computed into. */
export interface SensedColumns {
  volts?: Float64Array;
  amps?: Float64Array;
  slope?: Float64Array;
  powerW?: Float64Array;
  sourceOhms?: Float64Array;
}

/**
 * sense() at every temperature of `kelvin`, into the columns asked for. Every sweep of many
 * temperatures (the analysis sweep, the budget's grids and boards, its nominal inverse) runs this
 * one loop, so a cold process optimises the sensor's model once, here, instead of once inside
 * each caller (inlined into several, it was the larger part of a cold `check`'s compile time).
 */
export function senseEach(c: ChannelDef, kelvin: ArrayLike<number>, out: SensedColumns): void {
  const { volts, amps, slope, powerW, sourceOhms } = out;
  for (let i = 0; i < kelvin.length; i++) {
    const p = sense(c, kelvin[i]!);
    if (volts) volts[i] = p.volts;
    if (amps) amps[i] = p.amps;
    if (slope) slope[i] = p.slope;
    if (powerW) powerW[i] = p.powerW;
    if (sourceOhms) sourceOhms[i] = p.sourceOhms;
  }
}
