// What the resistive kinds (thermistor, rtd) share: the path from the element to the ADC pin, and
// the forward model and closed-form inverse built on a kind's element curve R(T) and T(R).
import type { BiasDef, ChannelDef, SensorDef } from '../../model/types';
import type { SensedPoint } from '../../analysis/sense';
import { chainAt, chainOhmsAt, type ResistiveChain } from '../../physics/resistive-chain';
import { kindOf } from '../registry';
import { formatSI } from '../../model/read-value';

/** A resistive element's curve: R and dR/dT at a temperature, and the temperature of a resistance. */
export interface ElementCurve<S extends SensorDef> {
  at(s: S, kelvin: number): { ohms: number; slope: number };
  /** Kelvin at which the element has `ohms` (NaN when none). */
  kelvinAt(s: S, ohms: number): number;
}

/** Resistance of a resistive element at a temperature, ohm, and its slope dR/dT, ohm/K. */
export function elementAt(s: SensorDef, kelvin: number): { ohms: number; slope: number } {
  return kindOf(s).element!.at(s, kelvin);
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

/**
 * The forward model and exact inverse of a resistive kind from its element curve. The inverse is in
 * closed form: voltage -> sensor resistance (the excitation and the amplifier undone,
 * resistive-chain.ts), then resistance -> temperature by the kind's own curve. NaN when no
 * resistance fits.
 */
export function resistiveModel<S extends SensorDef>(curve: ElementCurve<S>) {
  return {
    element: { at: curve.at },
    sense(c: ChannelDef, kelvin: number): SensedPoint {
      const e = curve.at(c.sensor as S, kelvin);
      return chainAt(resistiveChain(c), e.ohms, e.slope);
    },
    kelvinAtVolts(c: ChannelDef, volts: number): number {
      const ohms = chainOhmsAt(resistiveChain(c), volts);
      if (!(ohms > 0)) return NaN;
      return curve.kelvinAt(c.sensor as S, ohms);
    },
  };
}

/** Channel fields only the resistive kinds take. */
export const RESISTIVE_CHANNEL_FIELDS = ['gain', 'offset', 'wiring'] as const;

/** A resistive element sits in a divider or takes a current; a bias resistor is the junction's form. */
export function resistiveBiasProblem(s: SensorDef, bias: BiasDef): string | null {
  if (bias.kind !== 'resistor') return null;
  const ohms = formatSI(bias.ohms.value, 'Ω').replace(' ', '');
  return `'${s.name}' is a ${s.kind}: write its bias as \`divider ${ohms} above from ${formatSI(bias.supply.value, 'V')}\` (or \`below\`), or \`current I\``;
}

/**
 * The element's resistance over the channel range must stay within 1 mΩ .. 1 TΩ (beyond that the
 * model and the arithmetic are meaningless); returns a message otherwise. `ohmsAt`: the element's
 * nominal curve.
 */
export function elementRangeProblem(s: SensorDef, ohmsAt: (k: number) => number, lowK: number, highK: number): string | null {
  const a = ohmsAt(lowK);
  const b = ohmsAt(highK);
  const ok = (v: number) => Number.isFinite(v) && v >= 1e-3 && v <= 1e12;
  if (ok(a) && ok(b)) return null;
  return `over the range '${s.name}' runs from ${formatSI(a, 'Ω')} to ${formatSI(b, 'Ω')}; the engine handles 1 mΩ to 1 TΩ: narrow the range or check the sensor's values`;
}
