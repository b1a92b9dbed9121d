// The one place that asks a sensor model what the ADC sees at a temperature. Each sensor kind
// (junction today) answers with the same figures, so sweeps, checks, budgets and code generation
// work for every kind. Perturbed copies of a ChannelDef give tolerance corners.
import { operatingPoint, operatingPointAt, junctionAtTemperature } from '../physics/junction';
import type { Bias } from '../physics/types';
import type { BiasDef, ChannelDef } from '../model/types';

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

export function sense(c: ChannelDef, kelvin: number): SensedPoint {
  if (c.secondBias) return senseTwoCurrent(c, c.secondBias, kelvin);
  const bias = nominalBias(c);
  const op = operatingPoint(c.sensor.params, bias, kelvin);
  return {
    volts: op.volts,
    amps: op.amps,
    slope: op.slope,
    powerW: op.volts * op.amps,
    sourceOhms: bias.kind === 'resistor' ? parallel(bias.ohms, op.dynamicOhms) : op.dynamicOhms,
  };
}

function parallel(a: number, b: number): number {
  return (a * b) / (a + b);
}

/**
 * Two-current (delta-VBE) channel: the same junction read at two bias currents; the figure is
 * V(larger current) - V(smaller current), each from the exact operating point (BF, the "-1" term
 * and RS included). Ideally N*Vt*ln(I2/I1), proportional to absolute temperature.
 * amps, power and source impedance are those of the larger-current reading (the worse one).
 */
function senseTwoCurrent(c: ChannelDef, second: BiasDef, kelvin: number): SensedPoint {
  const j = junctionAtTemperature(c.sensor.params, kelvin);
  const b1 = nominalBias(c);
  const b2 = physicsBias(second);
  const p1 = operatingPointAt(j, b1);
  const p2 = operatingPointAt(j, b2);
  const [lo, hi, bHi] = p1.amps <= p2.amps ? [p1, p2, b2] : [p2, p1, b1];
  return {
    volts: hi.volts - lo.volts,
    amps: hi.amps,
    slope: hi.slope - lo.slope,
    powerW: hi.volts * hi.amps,
    sourceOhms: bHi.kind === 'resistor' ? parallel(bHi.ohms, hi.dynamicOhms) : hi.dynamicOhms,
  };
}
