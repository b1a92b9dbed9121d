// Fits of a channel's model to ADC codes measured on a real board at known temperatures: each
// sensor kind fits its own constants (sensors/<kind>/, `fit`); a kind without one is not fitted.
// The fitted channel (fittedChannel: every point but a flagged outlier) is what code generation
// and the error budget convert with.
import type { ChannelDef } from '../model/types';
import { kindOf } from '../sensors/registry';

export interface FitPoint {
  celsius: number;
  code: number;
  /** Temperature the fitted model reports for this code minus the reference temperature, K. */
  residualK: number;
  /** Same, with the model fitted to the other points only (null when they cannot fit it). */
  leaveOneOutK: number | null;
  /** Largest leave-one-out residual accepted for this point, K. */
  toleranceK: number;
}

export interface FitResult {
  /** The channel with the fitted constants. */
  channel: ChannelDef;
  /** The fitted constants by name (a junction: IS, N). */
  parameters: Record<string, number>;
  points: FitPoint[];
  rmsK: number;
  /** Largest residual a point may show before it is called an outlier, K. */
  toleranceK: number;
  /** Index of the point that disagrees with the others, or null. */
  outlier: number | null;
  /**
   * The channel fitted to every point but the outlier: what code generation and the error budget
   * use (the same as `channel` when no point is an outlier).
   */
  used: ChannelDef;
}

/** Fit of the channel's measured points, or null when there are none or its kind fits none. */
export function fitMeasured(c: ChannelDef): FitResult | null {
  if (!c.measured || c.measured.length === 0) return null;
  return kindOf(c.sensor).fit?.(c) ?? null;
}

/** The channel with its measured constants fitted (for code generation); the channel itself when nothing was measured. */
export function fittedChannel(c: ChannelDef): ChannelDef {
  return fitMeasured(c)?.used ?? c;
}
