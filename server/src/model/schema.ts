// The blocks of the spec language and the fields each takes: form, unit, domain, default, docs.
// The resolver, completion and hover all read this one table; the editor grammar, the snippets and
// docs/reference.md are generated from it (scripts/gen-docs.ts, model/language.ts). The adc and
// channel blocks are here; each sensor kind's block is in its folder, found through the registry.
import type { Dimension } from './units';
import { sensorKind, sensorKinds } from '../sensors/registry';
import { CURRENT_RANGE } from '../diagnostics/catalogue';

/** A block keyword: `adc`, `channel` or a sensor kind's name (sensors/registry.ts). */
export type BlockKind = string;

export type FieldForm =
  /**
   * Every quantity states its sound domain, in base SI units: wide enough for every real part, narrow
   * enough that no figure derived from it leaves the range of a double (common practice, no source).
   * Outside it the value gets an out-of-domain diagnostic naming the range.
   */
  | { form: 'quantity'; dimension: Dimension; tolerance?: boolean; integer?: boolean; min: number; minInclusive?: boolean; max: number; difference?: boolean }
  | { form: 'range'; dimension: Dimension }
  | { form: 'choice'; options: string[] }
  /** `targets`, when given, lists every kind accepted (the channel's sensor: every sensor kind). */
  | { form: 'ref'; target: BlockKind; targets?: BlockKind[] }
  | { form: 'bias' }
  | { form: 'resolution' }
  | { form: 'accuracy' }
  /** A field with a small phrase syntax of its own (calibration, measured points, Monte Carlo runs). */
  | { form: 'phrase'; syntax: string };

export interface FieldSpec {
  name: string;
  aliases?: string[];
  form: FieldForm;
  /** Default as spec text (documented); absent when the field is required. */
  defaultText?: string;
  doc: string;
  /** Example shown in completion. */
  example: string;
  /** No default, and the spec may leave it out (what that means is in `doc`). */
  optional?: boolean;
  /** One of several ways to give the same thing: the name of this field's way; one way is required. */
  alternative?: string;
  /** The fixed words of the value's phrase (`resistor`, `from`, ...), for highlighting. */
  words?: string[];
  /** For a choice: what each option means. */
  optionDocs?: Record<string, string>;
}

export interface BlockSpec {
  kind: BlockKind;
  doc: string;
  /** The fields a new block is written with (completion and snippets), each filled with its example. */
  template: string[];
  fields: FieldSpec[];
  /** Why rename refuses a block of this kind, when its name is used outside the specs. */
  notRenamed?: string;
}

const adc: BlockSpec = {
  kind: 'adc',
  doc: 'An analog-to-digital converter: resolution, reference, and input limits.',
  template: ['bits', 'reference'],
  fields: [
    { name: 'bits', form: { form: 'quantity', dimension: 'dimensionless', integer: true, min: 1, minInclusive: true, max: 24 }, doc: 'Resolution in bits (1 to 24).', example: 'bits = 12' },
    { name: 'reference', form: { form: 'quantity', dimension: 'voltage', tolerance: true, min: 1e-3, minInclusive: true, max: 1000 }, doc: 'Reference voltage (full scale), with an optional tolerance.', example: 'reference = 3.3 V ± 1 %' },
    { name: 'max_source', form: { form: 'quantity', dimension: 'resistance', min: 1e-3, minInclusive: true, max: 1e12 }, doc: 'Highest source impedance the converter tolerates at its input (from its datasheet). Unchecked when absent.', example: 'max_source = 10 kohm', optional: true },
    { name: 'sample_cap', form: { form: 'quantity', dimension: 'capacitance', min: 1e-15, minInclusive: true, max: 1e-3 }, doc: 'Sampling capacitance, used to size an input capacitor when the source impedance is too high.', example: 'sample_cap = 14 pF', optional: true },
    { name: 'offset_error', form: { form: 'phrase', syntax: '± n LSB' }, defaultText: '± 0 LSB', doc: 'Offset error of the converter in LSB (from its datasheet), for the error budget.', example: 'offset_error = ± 2 LSB' },
    { name: 'gain_error', form: { form: 'phrase', syntax: '± x %' }, defaultText: '± 0 %', doc: 'Gain (full-scale) error of the converter, relative, for the error budget.', example: 'gain_error = ± 0.2 %' },
    { name: 'inl', form: { form: 'phrase', syntax: '± n LSB' }, defaultText: '± 0 LSB', doc: 'Integral nonlinearity in LSB, for the error budget: a bound on every reading, calibration readings included. The worst case takes any value within it at each reading; the Monte Carlo draws one smooth curve of the code per board within it, so a calibration removes it at the calibration code.', example: 'inl = ± 1 LSB' },
    { name: 'noise', form: { form: 'phrase', syntax: 'n LSB rms | v mV rms' }, doc: 'Noise at the converter input, rms, in LSB or volts. Oversampling gains resolution only when it is at least 0.5 LSB rms. Unknown when absent.', example: 'noise = 0.8 LSB rms', optional: true, words: ['rms'] },
  ],
};

