// Calibration trims from readings taken at known temperatures, in the form the generated code
// applies them (codegen/types.ts ConversionInput.calibration): reported' = gain * reported + offset,
// in °C. One point: offset only (reported' = reported + (true - reported at the point)). Two points:
// the straight line through both points (true = gain * reported + offset at each).
import { ZERO_CELSIUS_K } from '../physics/constants';

export interface Trim {
  mode: 'none' | 'offset' | 'two-point';
  /** °C added after the gain. */
  offset: number;
  /** Dimensionless gain on the reported °C value. */
  gain: number;
}

export interface CalReading {
  /** Reference temperature, K. */
  trueK: number;
  /** Temperature the uncalibrated firmware reports there, K. */
  reportedK: number;
}

export const NO_TRIM: Trim = { mode: 'none', offset: 0, gain: 1 };

export function trimFrom(readings: CalReading[]): Trim {
  if (readings.length === 0) return NO_TRIM;
  const c = (k: number) => k - ZERO_CELSIUS_K;
  if (readings.length === 1) {
    const r = readings[0]!;
    return { mode: 'offset', offset: c(r.trueK) - c(r.reportedK), gain: 1 };
  }
  const [a, b] = readings as [CalReading, CalReading];
  const dr = b.reportedK - a.reportedK;
  // Reported temperatures that do not move between the points: no gain can be fitted; offset only.
  if (!(Math.abs(dr) > 1e-9)) return { mode: 'offset', offset: c(a.trueK) - c(a.reportedK), gain: 1 };
  const gain = (b.trueK - a.trueK) / dr;
  // Fields in NO_TRIM's order in every trim: one hidden class (the budget makes thousands).
  return { mode: 'two-point', offset: c(a.trueK) - gain * c(a.reportedK), gain };
}

/** A reported temperature after the trim, K. */
export function applyTrimK(t: Trim, reportedK: number): number {
  return t.gain * (reportedK - ZERO_CELSIUS_K) + t.offset + ZERO_CELSIUS_K;
}
