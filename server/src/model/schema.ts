// The blocks of the spec language and the fields each takes: form, unit, domain, default, docs.
// The resolver, completion and hover all read this one table.
import type { Dimension } from './units';

export type BlockKind = 'junction' | 'adc' | 'channel';

export type FieldForm =
  | { form: 'quantity'; dimension: Dimension; tolerance?: boolean; integer?: boolean; min?: number; minInclusive?: boolean; max?: number; difference?: boolean }
  | { form: 'range'; dimension: Dimension }
  | { form: 'choice'; options: string[] }
  | { form: 'ref'; target: BlockKind }
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
}

export interface BlockSpec {
  kind: BlockKind;
  doc: string;
  fields: FieldSpec[];
}

const junction: BlockSpec = {
  kind: 'junction',
  doc: 'A junction sensor: a diode-connected transistor or a signal diode, described by SPICE model parameters.',
  fields: [
    { name: 'kind', form: { form: 'choice', options: ['npn', 'pnp', 'diode'] }, defaultText: 'npn', doc: 'npn or pnp for a diode-connected transistor (base tied to collector; the terminal current includes the base current), diode for a plain junction diode.', example: 'kind = npn' },
    { name: 'IS', form: { form: 'quantity', dimension: 'current', min: 0, tolerance: true }, doc: 'Saturation current at TNOM (SPICE IS).', example: 'IS = 10 fA' },
    { name: 'N', aliases: ['NF'], form: { form: 'quantity', dimension: 'dimensionless', min: 0.5, minInclusive: true, max: 4, tolerance: true }, defaultText: '1', doc: 'Emission coefficient (SPICE N for a diode, NF for a transistor), with an optional part-to-part spread (`N = 1.004 ± 0.2 %`).', example: 'N = 1.0' },
    { name: 'BF', form: { form: 'quantity', dimension: 'dimensionless', min: 0, tolerance: true }, defaultText: '100', doc: 'Forward current gain (SPICE BF), with an optional spread (`BF = 200 ± 50 %`); ignored for a plain diode.', example: 'BF = 200' },
    { name: 'EG', form: { form: 'quantity', dimension: 'energy', min: 0.1, minInclusive: true, max: 5 }, defaultText: '1.11 eV', doc: 'Activation energy (SPICE EG); 1.11 eV for silicon.', example: 'EG = 1.11 eV' },
    { name: 'XTI', form: { form: 'quantity', dimension: 'dimensionless', min: -10, minInclusive: true, max: 20 }, defaultText: '3', doc: 'Saturation-current temperature exponent (SPICE XTI).', example: 'XTI = 3' },
    { name: 'XTB', form: { form: 'quantity', dimension: 'dimensionless', min: -10, minInclusive: true, max: 10 }, defaultText: '0', doc: 'Temperature exponent of BF (SPICE XTB).', example: 'XTB = 1.5' },
    { name: 'TNOM', form: { form: 'quantity', dimension: 'temperature', min: 0 }, defaultText: '27 °C', doc: 'Temperature at which the parameters were extracted (SPICE TNOM; SPICE\'s default is 27 °C).', example: 'TNOM = 27 °C' },
    { name: 'RS', form: { form: 'quantity', dimension: 'resistance', min: 0, minInclusive: true }, defaultText: '0 Ω', doc: 'Series resistance in the current path (diode RS; for a transistor fold RB/(1+BF) + RE in here).', example: 'RS = 1.5 ohm' },
    { name: 'rated', form: { form: 'range', dimension: 'temperature' }, defaultText: '-55 °C .. 150 °C', doc: 'Junction temperature range the part is rated for.', example: 'rated = -55 °C .. 150 °C' },
    { name: 'theta_ja', form: { form: 'quantity', dimension: 'thermal-resistance', min: 0, minInclusive: true }, defaultText: '500 K/W', doc: 'Junction-to-ambient thermal resistance for self-heating. The default is a conservative figure for a small SOT-23 part on minimal copper (from memory).', example: 'theta_ja = 350 K/W' },
  ],
};