/** The channel's `sensor`: a reference to a definition of any sensor kind. */
function sensorField(): FieldSpec {
  const kinds = sensorKinds();
  const names = kinds.map((k) => k.name);
  const words = kinds.map((k) => k.a);
  const list = words.length < 2 ? words.join('') : `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}`;
  return { name: 'sensor', form: { form: 'ref', target: names[0]!, targets: names }, doc: `Name of the sensor definition used: ${list}.`, example: 'sensor = small_npn' };
}

const channel = (): BlockSpec => ({
  kind: 'channel',
  doc: 'A temperature channel: a sensor, its bias, the ADC that reads it, and the targets it must meet.',
  template: ['sensor', 'adc', 'bias', 'range', 'accuracy'],
  notRenamed: 'Channel names are not renamed here: generated code and logs refer to them. Edit the name directly.',
  fields: [
    sensorField(),
    { name: 'adc', form: { form: 'ref', target: 'adc' }, doc: 'Name of the ADC definition that reads the channel.', example: 'adc = mcu_adc' },
    { name: 'bias', form: { form: 'bias' }, doc: 'How the junction is biased: `resistor R from V` (a resistor from a supply, each with an optional tolerance) or `current I` (a constant current). For the two-current (delta-VBE) method: `currents I1 and I2` or `resistors R1 and R2 from V` (switched in turn); the channel then reads the difference of the two voltages. A thermistor or an RTD sits in a divider, `divider R above from V` (the fixed resistor R between the supply V and the ADC node, the sensor from the node to ground) or `divider R below from V` (the sensor on the supply side, R to ground), or takes a constant current `current I` (the ADC reads I times its resistance). On a thermocouple channel the bias is how an open thermocouple is detected: `resistor R from V` (a pull-up) or `current I` (a burnout current); either flows through the thermocouple loop.', example: 'bias = resistor 47k ± 1 % from 3.3 V ± 2 %', words: ['resistor', 'resistors', 'current', 'currents', 'divider', 'above', 'below', 'from', 'and'] },
    { name: 'range', form: { form: 'range', dimension: 'temperature' }, doc: 'Temperature range of interest.', example: 'range = -40 °C .. 125 °C' },
    { name: 'step', form: { form: 'quantity', dimension: 'temperature', difference: true, min: 1e-4, minInclusive: true, max: 1000 }, defaultText: '1 K', doc: 'Sweep step over the range.', example: 'step = 0.5 K' },
    { name: 'resolution', form: { form: 'resolution' }, doc: 'Required resolution: `0.1 °C per count` or `10 counts per °C`. Unchecked when absent.', example: 'resolution = 0.1 °C per count', optional: true, words: ['per'] },
    { name: 'accuracy', form: { form: 'accuracy' }, doc: 'Accuracy target, e.g. `± 0.5 °C`. Used for the self-heating and nonlinearity checks. Unchecked when absent.', example: 'accuracy = ± 0.5 °C', optional: true },
    { name: 'theta_ja', form: { form: 'quantity', dimension: 'thermal-resistance', min: 0, minInclusive: true, max: 1e5 }, defaultText: 'the sensor\'s theta_ja', doc: 'Thermal resistance for this channel\'s mounting, overriding the sensor\'s.', example: 'theta_ja = 250 K/W' },
    { name: 'conversion', form: { form: 'choice', options: ['table', 'line'] }, defaultText: 'table', doc: 'How firmware converts codes to temperature: `table` (generated table, model-exact) or `line` (a straight line; its nonlinearity is checked against the accuracy).', example: 'conversion = table', optionDocs: { table: 'Firmware converts codes through a generated table (model-exact).', line: 'Firmware converts codes with a straight line; its nonlinearity is checked against the accuracy target.' } },
    { name: 'current_window', form: { form: 'range', dimension: 'current' }, defaultText: '1 uA .. 1 mA', doc: `Junction channels: ${CURRENT_RANGE}: below it leakage and noise, above it self-heating (see bias-current-low/high). Other channels take no such field.`, example: 'current_window = 5 uA .. 500 uA' },
    { name: 'calibration', form: { form: 'phrase', syntax: 'none | one point at T | two points at T1 and T2' }, defaultText: 'none', doc: 'Calibration done on each built board: `none`, `one point at 25 °C` (an offset trim) or `two points at 0 °C and 70 °C` (offset and gain trim). The error budget gives the residual error after it.', example: 'calibration = one point at 25 °C', words: ['none', 'one', 'two', 'point', 'points', 'at', 'and'] },
    { name: 'cal_reference', form: { form: 'phrase', syntax: '± t' }, defaultText: '± 0 °C (exact)', doc: 'Uncertainty of the reference thermometer each board is calibrated against (half-width, 0 to 10 K). The error budget passes it, with the quantisation and INL of the calibration readings, through the trim to every temperature.', example: 'cal_reference = ± 0.05 °C' },
    { name: 'measured', form: { form: 'phrase', syntax: 'code counts at T [and code counts at T ...]' }, doc: 'ADC codes read on a real board at known temperatures. On a junction channel the model is fitted to them (IS with one point; IS and N with two or more) and the error budget and generated code use the fitted model; a point that disagrees with the others is flagged and left out of that fit. Codes are whole numbers inside the converter scale (not 0 or full scale); thermistor and RTD channels do not use the points (a warning says so).', example: 'measured = 2110 counts at 25 °C and 1790 counts at 70 °C', optional: true, words: ['at', 'and'] },
    { name: 'bench_data', form: { form: 'phrase', syntax: '"file.csv" [board ID]' }, doc: 'Measured points from a CSV file logged on the bench, read beside the `measured` points: a header row naming the columns `temperature_c` (or `temperature`, °C; `temperature_k` for kelvin) and `code`, optionally `board` and `time`, then one reading per row. The path is relative to the spec and stays inside the workspace, like `use`; `board ID` keeps that board\'s rows only. Rows that cannot be used are reported with their row and column and left out; the file is only read. At most 200 readings are fitted.', example: 'bench_data = "bench/run1.csv"', optional: true, words: ['board'] },
    { name: 'monte_carlo', form: { form: 'phrase', syntax: 'N runs [seed S] [normal]' }, defaultText: '1000 runs seed 1', doc: 'Monte Carlo error budget: number of simulated boards, seed of the generator, and `normal` to read every tolerance as 3 sigma of a normal law (truncated there) instead of uniform.', example: 'monte_carlo = 2000 runs seed 7', words: ['runs', 'seed', 'normal', 'uniform'] },
    { name: 'output', form: { form: 'quantity', dimension: 'temperature', difference: true, min: 1e-4, minInclusive: true, max: 1 }, defaultText: '0.01 °C', doc: 'Unit of the integer the generated conversion code returns: `0.01 °C` returns signed hundredths of a degree. 1 divided by it must be a whole number from 1 to 10000.', example: 'output = 0.1 °C' },
    { name: 'code_error', form: { form: 'quantity', dimension: 'temperature', difference: true, min: 1e-4, minInclusive: true, max: 100 }, defaultText: '0.02 °C', doc: 'Largest error the generated conversion code may add to the model, checked at every in-range ADC code by simulating its integer arithmetic exactly. At least half an `output` unit.', example: 'code_error = 0.05 °C' },
    { name: 'code_method', form: { form: 'choice', options: ['auto', 'table', 'polynomial'] }, defaultText: 'auto', doc: 'How the generated code converts: `table` (points with linear interpolation), `polynomial` (piecewise quadratic) or `auto` (whichever meets `code_error` in fewer bytes).', example: 'code_method = table' },
    { name: 'optimise', form: { form: 'choice', options: ['size', 'speed', 'balanced'] }, defaultText: 'balanced', doc: 'What `code_method = auto` favours among the designs that meet `code_error`: `size` (fewest flash bytes), `speed` (fewest cycles per conversion: a table before a polynomial, fewer steps) or `balanced` (bytes plus estimated cycles, so a design a little larger but much faster wins).', example: 'optimise = speed' },
    { name: 'code_prefix', form: { form: 'phrase', syntax: 'name' }, doc: 'Put before every identifier generated for this channel (functions, types, tables, macros), so that channels of the same name in two specs link into one firmware: a C identifier of 1 to 32 letters, digits and underscores starting with a letter. `thermoscribe gen`, the editor\'s generate and insert actions and the stale check all use it. No prefix when absent (then `gen --prefix` gives one).', example: 'code_prefix = boiler_', optional: true },
    { name: 'float_variant', form: { form: 'choice', options: ['yes', 'no'] }, defaultText: 'no', doc: 'yes to generate, beside the integer function, one returning a float in °C (no maths library needed).', example: 'float_variant = yes' },
    { name: 'oversampling', form: { form: 'phrase', syntax: 'n bits' }, defaultText: '0 bits', doc: 'Extra bits by oversampling and decimation: 4^n readings summed and shifted right by n (Atmel application note AVR121). Works only with at least 0.5 LSB rms of noise at the input (see the adc `noise`). Generated conversion code then takes the decimated value (bits + n bits, 0 .. 2^(bits+n) - 1) instead of one reading.', example: 'oversampling = 2 bits', words: ['bits', 'bit'] },
    { name: 'ratiometric', form: { form: 'choice', options: ['yes', 'no'] }, defaultText: 'no', doc: 'yes when the ADC reference is the divider\'s own supply: the code then follows the divider ratio and the supply cancels. The divider supply must equal the ADC reference.', example: 'ratiometric = yes' },
    { name: 'gain', form: { form: 'quantity', dimension: 'dimensionless', tolerance: true, min: 1e-3, minInclusive: true, max: 1e4 }, defaultText: '1 (no amplifier)', doc: 'Gain of an amplifier between the sensor and the ADC: V_adc = gain × V + offset, with an optional tolerance (`gain = 101 ± 0.5 %`) that the error budget draws.', example: 'gain = 20' },
    { name: 'offset', form: { form: 'quantity', dimension: 'voltage', min: -1000, minInclusive: true, max: 1000 }, defaultText: '0 V', doc: 'Output offset of that amplifier, V (may be negative).', example: 'offset = -0.1 V' },
    { name: 'wiring', form: { form: 'phrase', syntax: 'n wires [R per lead]' }, defaultText: 'leads not modelled', doc: 'Lead wiring of a resistive sensor: `2 wires 0.5 ohm` (both leads in series with the sensor), `3 wires 0.5 ohm` (the third lead cancels them when the leads match) or `4 wires` (no lead error).', example: 'wiring = 3 wires 0.5 ohm', words: ['wires', 'wire'] },
    { name: 'compare_group', form: { form: 'phrase', syntax: 'name' }, doc: 'Channels with the same group name are alternative designs of one measurement; `thermoscribe compare` lays them out side by side.', example: 'compare_group = fridge', optional: true },
    // The fields only one sensor kind takes, from its folder (sensors/kind.ts `channelBlockFields`).
    ...sensorKinds().flatMap((k) => k.channelBlockFields ?? []),
    // Dynamics and the firmware filter (model/read-budget-spec.ts, analysis/dynamics.ts).
    { name: 'time_constant', form: { form: 'quantity', dimension: 'time', tolerance: true, min: 1e-3, minInclusive: true, max: 1e5 }, doc: 'Thermal time constant of the sensor in its mounting (the time to 63 % of a step of the medium), with an optional tolerance: `8 s ± 25 %`. The lag, the settling and the filter are worked out with the slowest value. From a datasheet for the stated mounting, or measured by plunging the mounted sensor into a stirred bath.', example: 'time_constant = 8 s ± 25 %', optional: true },
    { name: 'sample_period', form: { form: 'quantity', dimension: 'time', min: 1e-6, minInclusive: true, max: 3600 }, doc: 'Time between the values the firmware filter takes (with oversampling, between decimated values). Needed to choose a filter for `noise_limit`.', example: 'sample_period = 100 ms', optional: true },
    { name: 'settling', form: { form: 'phrase', syntax: 't [for d step]' }, doc: 'Response needed after a step of the medium: the filtered reading within the `accuracy` of the new temperature within t, for a step of d (default: the whole range).', example: 'settling = 30 s for 20 K step', optional: true, words: ['for', 'step'] },
    { name: 'ramp_lag', form: { form: 'phrase', syntax: 'x at r' }, doc: 'Response needed while the medium ramps: the filtered reading behind the medium by at most x at a ramp of r (K/min or K/s), in steady state at the sample instants.', example: 'ramp_lag = 0.5 K at 2 K/min', optional: true, words: ['at'] },
    { name: 'noise_limit', form: { form: 'phrase', syntax: 'n [rms]' }, doc: 'Largest noise of the filtered reading, rms, from the adc `noise` (through the channel\'s coarsest °C per count) and the rounding of the readings. The tool chooses the firmware filter that meets it without missing `settling` or `ramp_lag`; without it no filter is chosen.', example: 'noise_limit = 0.05 °C rms', optional: true, words: ['rms'] },
  ],
});

