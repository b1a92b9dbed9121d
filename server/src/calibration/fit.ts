// Fits of a channel's model to ADC codes measured on a real board at known temperatures: each
// sensor kind fits its own constants (sensors/<kind>/, `fit`); a kind without one is not fitted.
// The fitted channel (fittedChannel: every point but a flagged outlier) is what code generation
// and the error budget convert with.
import type { ChannelDef, MeasuredPoint } from '../model/types';
import { shown } from '../diagnostics/shown';
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
  /** The constants of `used` by name: the same as `parameters` unless an outlier was left out. */
  usedParameters: Record<string, number>;
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

/** One measured point's line in the residual tables (hover on the bench data, `report`). */
export interface ResidualRow {
  /** Where the point came from: `row 7` of the bench data, `board B2`, or `spec` for a `measured` point. */
  source: string;
  celsius: number;
  code: number;
  residualK: number;
  leaveOneOutK: number | null;
  toleranceK: number;
  outlier: boolean;
}

/** The residual of every measured point, in the order of `measured`, or null without a fit. */
export function residualRows(c: ChannelDef): { fit: FitResult; rows: ResidualRow[] } | null {
  const fit = fitMeasured(c);
  if (!fit || !c.measured) return null;
  const rows = fit.points.map((p, i) => {
    const m = c.measured![i]!;
    const source = m.row !== undefined ? `row ${m.row}${m.board !== undefined ? `, board ${m.board}` : ''}` : 'spec';
    return { source, celsius: p.celsius, code: p.code, residualK: p.residualK, leaveOneOutK: p.leaveOneOutK, toleranceK: p.toleranceK, outlier: fit.outlier === i };
  });
  return { fit, rows };
}

/** The stated outlier rule, for the tables' captions. */
export const OUTLIER_RULE = 'a point is flagged when the model fitted to the other points misses it by more than its tolerance (half the accuracy target, at least 2 LSB); only the worst such point is flagged and left out of the fit that the budget and the generated code use';

/** A measured point as messages name it: its row of bench data, when it came from there. */
export function pointSource(m: MeasuredPoint): string {
  return m.row !== undefined ? ` (bench data row ${m.row}${m.board !== undefined ? `, board ${shown(m.board)}` : ''})` : '';
}
