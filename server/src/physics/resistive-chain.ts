// From a resistive sensor's resistance to the voltage at the ADC pin, and back (closed form).
// Excitation: a constant current I (V = I Rm), or a divider with a fixed resistor Rf from a supply Vs,
// the fixed resistor above the sensor (V = Vs Rm/(Rf + Rm)) or below it (V = Vs Rf/(Rf + Rm)); Rm is
// the sensor plus the lead resistance left uncompensated by the wiring. Then an optional amplifier,
// V_adc = gain V + offset. Ohm's law and the unloaded divider; no source for these beyond that.

export type Excitation =
  | { kind: 'current'; amps: number }
  /** `above`: the fixed resistor sits between the supply and the ADC node, the sensor to ground. */
  | { kind: 'divider'; ohms: number; supply: number; position: 'above' | 'below' };

export interface ResistiveChain {
  excitation: Excitation;
  /** Lead resistance in series with the sensor that the wiring does not cancel, ohm (2 wires: both leads). */
  leadOhms: number;
  gain: number;
  offsetVolts: number;
  /**
   * Supply used for the sensed voltage: the ADC reference when the reading is ratiometric (the code
   * is then V/Vref = the divider ratio, whatever the rail), else the divider's own supply.
   */
  dividerVolts?: number;
  /** true when an amplifier drives the ADC pin (its output is taken as a low-impedance source). */
  buffered: boolean;
}

export interface ChainPoint {
  volts: number;
  /** Current through the sensor, A. */
  amps: number;
  /** dV_adc/dT, V/K. */
  slope: number;
  /** Power in the sensor element itself (leads excluded), W. */
  powerW: number;
  /** Source impedance at the ADC pin, ohm. */
  sourceOhms: number;
}

/** The chain at a sensor resistance R (ohm) with slope dR/dT (ohm/K). */
export function chainAt(ch: ResistiveChain, ohms: number, dOhmsdK: number): ChainPoint {
  const rm = ohms + ch.leadOhms;
  const e = ch.excitation;
  let v: number;
  let dv: number;
  let amps: number;
  let node: number;
  if (e.kind === 'current') {
    amps = e.amps;
    v = e.amps * rm;
    dv = e.amps * dOhmsdK;
    node = rm;
  } else {
    const vs = ch.dividerVolts ?? e.supply;
    const sum = e.ohms + rm;
    amps = e.supply / sum;
    if (e.position === 'above') {
      v = (vs * rm) / sum;
      dv = ((vs * e.ohms) / (sum * sum)) * dOhmsdK;
    } else {
      v = (vs * e.ohms) / sum;
      dv = ((-vs * e.ohms) / (sum * sum)) * dOhmsdK;
    }
    node = (e.ohms * rm) / sum;
  }
  return {
    volts: ch.gain * v + ch.offsetVolts,
    amps,
    slope: ch.gain * dv,
    powerW: amps * amps * ohms,
    sourceOhms: ch.buffered ? 0 : node,
  };
}

/** The sensor resistance (leads removed) that gives `volts` at the ADC pin; NaN when none does. */
export function chainOhmsAt(ch: ResistiveChain, volts: number): number {
  const v = (volts - ch.offsetVolts) / ch.gain;
  const e = ch.excitation;
  let rm: number;
  if (e.kind === 'current') rm = v / e.amps;
  else {
    const vs = ch.dividerVolts ?? e.supply;
    if (!(v > 0 && v < vs)) return NaN;
    rm = e.position === 'above' ? (e.ohms * v) / (vs - v) : (e.ohms * (vs - v)) / v;
  }
  const r = rm - ch.leadOhms;
  return r > 0 ? r : NaN;
}

/**
 * Voltage at the ADC pin with the sensor open (R -> infinity) or shorted (R = 0, the uncompensated
 * leads still in series), before the converter's limits. null: an open sensor on a current source,
 * whose output then rises to its compliance voltage, which this model does not know. Limits of the
 * same Ohm's-law and divider equations as chainAt.
 */
export function chainFaultVolts(ch: ResistiveChain): { open: number | null; short: number } {
  const e = ch.excitation;
  const out = (v: number) => ch.gain * v + ch.offsetVolts;
  if (e.kind === 'current') return { open: null, short: out(e.amps * ch.leadOhms) };
  const vs = ch.dividerVolts ?? e.supply;
  const sum = e.ohms + ch.leadOhms;
  return e.position === 'above'
    ? { open: out(vs), short: out(sum > 0 ? (vs * ch.leadOhms) / sum : 0) }
    : { open: out(0), short: out(sum > 0 ? (vs * e.ohms) / sum : vs) };
}