type QuantityDomain = Extract<FieldForm, { form: 'quantity' }>;

/**
 * Sound domains of the values inside phrase fields and ranges (bias, points, resolution, accuracy,
 * temperature ranges), in base SI units, checked with the same message as a quantity field.
 * Engineering bounds wide enough for every real circuit (common practice, no source).
 */
export const PART_DOMAINS = {
  /** A bias current: 1 pA to 1 A. */
  biasCurrent: { form: 'quantity', dimension: 'current', min: 1e-12, minInclusive: true, max: 1 },
  /** A bias or divider resistor: 1 mΩ to 1 GΩ. */
  biasResistor: { form: 'quantity', dimension: 'resistance', min: 1e-3, minInclusive: true, max: 1e9 },
  /** A supply rail: 1 mV to 1000 V (as the ADC reference). */
  supply: { form: 'quantity', dimension: 'voltage', min: 1e-3, minInclusive: true, max: 1000 },
  /** A measured point's resistance: 1 mΩ to 1 GΩ. */
  pointResistance: { form: 'quantity', dimension: 'resistance', min: 1e-3, minInclusive: true, max: 1e9 },
  /** Any temperature in a spec: 1 K to 2273.15 K (2000 °C; the highest ITS-90 thermocouple table, type B, ends at 1820 °C). */
  temperature: { form: 'quantity', dimension: 'temperature', min: 1, minInclusive: true, max: 2273.15 },
  /** A resolution, kelvin per count: 1 µK to 1000 K. */
  resolution: { form: 'quantity', dimension: 'temperature', difference: true, min: 1e-6, minInclusive: true, max: 1000 },
  /** An accuracy target: 1 mK to 1000 K. */
  accuracy: { form: 'quantity', dimension: 'temperature', difference: true, min: 1e-3, minInclusive: true, max: 1000 },
  /** The bounds of a current window: 1 pA to 1 A. */
  currentBound: { form: 'quantity', dimension: 'current', min: 1e-12, minInclusive: true, max: 1 },
  /** A settling time: 1 ms to 1e6 s (about 11 days). */
  settleTime: { form: 'quantity', dimension: 'time', min: 1e-3, minInclusive: true, max: 1e6 },
  /** A step of the medium for `settling`: 1 mK to 1000 K. */
  settleStep: { form: 'quantity', dimension: 'temperature', difference: true, min: 1e-3, minInclusive: true, max: 1000 },
  /** A lag allowed at a ramp: 0.1 mK to 100 K. */
  rampLag: { form: 'quantity', dimension: 'temperature', difference: true, min: 1e-4, minInclusive: true, max: 100 },
  /** A ramp of the medium: 1e-6 K/s (0.06 mK/min) to 100 K/s. */
  ramp: { form: 'quantity', dimension: 'temperature-rate', min: 1e-6, minInclusive: true, max: 100 },
  /** A noise limit, rms: 1 µK to 100 K. */
  noiseLimit: { form: 'quantity', dimension: 'temperature', difference: true, min: 1e-6, minInclusive: true, max: 100 },
} as const satisfies Record<string, QuantityDomain>;

