// Contract of the conversion-code generator. Pure data in, C text out: no file IO, no editor APIs.

export interface ConversionInput {
  /** Channel name from the spec; the generator derives a valid, unique C identifier from it. */
  channelName: string;
  /** Bits of the value converted (1..16): the ADC's, plus n when it is a decimated value of n extra bits. */
  bits: number;
  /** n when the value is the sum of 4^n readings shifted right by n (oversampling); 0 or absent: one reading. */
  oversamplingBits?: number;
  /** Inclusive in-range ADC codes (the channel's designed temperature range). */
  codeLow: number;
  codeHigh: number;
  /**
   * Exact model inverse, degC, at the centre of a code (code + 0.5 LSB). Accepts fractional codes.
   * Monotonic (rising or falling) on [codeLow, codeHigh], unless `anyShape`.
   */
  celsiusAtCode(code: number): number;
  /**
   * An intermediate function (a reference's part in a two-input conversion, codegen/compensated.ts),
   * which may rise and fall, such as a type B thermocouple's EMF over 0..50 degC: only piecewise
   * polynomials are designed (a table's interpolation takes its spans as unsigned).
   */
  anyShape?: boolean;
  /**
   * Sensor faults (open or shorted sensor or lead): codes at or below `faultBelow`, or at or above
   * `faultAbove`, return THSC_SENSOR_FAULT instead of a clamped status. Absent: no fault test on
   * that side. Must lie outside codeLow..codeHigh.
   */
  faultBelow?: number;
  faultAbove?: number;
  /** What auto favours among designs that meet the target (absent: balanced). */
  optimise?: 'size' | 'speed' | 'balanced';
  /** Fixed-point unit of the output: 100 => signed hundredths of a degC. */
  outputScale: number;
  /** degC, max error allowed vs the model over every in-range code (callers default it to 0.02). */
  errorTarget: number;
  /** 'line': one straight line over the range (the spec's `conversion = line`); its error is what it is, not held to errorTarget. */
  method: 'auto' | 'table' | 'polynomial' | 'line';
  calibration: {
    mode: 'none' | 'offset' | 'two-point';
    /** degC added after the conversion (offset and two-point modes). */
    offset?: number;
    /** Dimensionless slope correction (two-point mode), 0.5..2. */
    gain?: number;
    /** true: the trims live in a small struct the firmware can set at run time. */
    runtime: boolean;
  };
  /** Also emit a float function (uses float arithmetic but no libm). */
  floatVariant: boolean;
  /** Hash of the channel's spec text; written into the block markers. */
  specHash: string;
  /** Free text from the spec, written into a comment after sanitising. */
  note?: string;
  /** The sensor kind's safety cautions (sensors/kind.ts `cautions`), written into the block's comment. */
  cautions?: readonly string[];
  /** Put before every identifier of this channel (the spec's `code_prefix`); wins over GenerateOptions.prefix. */
  prefix?: string;
  /** A firmware filter to emit beside the conversion (codegen/filter.ts); absent: none. */
  filter?: import('./filter').CodeFilter;
  /** Time between the values the filter takes, s (for its comment). */
  samplePeriodS?: number;
}

export interface GeneratedChannel {
  /** C identifier prefix of everything emitted for this channel. */
  identifier: string;
  /** The block body (text between the channel's markers), as given to spliceGenerated. */
  code: string;
  /** Estimated linked flash bytes (data, code and library routines) on an 8-bit AVR (atmega328p) at -Os. */
  bytesEstimate: number;
  /** The same on a Cortex-M0 (arm-none-eabi-gcc, newlib-nano) at -Os. */
  bytesEstimateM0: number;
  /** Max |output - model| over every in-range code, degC, from simulating the exact C integer arithmetic. */
  maxErrorC: number;
  /** 'table' or 'polynomial' (the one chosen). */
  method: string;
  /** Table entries (table) or segments (polynomial). */
  entries: number;
  /** The in-range inputs in words: "codes 36..3379" (and the second input's range for a two-input conversion). */
  rangeText: string;
}

export interface GenerateOptions {
  /** File name without extension; used for the include guard of the header. */
  fileStem: string;
  /** true: emit the header (declarations); false/absent: the C source (definitions). */
  header?: boolean;
  /**
   * Put before every identifier generated for a channel (functions, types, tables, macros), so
   * that two specs with a channel of the same name link together: a C identifier of 1..32
   * characters starting with a letter. Absent: none.
   */
  prefix?: string;
  /**
   * Source only. false/absent: each block includes `<fileStem>.h` for its types and prototypes
   * (never repeats them, so a file that also includes the header compiles cleanly); true: each
   * block declares them itself (a block pasted into a file of the user's own).
   */
  selfContained?: boolean;
}

export interface GenerateResult {
  text: string;
  channels: GeneratedChannel[];
}

export interface SpliceBlock {
  /** Channel name as written in the spec (the marker carries it, encoded). */
  channel: string;
  hash: string;
  /** Block body: GeneratedChannel.code. */
  text: string;
}

export type SpliceResult = { ok: true; text: string } | { ok: false; message: string; offset: number };

export interface FoundBlock {
  channel: string;
  hash: string;
  /** UTF-16 offset of the first character of the begin marker line. */
  start: number;
  /** UTF-16 offset just past the end marker line (including its newline when present). */
  end: number;
  /** Offsets of the body between the marker lines. */
  bodyStart: number;
  bodyEnd: number;
}
