// Results of analysing one channel: the sweep and its summary, in base SI units.
import type { ChannelDef } from '../model/types';

export interface SweepPoint {
  celsius: number;
  kelvin: number;
  /** Voltage at the ADC input, V. */
  volts: number;
  /** Bias current through the junction, A. */
  amps: number;
  /** Ideal ADC code, floor(V / Vref * 2^bits), clamped to [0, 2^bits - 1]. */
  code: number;
  /** dV/dT, V/K. */
  slope: number;
  /** |dV/dT| in ADC counts per kelvin. */
  countsPerKelvin: number;
  /** Kelvin (= °C) per ADC count, the reciprocal. */
  celsiusPerCount: number;
  /** Temperature rise of the sensor over its surroundings from its own dissipation, K. */
  selfHeatingK: number;
  /** Source impedance seen by the ADC input, ohm. */
  sourceOhms: number;
}

export interface Nonlinearity {
  /** Largest deviation from the straight line through the two ends of the range, K. */
  endPointK: number;
  /** Largest deviation from the least-squares line T = a + b V over the sweep, K. */
  bestFitK: number;
  /** The least-squares line: T[°C] = intercept + slope * V. */
  fit: { interceptC: number; slopeCPerVolt: number };
}

export interface ChannelSummary {
  points: number;
  voltsMin: number;
  voltsMax: number;
  ampsMin: number;
  ampsMax: number;
  codeMin: number;
  codeMax: number;
  /** The point with the fewest counts per kelvin. */
  worst: SweepPoint;
  selfHeatingMaxK: number;
  sourceOhmsMax: number;
  nonlinearity: Nonlinearity;
  /** LSB size, V. */
  lsbVolts: number;
  /** The points where the extremes above are reached (the first such point of the sweep). */
  at: { voltsMin: SweepPoint; voltsMax: SweepPoint; ampsMin: SweepPoint; ampsMax: SweepPoint; selfHeatingMax: SweepPoint };
}

/** The sweep as columns (analysis/sweep.ts `SweepTable`); declared here so the types import no module that computes. */
export interface SweepColumns {
  readonly channel: ChannelDef;
  readonly kelvin: number[];
  readonly volts: Float64Array;
  readonly amps: Float64Array;
  readonly slope: Float64Array;
  readonly powerW: Float64Array;
  readonly sourceOhms: Float64Array;
  readonly length: number;
  point(i: number): SweepPoint;
  points(): SweepPoint[];
}

export interface ChannelResult {
  channel: ChannelDef;
  /** The sweep's points, made from `table` on first read (analysis/sweep.ts). */
  sweep: SweepPoint[];
  /** The sweep as columns. */
  table: SweepColumns;
  summary: ChannelSummary;
  /** Full error budget with Monte Carlo (budget/budget.ts), computed by analyse() on first read; absent when it could not be computed. */
  budget?: import('./budget-types').BudgetResult;
  /** Worst case alone on the same grid, computed by every analyse() for the accuracy check. */
  worstCaseBudget?: import('./budget-types').BudgetResult;
}
