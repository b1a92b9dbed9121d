// The junction channel's forward model: the exact operating point of the SPICE junction under its
// bias (sensors/junction/physics.ts), or for the two-current (delta-VBE) method the difference of two.
import { operatingPoint, operatingPointAt, junctionAtTemperature, sourceOhmsAt } from './physics';
import type { Bias } from '../../physics/types';
import type { BiasDef, ChannelDef } from '../../model/types';
import { nominalBias, physicsBias, type SensedPoint } from '../../analysis/sense';
import type { JunctionDef } from './types';

/** The nominal physics bias of each channel definition, made once (sweeps ask per point). */
const biasOf = new WeakMap<ChannelDef, Bias>();

/** What the ADC sees at one temperature. */
export function senseJunction(c: ChannelDef, kelvin: number): SensedPoint {
  if (c.secondBias) return senseTwoCurrent(c, c.secondBias, kelvin);
  let bias = biasOf.get(c);
  if (!bias) biasOf.set(c, (bias = nominalBias(c)));
  const op = operatingPoint((c.sensor as JunctionDef).params, bias, kelvin);
  return {
    volts: op.volts,
    amps: op.amps,
    slope: op.slope,
    powerW: op.volts * op.amps,
    sourceOhms: sourceOhmsAt(bias, op.dynamicOhms),
  };
}

/**
 * Two-current (delta-VBE) channel: the same junction read at two bias currents; the figure is
 * V(larger current) - V(smaller current), each from the exact operating point (BF, the "-1" term
 * and RS included). Ideally N*Vt*ln(I2/I1), proportional to absolute temperature.
 * amps, power and source impedance are those of the larger-current reading (the worse one).
 */
function senseTwoCurrent(c: ChannelDef, second: BiasDef, kelvin: number): SensedPoint {
  const j = junctionAtTemperature((c.sensor as JunctionDef).params, kelvin);
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
    sourceOhms: sourceOhmsAt(bHi, hi.dynamicOhms),
  };
}
