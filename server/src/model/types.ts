// The resolved model: definitions with every value in base SI units and the spans they came from.
import type { Span } from '../syntax/ast';

/** A value with its relative tolerance (0 when none given) and where it was written. */
export interface Toleranced {
  value: number;
  /** Relative tolerance, e.g. 0.01 for ± 1 %. */
  tolerance: number;
  span: Span;
}

export interface DefBase {
  name: string;
  file: string;
  nameSpan: Span;
  span: Span;
  /** Span of each field's value (by canonical field name), for diagnostics and hovers. */
  fieldSpans: Record<string, Span>;
  /** Fields written in the spec (the others took defaults). */
  given: string[];
}

/**
 * What every sensor definition has; each kind's own definition (server/src/sensors/<kind>/types.ts)
 * extends it, and only that kind's modules read its other fields.
 */
export interface SensorDefBase extends DefBase {
  /** The kind's name (sensors/registry.ts). */
  kind: string;
  /** The model's parameters; `kind` names the model family (npn, ntc, platinum...). */
  params: { kind: string };
  ratedLowK: number;
  ratedHighK: number;
  /** Thermal resistance to ambient (1 / dissipation constant), K/W. */
  thetaJA: number;
}

export type SensorDef = SensorDefBase;

/** How the sensor's leads are wired (resistive sensors). */
export interface WiringDef {
  wires: 2 | 3 | 4;
  /** Resistance of one lead, ohm. */
  leadOhms: number;
  span: Span;
}

export interface AdcDef extends DefBase {
  kind: 'adc';
  bits: number;
  reference: Toleranced;
  maxSourceOhms: number | null;
  sampleFarads: number | null;
  /** Error-budget figures of the converter (absent = 0): offset and INL in LSB, gain error relative. */
  offsetLsb?: number;
  gainError?: number;
  inlLsb?: number;
  /** Noise at the input, LSB rms, or null when not stated. */
  noiseLsbRms?: number | null;
}

export type BiasDef =
  | { kind: 'resistor'; ohms: Toleranced; supply: Toleranced; span: Span }
  | { kind: 'current'; amps: Toleranced; span: Span }
  /** A fixed resistor and a resistive sensor across a supply; `above`: the resistor on the supply side. */
  | { kind: 'divider'; ohms: Toleranced; supply: Toleranced; position: 'above' | 'below'; span: Span };

export interface ChannelDef extends DefBase {
  kind: 'channel';
  sensor: SensorDef;
  adc: AdcDef;
  bias: BiasDef;
  lowK: number;
  highK: number;
  stepK: number;
  /** Required °C (= K) per count, or null when unchecked. */
  resolutionKPerCount: number | null;
  /** Accuracy target in K (half-width), or null. */
  accuracyK: number | null;
  thetaJA: number;
  conversion: 'table' | 'line';
  windowLowA: number;
  windowHighA: number;
  /** Two-current (delta-VBE) method: the second bias; the channel reads V(larger I) - V(smaller I). */
  secondBias?: BiasDef;
  /** Calibration done on each board (absent = none). */
  calibration?: CalibrationSpec;
  /** ADC codes measured on a real board at known temperatures (the spec's own, then its bench data's). */
  measured?: MeasuredPoint[];
  /** A CSV file of bench readings (`bench_data`); its rows join `measured` when the engine reads it. */
  benchData?: BenchDataRef;
  /** What was read from that file (set with the rows; absent when it was not read). */
  benchInfo?: BenchDataInfo;
  /** Uncertainty (half-width) of the reference thermometer a calibration compares with, K (absent: taken as exact). */
  calReferenceK?: number;
  /** Monte Carlo settings of the error budget (absent = defaults). */
  monteCarlo?: MonteCarloSpec;
  /** Options of the generated conversion code (absent: codegen/channel-input.ts CODE_DEFAULTS). */
  codegen?: CodegenSpec;
  /** Extra bits by oversampling and decimation (absent = 0). */
  oversamplingBits?: number;
  /** The ADC reference is the divider's supply: codes follow the divider ratio (absent: no). */
  ratiometric?: boolean;
  /** An amplifier before the ADC, V_adc = gain V + offset (absent: none); `gainTolerance` relative, present only when stated. */
  amplifier?: { gain: number; offsetVolts: number; gainTolerance?: number };
  /** Lead wiring of a resistive sensor (absent: leads not modelled). */
  wiring?: WiringDef;
  /** Channels with the same group are alternatives for one measurement (`thermoscribe compare`). */
  compareGroup?: string;
  /**
   * Other channels of the spec this channel reads, by the field naming each (a thermocouple's cold
   * junction): their content is part of this channel's, so what is kept for it follows them.
   */
  linked?: Record<string, ChannelDef>;
  /** The sensor kind's own channel fields, read by its `readChannel` (sensors/<kind>/types.ts says what). */
  kindFields?: object;
  /** How fast the channel follows and what it needs (read-budget-spec.ts); absent when no such field is given. */
  dynamics?: DynamicsSpec;
}

