// The one place that asks a sensor model what the ADC sees at a temperature. Each sensor kind
// (junction today) answers with the same figures, so sweeps, checks, budgets and code generation
// work for every kind. Perturbed copies of a ChannelDef give tolerance corners.
import { operatingPoint, operatingPointAt, junctionAtTemperature, sourceOhmsAt } from '../physics/junction';
import type { Bias } from '../physics/types';
import type { BiasDef, ChannelDef } from '../model/types';
import type { JunctionDef, RtdDef, ThermistorDef } from '../model/types';
import { shResistanceAt, shResistanceSlope } from '../physics/steinhart-hart';
import { cvdResistance, cvdSlope } from '../physics/callendar-van-dusen';
import { chainAt, type ResistiveChain } from '../physics/resistive-chain';

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

/** The nominal physics bias of each channel definition, made once (sweeps ask per point). */
const biasOf = new WeakMap<ChannelDef, Bias>();

/** What the ADC sees at one temperature. */
export function sense(c: ChannelDef, kelvin: number): SensedPoint {
  if (c.sensor.kind !== 'junction') return senseResistive(c, c.sensor, kelvin);
  if (c.secondBias) return senseTwoCurrent(c, c.secondBias, kelvin);
  let bias = biasOf.get(c);
  if (!bias) biasOf.set(c, (bias = nominalBias(c)));
  const op = operatingPoint(c.sensor.params, bias, kelvin);
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

// ---------------------------------------------------------------- resistive sensors (NTC, RTD)

/** Resistance of a thermistor or RTD element at a temperature, ohm, and its slope dR/dT, ohm/K. */
export function elementAt(s: ThermistorDef | RtdDef, kelvin: number): { ohms: number; slope: number } {
  if (s.kind === 'thermistor') {
    const k = s.params.scale ?? 1;
    return { ohms: k * shResistanceAt(s.params, kelvin), slope: k * shResistanceSlope(s.params, kelvin) };
  }
  const t = kelvin - 273.15;
  return { ohms: cvdResistance(s.params.R0, s.params, t), slope: cvdSlope(s.params.R0, s.params, t) };
}

/**
 * The path from a resistive element to the ADC pin: excitation, uncompensated leads (two wires:
 * both leads in series; three and four wires: cancelled, IEC 60751 connection drawings), amplifier.
 * A ratiometric reading scales the divider by the ADC reference, so the code is the divider ratio.
 */
export function resistiveChain(c: ChannelDef): ResistiveChain {
  const b = c.bias;
  const excitation: ResistiveChain['excitation'] = b.kind === 'current'
    ? { kind: 'current', amps: b.amps.value }
    : { kind: 'divider', ohms: b.ohms.value, supply: b.supply.value, position: b.kind === 'divider' ? b.position : 'above' };
  const w = c.wiring;
  return {
    excitation,
    leadOhms: w && w.wires === 2 ? 2 * w.leadOhms : 0,
    gain: c.amplifier?.gain ?? 1,
    offsetVolts: c.amplifier?.offsetVolts ?? 0,
    ...(c.ratiometric && b.kind !== 'current' ? { dividerVolts: c.adc.reference.value } : {}),
    buffered: c.amplifier !== undefined,
  };
}

function senseResistive(c: ChannelDef, s: ThermistorDef | RtdDef, kelvin: number): SensedPoint {
  const e = elementAt(s, kelvin);
  return chainAt(resistiveChain(c), e.ohms, e.slope);
}