const adc: BlockSpec = {
  kind: 'adc',
  doc: 'An analog-to-digital converter: resolution, reference, and input limits.',
  fields: [
    { name: 'bits', form: { form: 'quantity', dimension: 'dimensionless', integer: true, min: 1, minInclusive: true, max: 24 }, doc: 'Resolution in bits (1 to 24).', example: 'bits = 12' },
    { name: 'reference', form: { form: 'quantity', dimension: 'voltage', min: 0, tolerance: true }, doc: 'Reference voltage (full scale), with an optional tolerance.', example: 'reference = 3.3 V ± 1 %' },
    { name: 'max_source', form: { form: 'quantity', dimension: 'resistance', min: 0 }, doc: 'Highest source impedance the converter tolerates at its input (from its datasheet). Unchecked when absent.', example: 'max_source = 10 kohm' },
    { name: 'sample_cap', form: { form: 'quantity', dimension: 'capacitance', min: 0 }, doc: 'Sampling capacitance, used to size an input capacitor when the source impedance is too high.', example: 'sample_cap = 14 pF' },
    { name: 'offset_error', form: { form: 'phrase', syntax: '± n LSB' }, defaultText: '± 0 LSB', doc: 'Offset error of the converter in LSB (from its datasheet), for the error budget.', example: 'offset_error = ± 2 LSB' },
    { name: 'gain_error', form: { form: 'phrase', syntax: '± x %' }, defaultText: '± 0 %', doc: 'Gain (full-scale) error of the converter, relative, for the error budget.', example: 'gain_error = ± 0.2 %' },
    { name: 'inl', form: { form: 'phrase', syntax: '± n LSB' }, defaultText: '± 0 LSB', doc: 'Integral nonlinearity in LSB, for the error budget (taken as a bound on every reading; calibration does not remove it).', example: 'inl = ± 1 LSB' },
    { name: 'noise', form: { form: 'phrase', syntax: 'n LSB rms | v mV rms' }, doc: 'Noise at the converter input, rms, in LSB or volts. Oversampling gains resolution only when it is at least 0.5 LSB rms. Unknown when absent.', example: 'noise = 0.8 LSB rms' },
  ],
};

