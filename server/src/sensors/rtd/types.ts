// The rtd's definition: a platinum element on the Callendar-Van Dusen curve.
import type { SensorDefBase, Toleranced } from '../../model/types';

/** A platinum resistance thermometer (Callendar-Van Dusen). */
export interface RtdDef extends SensorDefBase {
  kind: 'rtd';
  params: RtdParams;
  /** R0 with its tolerance. */
  r0: Toleranced;
  /** IEC 60751 tolerance class, or null when not stated. */
  toleranceClass: 'AA' | 'A' | 'B' | 'C' | null;
  /** How the element is built, when stated (`element = film|wire`); null: assume film. */
  element: 'film' | 'wire' | null;
}

export interface RtdParams {
  kind: 'platinum';
  /** Resistance at 0 °C, ohm. */
  R0: number;
  /** Callendar-Van Dusen coefficients (IEC 60751 by default). */
  A: number;
  B: number;
  C: number;
}
