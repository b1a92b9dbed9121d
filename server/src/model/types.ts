// The resolved model: definitions with every value in base SI units and the spans they came from.
import type { Span } from '../syntax/ast';
import type { JunctionParams } from '../physics/types';

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

export interface JunctionDef extends DefBase {
  kind: 'junction';
  params: JunctionParams;
  /** Relative spread of IS when given (IS = 10 fA ± 50 %). */
  isTolerance: number;
  ratedLowK: number;
  ratedHighK: number;
  thetaJA: number;
}

export interface AdcDef extends DefBase {
  kind: 'adc';
  bits: number;
  reference: Toleranced;
  maxSourceOhms: number | null;
  sampleFarads: number | null;
}

export type BiasDef =
  | { kind: 'resistor'; ohms: Toleranced; supply: Toleranced; span: Span }
  | { kind: 'current'; amps: Toleranced; span: Span };

export interface ChannelDef extends DefBase {
  kind: 'channel';
  sensor: JunctionDef;
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
}

export type Definition = JunctionDef | AdcDef | ChannelDef;