let blocks: Map<string, BlockSpec> | undefined;

/**
 * Every block of the language by keyword: the sensor kinds (registry order), adc, channel. Made on
 * first use: the registry's kinds import modules that import this one, so nothing reads it at load.
 */
export function allBlocks(): ReadonlyMap<string, BlockSpec> {
  return (blocks ??= new Map([...sensorKinds().map((k) => [k.name, k.block] as const), ['adc', adc], ['channel', channel()]]));
}

/** The block keywords, in order. */
export function blockKinds(): string[] {
  return [...allBlocks().keys()];
}

export function blockSpec(kind: string): BlockSpec | undefined {
  return allBlocks().get(kind);
}

/** Each block's fields by name and alias (the resolver asks once per field line, per keystroke). */
const FIELD_INDEX = new WeakMap<BlockSpec, Map<string, FieldSpec>>();

export function fieldSpec(block: BlockSpec, name: string): FieldSpec | undefined {
  let index = FIELD_INDEX.get(block);
  if (!index) {
    index = new Map();
    // Reverse order so that, as with a first-match search, an earlier field wins a shared name.
    for (const f of [...block.fields].reverse()) for (const n of [...(f.aliases ?? []), f.name]) index.set(n, f);
    FIELD_INDEX.set(block, index);
  }
  return index.get(name);
}

