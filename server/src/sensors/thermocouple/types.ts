// The thermocouple's definition and its channel's own fields.
//
// What a thermocouple channel exposes (for the generated code, TC-CONTRACT.md): on its ChannelDef
//   sensor: ThermocoupleDef       the type letter (`params.type`) and IEC 60584-1 class
//   amplifier: { gain, offsetVolts, gainTolerance? }   V_adc = gain × V_in + offsetVolts (nominal)
//   adc: AdcDef                   bits, reference
//   lowK .. highK                 the hot-junction range
//   linked.cold_junction: ChannelDef   the cold-junction channel (its own sensor, ADC, range lowK .. highK)
//   kindFields: TcChannel         below; `tcChannel(c)` reads it typed
// and the exact model: V_in = E(T_hot) − E(T_cj) + V_detect (+ input offset on a simulated board),
// with E the ITS-90 reference function (its90.ts) and V_detect the open-detection current through
// the loop (model.ts `detectVolts`). `nominalColdJunctionK(c)` (model.ts) is the cold-junction
// temperature the sweep, figures and budget use.
import type { ChannelDef, SensorDefBase } from '../../model/types';
import type { TcType } from './its90';
import type { TcClass } from './tolerance';

/** A thermocouple of one of the IEC 60584-1 letter types. */
export interface ThermocoupleDef extends SensorDefBase {
  kind: 'thermocouple';
  /** `kind`: "type K" and so on (the model family, as messages and the report show it). */
  params: { kind: string; type: TcType };
  /** IEC 60584-1 tolerance class, or null when not stated. */
  toleranceClass: TcClass | null;
  /** A simulated board's draw of the class tolerance, -1 .. 1 (absent: the reference function). */
  classDraw?: number;
}

/** The thermocouple channel's own fields (ChannelDef.kindFields), base SI units. */
export interface TcChannel {
  /** Input offset voltage of the amplifier, half-width, V. */
  inputOffsetVolts: number;
  /** Its drift, half-width, V/K. */
  offsetDriftVoltsPerK: number;
  /** Output swing of the amplifier, V; null: rail to rail over the ADC's input span. */
  swing: { lowV: number; highV: number } | null;
  /** Largest temperature difference between the cold-junction sensor and the terminals, half-width, K. */
  isothermalK: number;
  /** Resistance of the thermocouple loop (both legs and any extension cable), ohm. */
  loopOhms: number;
  /** A simulated board's drawn input offset, V (absent: 0). */
  offsetDrawVolts?: number;
  /** A simulated board's drawn shift of the terminals from the cold-junction reading, K (absent: 0). */
  terminalShiftK?: number;
}

/** The field of a thermocouple channel that names its cold-junction channel. */
export const COLD_JUNCTION = 'cold_junction';

export function tcChannel(c: ChannelDef): TcChannel {
  return c.kindFields as TcChannel;
}

export function coldJunctionChannel(c: ChannelDef): ChannelDef {
  return c.linked![COLD_JUNCTION]!;
}
