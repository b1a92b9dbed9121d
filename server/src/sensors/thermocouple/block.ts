// The thermocouple block of the language, and the channel fields only a thermocouple channel takes
// (sensors/kind.ts `channelBlockFields`: the schema adds them to the channel block).
import type { BlockSpec, FieldSpec, FieldForm } from '../../model/schema';

type QuantityDomain = Extract<FieldForm, { form: 'quantity' }>;

export const block: BlockSpec = {
  kind: 'thermocouple',
  doc: 'A thermocouple of one of the letter types of IEC 60584-1 (B, E, J, K, N, R, S, T), read through the ITS-90 reference functions (NIST Monograph 175). Its channel names the channel that measures its cold junction.',
  template: ['type', 'class'],
  fields: [
    {
      name: 'type', form: { form: 'choice', options: ['B', 'E', 'J', 'K', 'N', 'R', 'S', 'T'] }, doc: 'The letter type of IEC 60584-1 (the pair of alloys).', example: 'type = K',
      optionDocs: {
        B: 'Pt-30 % Rh / Pt-6 % Rh: 0 .. 1820 °C, a few µV/K near room temperature.',
        E: 'Ni-Cr / Cu-Ni: -270 .. 1000 °C, the largest EMF per kelvin of the letter types.',
        J: 'Fe / Cu-Ni: -210 .. 1200 °C.',
        K: 'Ni-Cr / Ni-Al: -270 .. 1372 °C, the common general-purpose type.',
        N: 'Ni-Cr-Si / Ni-Si: -270 .. 1300 °C, more stable than K at high temperature.',
        R: 'Pt-13 % Rh / Pt: -50 .. 1768.1 °C.',
        S: 'Pt-10 % Rh / Pt: -50 .. 1768.1 °C.',
        T: 'Cu / Cu-Ni: -270 .. 400 °C.',
      },
    },
    { name: 'class', form: { form: 'quantity', dimension: 'dimensionless', integer: true, min: 1, minInclusive: true, max: 3 }, doc: 'Tolerance class of IEC 60584-1: 1, 2 or 3 (each type has the classes and ranges the standard gives it). The error budget draws the hot junction within it. Unstated when absent.', example: 'class = 1', optional: true },
    { name: 'rated', form: { form: 'range', dimension: 'temperature' }, defaultText: 'the range of the type\'s reference function', doc: 'Temperature range the thermocouple (sheath, insulation, wire size) is rated for; by default the range of the type\'s ITS-90 reference function.', example: 'rated = 0 °C .. 1100 °C' },
  ],
};

/** Domains of the phrase values of the channel fields below (base SI units; common practice, no source). */
export const DOMAINS = {
  /** An amplifier input offset: 0 to 100 mV. */
  inputOffset: { form: 'quantity', dimension: 'voltage', min: 0, minInclusive: true, max: 0.1 },
  /** Its drift: 0 to 1 mV/K. */
  offsetDrift: { form: 'quantity', dimension: 'voltage', min: 0, minInclusive: true, max: 1e-3 },
  /** The difference between the cold-junction sensor and the terminals: 0 to 50 K. */
  isothermal: { form: 'quantity', dimension: 'temperature', difference: true, min: 0, minInclusive: true, max: 50 },
} as const satisfies Record<string, QuantityDomain>;

/** The channel fields only a thermocouple channel takes (and `gain`, `offset`, `bias` of every channel). */
export const channelBlockFields: FieldSpec[] = [
  { name: 'cold_junction', form: { form: 'ref', target: 'channel' }, doc: 'Thermocouple channels: the channel of this file that measures the cold junction (the thermocouple\'s terminals), a junction, thermistor or RTD channel. Its range is the board\'s temperature range, and its own worst-case error is carried into this channel\'s budget. Needed on a thermocouple channel; other channels take no such field.', example: 'cold_junction = board_temp', optional: true },
  { name: 'isothermal', form: { form: 'phrase', syntax: '± t' }, defaultText: '± 0 °C', doc: 'Thermocouple channels: largest temperature difference between the cold-junction sensor and the thermocouple\'s terminals (how isothermal the terminal block is), 0 to 50 K. The error budget draws it.', example: 'isothermal = ± 0.5 °C' },
  { name: 'input_offset', form: { form: 'phrase', syntax: '± v' }, defaultText: '± 0 V', doc: 'Thermocouple channels: input offset voltage of the amplifier (from its datasheet), 0 to 100 mV. The error budget draws it.', example: 'input_offset = ± 25 uV' },
  { name: 'offset_drift', form: { form: 'phrase', syntax: '± v per K' }, defaultText: '± 0 V per K', doc: 'Thermocouple channels: drift of that input offset with the board temperature, 0 to 1 mV per K; the error budget draws it over the cold-junction channel\'s range, from 25 °C.', example: 'offset_drift = ± 0.1 uV per K', words: ['per'] },
  { name: 'output_swing', form: { form: 'range', dimension: 'voltage' }, defaultText: '0 V .. the ADC reference', doc: 'Thermocouple channels: the amplifier\'s output swing (from its datasheet at the supply and load used). A sensed voltage outside it is reported (`tc-swing`).', example: 'output_swing = 0.05 V .. 3.25 V' },
  { name: 'loop_resistance', form: { form: 'quantity', dimension: 'resistance', min: 0, minInclusive: true, max: 1e5 }, defaultText: '10 ohm', doc: 'Thermocouple channels: resistance of the thermocouple loop (both legs and any extension cable). The open-detection current (the channel\'s `bias`) flows through it and adds an offset (`tc-open-offset`). The default is an assumption of a few metres of fine wire (common practice, no source).', example: 'loop_resistance = 25 ohm' },
];

export const CHANNEL_FIELDS = ['gain', 'offset', ...channelBlockFields.map((f) => f.name)];