/** A block kind with its article as read aloud: "an adc", "a channel"; a sensor kind says its own ("an rtd"). */
/** Every form a `bias` takes, over all sensor kinds (completion offers them; an empty bias is asked for them). */
export const BIAS_FORMS = ['resistor R from V', 'current I', 'divider R above|below from V', 'currents I1 and I2', 'resistors R1 and R2 from V'];

export function kindWithArticle(kind: string): string {
  return sensorKind(kind)?.a ?? `${kind === 'adc' ? 'an' : 'a'} ${kind}`;
}

/**
 * What a half-typed phrase lacks, by field and by the word it ends with ('' when it ends with a
 * number; `word _` when it ends with a number right after that word): the readers ask for it (`bias = resistor 47k from` → "add the supply voltage after
 * 'from', such as 3.3 V"). Only the words of each field's phrase (its `words`, or the bias forms).
 */
export const HALF_TYPED: Readonly<Record<string, Readonly<Record<string, string>>>> = {
  bias: {
    current: 'the current after \'current\', such as `current 100 uA`',
    currents: 'the two currents after \'currents\', such as `currents 10 uA and 100 uA`',
    resistor: 'the resistance and its supply after \'resistor\', such as `resistor 47k from 3.3 V`',
    resistors: 'the two resistances and their supply, such as `resistors 330k and 33k from 3.3 V`',
    divider: 'the fixed resistor and its side after \'divider\', such as `divider 10k above from 3.3 V`',
    above: '\'from\' and the supply voltage, such as `above from 3.3 V`',
    below: '\'from\' and the supply voltage, such as `below from 3.3 V`',
    from: 'the supply voltage after \'from\', such as `from 3.3 V`',
    and: 'the second value after \'and\', such as `and 100 uA`',
    // After a value (`_`): what follows it in each form.
    'resistor _': '\'from\' and the supply voltage after the resistance, such as `resistor 47k from 3.3 V`',
    'resistors _': '\'and\' and the second resistance, then the supply, such as `resistors 330k and 33k from 3.3 V`',
    'currents _': '\'and\' and the second current, such as `currents 10 uA and 100 uA`',
    'divider _': 'the side of the fixed resistor, `above` or `below`, and the supply, such as `divider 10k above from 3.3 V`',
    'and _': '\'from\' and the supply voltage after the second resistance, such as `resistors 330k and 33k from 3.3 V`',
  },
  resolution: {
    '': '`per count` after the figure, such as `0.1 °C per count` (or `10 counts per °C`)',
    per: '`count` or `°C` after \'per\', such as `0.1 °C per count` or `10 counts per °C`',
  },
  calibration: {
    one: '`point at` and a temperature, such as `one point at 25 °C`',
    two: '`points at` and two temperatures, such as `two points at 0 °C and 70 °C`',
    point: '`at` and a temperature, such as `one point at 25 °C`',
    points: '`at` and two temperatures, such as `two points at 0 °C and 70 °C`',
    at: 'the temperature after \'at\', such as `at 25 °C`',
    and: 'the second temperature after \'and\', such as `and 70 °C`',
  },
  measured: {
    '': '`counts at` and the temperature of the reading, such as `2110 counts at 25 °C`',
    counts: '`at` and the temperature of the reading, such as `2110 counts at 25 °C`',
    at: 'the temperature of the reading after \'at\', such as `at 25 °C`',
    and: 'another reading after \'and\', such as `and 1790 counts at 70 °C`',
  },
  monte_carlo: {
    '': '`runs` after the number of boards, such as `1000 runs`',
    seed: 'the seed after \'seed\', a whole number such as `seed 7`',
  },
  oversampling: {
    '': '`bits` after the number, such as `2 bits`',
  },
};
