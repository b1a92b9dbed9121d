// Results of the error budget: per calibration mode and per temperature, the worst-case band,
// the Monte Carlo percentiles and each contributor's share. Temperatures in °C, errors in K.

export type CalMode = 'none' | 'one-point' | 'two-point';

/** A calibration mode with its temperatures, K. */
export interface CalSetting {
  mode: CalMode;
  kelvins: number[];
}

export interface Contributor {
  /**
   * Stable id: IS, N, BF, element-*, a kind's channel contributors (tc-*), bias, bias2, supply, reference, offset, gain, amp-gain, quantisation, inl,
   * and for the calibration readings cal-quantisation, cal-inl, cal-reference.
   */
  id: string;
  /** Human label with its tolerance, e.g. "IS spread ± 40 %". */
  label: string;
  /**
   * 'board': fixed for a built board (calibration can trim it); 'reading': enters every reading
   * (quantisation is new at each; INL is one fixed curve of the code per board in the Monte Carlo,
   * inl-profile.ts, and anywhere within its bound in the worst case); 'calibration': the errors of the
   * readings a calibration trim is fitted to (they reach every temperature through the trim).
   */
  scope: 'board' | 'reading' | 'calibration';
  /** Half-width of the tolerance: relative (0.01 = 1 %), LSB or K, see unit. */
  amount: number;
  unit: 'relative' | 'LSB' | 'K';
}

export interface ContributorShare {
  id: string;
  label: string;
  /** Largest one-at-a-time error swing over the range, K. */
  maxSwingK: number;
  /** Swing at the temperature of the largest worst-case error, K. */
  swingAtWorstK: number;
  /**
   * swingAtWorstK over the sum of every contributor's swing there, 0..1: the one-at-a-time swing as a
   * fraction of the summed swings (a linear share of the worst case, not of the variance).
   */
  share: number;
  /**
   * The Monte Carlo's variance share at the same temperature: the squared correlation of the boards'
   * error with this input's draw (board inputs, the reading's quantisation) or with its contribution
   * (INL, calibration readings), 0..1; for independent inputs and an error linear in them these sum
   * to 1 (for a linear model the squared correlation is the first-order sensitivity index: A. Saltelli
   * et al., "Global Sensitivity Analysis: The Primer", Wiley 2008, ch. 1, from memory; the remainder
   * is what the inputs do together). null without Monte Carlo, and for the calibration
   * readings' INL, which is one curve per board with the reading's and counted under 'inl'.
   */
  varianceShare: number | null;
}

export interface ModeBudget {
  setting: CalSetting;
  /** Per temperature of `celsius`: worst-case lower and upper error, K. */
  worstLow: number[];
  worstHigh: number[];
  /** Monte Carlo percentiles per temperature, K (empty when Monte Carlo did not run). */
  mc: { p1: number[]; p5: number[]; p50: number[]; p95: number[]; p99: number[]; min: number[]; max: number[] } | null;
  /**
   * Largest |error| of the worst case over the range, K, and where: the grid's worst point refined
   * between its neighbours (worst-case.ts), so it may lie between grid temperatures.
   */
  worstAbsK: number;
  worstAtCelsius: number;
  /** The grid temperature at which the shares are taken (the grid's worst), °C. */
  sharesAtCelsius: number;
  /** Largest |error| over the range at the 1st/99th Monte Carlo percentiles, K. */
  mcP99AbsK: number | null;
  shares: ContributorShare[];
  /** The contributor with the largest share at the worst temperature. */
  dominant: ContributorShare | null;
}

export interface BudgetResult {
  channel: string;
  /** Temperatures of the budget, °C. */
  celsius: number[];
  contributors: Contributor[];
  /** 'corners' (all 2^k board corners) or 'sensitivity' (one at a time, summed) when k > 12. */
  method: 'corners' | 'sensitivity';
  corners: number;
  monteCarlo: { runs: number; seed: number; distribution: 'uniform' | 'normal'; requestedRuns: number } | null;
  /** The spec's calibration first, then the other modes. */
  modes: ModeBudget[];
  /** The spec's calibration mode's budget (modes[0]). */
  stated: ModeBudget;
  accuracyK: number | null;
  /** Monte Carlo samples outside the worst-case band (0 unless the error is not monotonic in some input). */
  samplesOutsideWorstCase: number;
  notes: string[];
}

export interface BudgetOptions {
  /** Monte Carlo runs; 0 skips Monte Carlo. Default: the spec's, else 1000. */
  runs?: number;
  seed?: number;
  /** Temperatures of the budget (default: up to 49 across the range). */
  points?: number;
  /** Above this many board contributors use the sensitivity method (default 12). */
  maxCornerContributors?: number;
}

export interface CancellationToken {
  readonly isCancellationRequested: boolean;
}

export interface Progress {
  (done: number, total: number): void;
}