const channel: BlockSpec = {
  kind: 'channel',
  doc: 'A temperature channel: a sensor, its bias, the ADC that reads it, and the targets it must meet.',
  fields: [
    { name: 'sensor', form: { form: 'ref', target: 'junction' }, doc: 'Name of the junction definition used.', example: 'sensor = small_npn' },
    { name: 'adc', form: { form: 'ref', target: 'adc' }, doc: 'Name of the ADC definition that reads the channel.', example: 'adc = mcu_adc' },
    { name: 'bias', form: { form: 'bias' }, doc: 'How the junction is biased: `resistor R from V` (a resistor from a supply, each with an optional tolerance) or `current I` (a constant current). For the two-current (delta-VBE) method: `currents I1 and I2` or `resistors R1 and R2 from V` (switched in turn); the channel then reads the difference of the two voltages.', example: 'bias = resistor 47k ± 1 % from 3.3 V ± 2 %' },
    { name: 'range', form: { form: 'range', dimension: 'temperature' }, doc: 'Temperature range of interest.', example: 'range = -40 °C .. 125 °C' },
    { name: 'step', form: { form: 'quantity', dimension: 'temperature', difference: true, min: 0 }, defaultText: '1 K', doc: 'Sweep step over the range.', example: 'step = 0.5 K' },
    { name: 'resolution', form: { form: 'resolution' }, doc: 'Required resolution: `0.1 °C per count` or `10 counts per °C`. Unchecked when absent.', example: 'resolution = 0.1 °C per count' },
    { name: 'accuracy', form: { form: 'accuracy' }, doc: 'Accuracy target, e.g. `± 0.5 °C`. Used for the self-heating and nonlinearity checks. Unchecked when absent.', example: 'accuracy = ± 0.5 °C' },
    { name: 'theta_ja', form: { form: 'quantity', dimension: 'thermal-resistance', min: 0, minInclusive: true }, defaultText: 'the sensor\'s theta_ja', doc: 'Thermal resistance for this channel\'s mounting, overriding the sensor\'s.', example: 'theta_ja = 250 K/W' },
    { name: 'conversion', form: { form: 'choice', options: ['table', 'line'] }, defaultText: 'table', doc: 'How firmware converts codes to temperature: `table` (generated table, model-exact) or `line` (a straight line; its nonlinearity is checked against the accuracy).', example: 'conversion = table' },
    { name: 'current_window', form: { form: 'range', dimension: 'current' }, defaultText: '1 uA .. 1 mA', doc: 'Sound window for the bias current (see bias-current-low/high).', example: 'current_window = 5 uA .. 500 uA' },
    { name: 'calibration', form: { form: 'phrase', syntax: 'none | one point at T | two points at T1 and T2' }, defaultText: 'none', doc: 'Calibration done on each built board: `none`, `one point at 25 °C` (an offset trim) or `two points at 0 °C and 70 °C` (offset and gain trim). The error budget gives the residual error after it.', example: 'calibration = one point at 25 °C' },
    { name: 'measured', form: { form: 'phrase', syntax: 'code counts at T [and code counts at T ...]' }, doc: 'ADC codes read on a real board at known temperatures. The model is fitted to them (IS with one point; IS and N with two or more) and points that disagree are flagged.', example: 'measured = 2110 counts at 25 °C and 1790 counts at 70 °C' },
    { name: 'monte_carlo', form: { form: 'phrase', syntax: 'N runs [seed S] [normal]' }, defaultText: '1000 runs seed 1', doc: 'Monte Carlo error budget: number of simulated boards, seed of the generator, and `normal` to read every tolerance as 3 sigma of a normal law (truncated there) instead of uniform.', example: 'monte_carlo = 2000 runs seed 7' },
    { name: 'output', form: { form: 'quantity', dimension: 'temperature', difference: true, min: 0 }, defaultText: '0.01 °C', doc: 'Unit of the integer the generated conversion code returns: `0.01 °C` returns signed hundredths of a degree. 1 divided by it must be a whole number from 1 to 10000.', example: 'output = 0.1 °C' },
    { name: 'code_error', form: { form: 'quantity', dimension: 'temperature', difference: true, min: 0 }, defaultText: '0.02 °C', doc: 'Largest error the generated conversion code may add to the model, checked at every in-range ADC code by simulating its integer arithmetic exactly. At least half an `output` unit.', example: 'code_error = 0.05 °C' },
    { name: 'code_method', form: { form: 'choice', options: ['auto', 'table', 'polynomial'] }, defaultText: 'auto', doc: 'How the generated code converts: `table` (points with linear interpolation), `polynomial` (piecewise quadratic) or `auto` (whichever meets `code_error` in fewer bytes).', example: 'code_method = table' },
    { name: 'float_variant', form: { form: 'choice', options: ['yes', 'no'] }, defaultText: 'no', doc: 'yes to generate, beside the integer function, one returning a float in °C (no maths library needed).', example: 'float_variant = yes' },
    { name: 'oversampling', form: { form: 'phrase', syntax: 'n bits' }, defaultText: '0 bits', doc: 'Extra bits by oversampling and decimation: 4^n readings summed and shifted right by n (Atmel application note AVR121). Works only with at least 0.5 LSB rms of noise at the input (see the adc `noise`).', example: 'oversampling = 2 bits' },
  ],
};

export const BLOCKS: Record<BlockKind, BlockSpec> = { junction, adc, channel };

export function blockSpec(kind: string): BlockSpec | undefined {
  return Object.prototype.hasOwnProperty.call(BLOCKS, kind) ? BLOCKS[kind as BlockKind] : undefined;
}

export function fieldSpec(block: BlockSpec, name: string): FieldSpec | undefined {
  return block.fields.find((f) => f.name === name || (f.aliases ?? []).includes(name));
}
