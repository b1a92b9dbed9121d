// The thermistor's definition: an NTC curve held in Steinhart-Hart form.
import type { SensorDefBase, Toleranced } from '../../model/types';

/** An NTC thermistor, always held in Steinhart-Hart form (the beta model is its C = 0 case). */
export interface ThermistorDef extends SensorDefBase {
  kind: 'thermistor';
  params: ThermistorParams;
  /** How the curve was given: beta and R25, three coefficients, or three measured points. */
  form: 'beta' | 'coefficients' | 'points';
  /** R25 with its tolerance (beta form), else the curve's own R at 25 °C with r_tolerance. */
  r25: Toleranced;
  /** Beta with its tolerance and the two temperatures it is defined between (beta form only). */
  beta: (Toleranced & { lowK: number; highK: number }) | null;
}

export interface ThermistorParams {
  kind: 'ntc';
  /** Steinhart-Hart coefficients: 1/T = A + B ln R + C (ln R)^3. */
  A: number;
  B: number;
  C: number;
  /** Resistance multiplier of a tolerance corner (absent: 1); the curve's own R is scaled by it. */
  scale?: number;
}