/**
 * The dynamics fields of a channel (`time_constant`, `sample_period`, `settling`, `ramp_lag`,
 * `noise_limit`), in SI units. Each is absent when not given; analysis/dynamics.ts says what is
 * missing for a figure.
 */
export interface DynamicsSpec {
  /** Thermal time constant of the sensor in its mounting, s, with its relative tolerance. */
  timeConstant?: { seconds: number; tolerance: number };
  /** Time between the values the firmware filter takes, s. */
  samplePeriodS?: number;
  /** Settle to within the accuracy within `seconds` after a step of `stepK` (absent: the whole range). */
  settling?: { seconds: number; stepK?: number };
  /** Lag of at most `lagK` while the medium ramps at `rampKPerS`. */
  rampLag?: { lagK: number; rampKPerS: number };
  /** Noise of the filtered reading, K rms, at most. */
  noiseLimitK?: number;
}

/** Fields `output`, `code_error`, `code_method`, `float_variant` of a channel. */
export interface CodegenSpec {
  /** Output units per degC: `output = 0.01 °C` gives 100 (signed hundredths of a degC). */
  outputScale: number;
  /** Largest error allowed between the generated code and the model, degC. */
  errorC: number;
  method: 'auto' | 'table' | 'polynomial';
  /** What auto favours (absent: balanced; left out when not written, so older spec hashes stay). */
  optimise?: 'size' | 'speed' | 'balanced';
  /** Also emit a float function. */
  floatVariant: boolean;
  /** `code_prefix`: put before every generated identifier of the channel (absent: none; left out when not written). */
  prefix?: string;
}

export interface CalibrationSpec {
  mode: 'none' | 'one-point' | 'two-point';
  /** Calibration temperatures, K (one for one-point, two for two-point). */
  kelvins: number[];
  span: Span;
}

export interface MeasuredPoint {
  kelvin: number;
  /** ADC code read at that temperature (a fractional code is an average of readings). */
  code: number;
  span: Span;
  /** The row of the bench data file it came from (model/bench-data.ts); absent for the spec's own points. */
  row?: number;
  /** The board of that row, when the file names boards. */
  board?: string;
}

/** The `bench_data` field: a file path (relative to the spec's folder) and an optional board to keep. */
export interface BenchDataRef {
  path: string;
  /** Only rows of this board (the file's `board` column). */
  board?: string;
  /** The path's span in the spec: where the file's problems are reported. */
  span: Span;
}

/** What a channel read from its bench data (on the channel after the engine attached it). */
export interface BenchDataInfo {
  /** The file's absolute path, as read. */
  file: string;
  /** Rows of readings in the file (after the header, comments and blank lines). */
  rows: number;
  /** Rows left out for a problem (each has its diagnostic). */
  skipped: number;
  /** Rows of other boards left out by the `board` filter. */
  otherBoards: number;
  /** The distinct boards of the rows used (empty without a board column). */
  boards: string[];
}


export interface MonteCarloSpec {
  runs: number;
  seed: number;
  distribution: 'uniform' | 'normal';
}
