// The one place that asks a sensor model what the ADC sees at a temperature. Each sensor kind
// (junction today) answers with the same figures, so sweeps, checks, budgets and code generation
// work for every kind. Perturbed copies of a ChannelDef give tolerance corners.
import { operatingPoint } from '../physics/junction';
import type { Bias } from '../physics/types';
import type { ChannelDef } from '../model/types';

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

export function sense(c: ChannelDef, kelvin: number): SensedPoint {
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
