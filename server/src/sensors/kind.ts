// The one interface every sensor kind implements. Everything that differs between kinds lives in
// the kind's folder (server/src/sensors/<kind>/) behind these members; sensors/registry.ts lists
// the kinds. Outside those folders no code names a kind (tests/unit/engine/kind-names.test.ts).
// Physics stays in server/src/physics/ (pure functions with their published sources); a kind's
// modules call it and add what the rest of the engine asks of a sensor.
//
// A kind that needs more is given an optional member here and its one caller, not a branch on its
// name. The thermocouple (sensors/thermocouple/) added `channelBlockFields` and `readChannel` (its
// own channel fields, among them the cold junction as a reference to another channel of the spec,
// read by resolve.ts and kept in ChannelDef.linked), `channelContributors` / `perturbChannel` (its
// amplifier, isothermal and cold-junction spreads) and `cautions`.
import type { Analysis } from '../analysis/result';
import type { ChannelResult } from '../analysis/types';
import type { SensedPoint } from '../analysis/sense';
import type { CheckContext } from '../checks/context';
import type { FitResult } from '../calibration/fit';
import type { BlockReader } from '../model/block-reader';
import type { BlockSpec, FieldSpec } from '../model/schema';
import type { Contributor } from '../analysis/budget-types';
import type { BiasDef, ChannelDef, DefBase, SensorDef } from '../model/types';
import type { FaultVolts } from '../analysis/sensor-faults';
import type { CompensatedInput, ConversionContext } from './conversion';

/** A board-to-board spread of the element, as an error-budget contributor (relative half-width). */
export interface ElementContributor {
  id: string;
  label: string;
  amount: number;
}

/** Temperature error from the element's own spread, before and after a one-point calibration. */
export interface SensorSpread {
  /** Largest |error| over the range and every corner, K. */
  beforeK: number;
  /** The same after removing each corner's error at the range centre (one-point calibration), K. */
  afterOnePointK: number;
  /** What the figure covers, for the report. */
  basis: string;
}

export type ChannelCheck = (ctx: CheckContext) => void;

export interface SensorKind<S extends SensorDef = SensorDef> {
  /** The block keyword, also the `kind` of its definitions. */
  readonly name: string;
  /** The name with its article, for messages: "a junction", "an rtd". */
  readonly a: string;
  /** Its block in the language: fields with forms, defaults, docs, examples and the template completion and snippets write (model/schema.ts). */
  readonly block: BlockSpec;
  /** The noun of its rated range in messages: "rated junction range", "rated range". */
  readonly ratedRange: string;

  // ---- reading (model/resolve.ts)
  /** Reads its block; reports through `r.sink` with precise ranges; null when the block has errors. */
  read(r: BlockReader, base: DefBase): S | null;
  /** Channel fields beyond the common ones that only some kinds take (gain, offset, wiring). */
  readonly channelFields: readonly string[];
  /** Whether the two-current (delta-VBE) bias applies. */
  readonly twoCurrent: boolean;
  /** Why a channel's bias does not suit this kind (reported at the bias), or null. */
  biasProblem(s: S, bias: BiasDef): string | null;
  /** Why the channel's range is beyond what the model handles (reported at the range), or null. */
  rangeProblem?(s: S, lowK: number, highK: number): string | null;
  /** Channel fields only this kind takes, added to the channel block (model/schema.ts); their names are in `channelFields` too. */
  readonly channelBlockFields?: readonly FieldSpec[];
  /**
   * Reads the kind's own channel fields (model/read-sensors.ts `readChannelExtras`): the object
   * becomes `ChannelDef.kindFields`; null when they have errors (reported with precise ranges).
   * `at.channel(field)` reads a field naming another channel of the spec (model/resolve.ts: cycles
   * refused); what it gives is kept in `ChannelDef.linked` under the field's name.
   */
  readChannel?(r: BlockReader, at: KindChannelReading<S>): object | null;

  // ---- the model (analysis/)
  /** What the ADC sees at one temperature: the forward model of the whole channel. */
  sense(c: ChannelDef, kelvin: number): SensedPoint;
  /** Exact inverse in closed form: kelvin at which the sensed voltage is `volts` (NaN when none). Absent: a bracketing search on sense(). */
  kelvinAtVolts?(c: ChannelDef, volts: number): number;
  /** A resistive element: its resistance and dR/dT at a temperature. */
  element?: { at(s: S, kelvin: number): { ohms: number; slope: number } };

  // ---- error budget and comparison (budget/, compare/)
  /** The element's own spreads as board contributors (ids unique to the kind), amount > 0 only. */
  contributors(s: S): ElementContributor[];
  /** The element with drawn relative errors by contributor id (absent ids stay nominal). */
  perturb(s: S, draws: ReadonlyMap<string, number>): S;
  /** Board contributors of the kind's own channel fields (ids unique to the kind; budget/contributors.ts). */
  channelContributors?(c: ChannelDef): Contributor[];
  /** The channel with those contributors' draws (d = draw × amount) applied (budget/contributors.ts `perturb`). */
  perturbChannel?(c: ChannelDef, draws: ReadonlyMap<string, number>): ChannelDef;
  /** Element-only error for the comparison when the budget is not available; absent: none. */
  sensorSpread?(c: ChannelDef): SensorSpread | null;
  /** Largest tolerance of the element's stated class over the range, K, for the comparison. */
  classToleranceK?(c: ChannelDef): number | null;
  /** Kind-specific inputs of the JSON report (base SI units). */
  reportInputs?(c: ChannelDef): Record<string, unknown>;
  /** The ADC pin's voltage with the sensor open and shorted (analysis/sensor-faults.ts turns them into codes). */
  faults(c: ChannelDef): FaultVolts[];
  /** Fit of the channel's `measured` points, or null when there are none (calibration/fit.ts); absent: the points are not used. */
  fit?(c: ChannelDef): FitResult | null;
  /** Without a fit: the fields that state the part's own values instead of measured points ("r0 and the class"). */
  readonly ownValues?: string;

  // ---- checks (checks/index.ts): `first` run before the common ones (bias rules the others defer to), `last` after them
  readonly checks: { readonly first: readonly ChannelCheck[]; readonly last: readonly ChannelCheck[] };

  // ---- editor (features/)
  /** Markdown hover of a definition. */
  hover(a: Analysis, s: S): string;
  /** Extra lines of a channel's hover (its parts beyond bias and ADC). */
  channelHoverLines?(r: ChannelResult): string[];
  /** Extra lines of a channel's `bias` hover (the junction's current range). */
  biasHoverLines?(r: ChannelResult): string[];
  /** One line for completion of a `sensor = ` value. */
  summary(s: S): string;
  // ---- generated code (codegen/channel-input.ts)
  /**
   * The generator's input for a channel whose conversion takes a second input besides the ADC
   * code (a thermocouple's cold-junction temperature from another channel's generated function;
   * codegen/compensated.ts designs it); absent: a function of the code alone. Throws
   * CodegenInputError (sensors/conversion.ts) naming the field and the range it takes.
   */
  conversionInput?(r: ChannelResult, ctx: ConversionContext): CompensatedInput;
  /** Safety cautions of the kind, shown in its hovers and under reports of its channels (report/caution.ts). */
  readonly cautions?: readonly string[];
}

/** What a kind's `readChannel` is given besides the channel block's reader. */
export interface KindChannelReading<S extends SensorDef = SensorDef> {
  sensor: S;
  bias: BiasDef | null;
  range: { low: number; high: number } | null;
  /** The channel a field names, read first; null (reported) when it is missing, wrong or in a cycle. */
  channel(field: string): ChannelDef | null;
}
