// What a sensor kind hands the code generator when its conversion is not a function of the ADC
// code alone (codegen/compensated.ts designs it), and the error the generator and the kinds throw
// for input outside the documented ranges. It lives below the generator's layer so that a kind's
// own module (sensors/<kind>/codegen.ts) can build the input without importing the generator.

import type { ChannelDef, CodegenSpec } from '../model/types';

/** What a kind's `conversionInput` is given besides the channel (codegen/channel-input.ts fills it). */
export interface ConversionContext {
  /** The channel's spec hash, for the block markers. */
  specHash: string;
  /** Notes the generator writes into the header comment (the spec file, the channel). */
  notes: string[];
  /**
   * Any channel's code options as the generator resolves them (the kind asks for its own and for
   * the channels it reads, such as its cold-junction channel). `errorC` is undefined when the spec
   * states none: the kind then picks its own default.
   */
  options(c: ChannelDef): Pick<CodegenSpec, 'outputScale' | 'method' | 'floatVariant'> & { errorC: number | undefined; optimise: NonNullable<CodegenSpec['optimise']> };
}

/**
 * A two-input conversion: the sensor's signal q is linear in the ADC code, a second integer input
 * (a reference reading, e.g. the temperature another channel's generated function returns) adds
 * r(v) to it, and the temperature is a rising function of the total.
 */
export interface CompensatedInput {
  channelName: string;
  /** ADC bits, 1..16. */
  bits: number;
  /** The sensor's signal at the centre of a code: qPerCode * (code + 0.5) + qAtZero (qPerCode > 0). */
  qPerCode: number;
  qAtZero: number;
  /** Name and unit of q for the header comment ("thermocouple EMF", "uV"). */
  qName: string;
  qUnit: string;
  /** q of the total (signal + r) at the cold and hot ends of the designed range, qLow < qHigh. */
  qLow: number;
  qHigh: number;
  /** Exact model: degC at total q, rising with q on [qLow, qHigh]. */
  celsiusAtQ(q: number): number;
  compensation: {
    /** C parameter name. */
    param: string;
    /** Lines for the header comment: what to pass and where it comes from. */
    describe: string[];
    /** Integer range the conversion is designed for, inclusive, in the input's own units. */
    low: number;
    high: number;
    /** Units per degC of the input (for comments and errors). */
    scale: number;
    /** Width of the C parameter: the type the producing function returns. */
    bits: 16 | 32;
    /** q added by the reference at input value v (same unit as q); finite over low..high. */
    qAt(v: number): number;
  };
  /** Codes at or below / at or above: THSC_SENSOR_FAULT (e.g. an open sensor's code). */
  faultBelow?: number;
  faultAbove?: number;
  outputScale: number;
  /** degC, max error vs the exact model claimed and met over every in-range code and reference value. */
  errorTarget: number;
  method: CodegenSpec['method'];
  optimise?: CodegenSpec['optimise'];
  specHash: string;
  note?: string;
  /** The sensor kind's safety cautions, written into the block's comment. */
  cautions?: readonly string[];
}

/** Thrown by generateC for input outside the documented ranges; `field` names the offending input. */
/** The spec's words for a generator input: messages speak of the spec, not of the generator's fields. */
const SPEC_WORDS: Record<string, string> = {
  celsiusAtCode: 'conversion',
  bits: 'ADC bits',
  oversamplingBits: 'oversampling',
  outputScale: 'output',
  errorTarget: 'code_error',
  method: 'code_method',
  'calibration.mode': 'calibration',
  'calibration.offset': 'calibration',
  'calibration.gain': 'calibration',
  codeLow: 'ADC code range',
  codeHigh: 'ADC code range',
  prefix: 'code_prefix',
  filter: 'noise_limit',
};

export class CodegenInputError extends Error {
  constructor(
    readonly channel: string,
    readonly field: string,
    message: string,
  ) {
    super(`channel '${channel}': ${SPEC_WORDS[field] ?? field}: ${message}`);
    this.name = 'CodegenInputError';
  }
}
