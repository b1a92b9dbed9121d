// Units of the spec language: each unit text maps to a dimension and a conversion to base SI.
// Temperatures are absolute (kelvin, with an offset) or differences (kelvin, scale only);
// the field decides which reading applies.

export type Dimension =
  | 'voltage'
  | 'current'
  | 'resistance'
  | 'capacitance'
  | 'temperature'
  | 'energy'
  | 'power'
  | 'thermal-resistance'
  | 'ratio'
  | 'count'
  | 'time'
  | 'temperature-rate'
  | 'dimensionless';

export const DIMENSION_WORDS: Record<Dimension, string> = {
  voltage: 'a voltage (V)',
  current: 'a current (A)',
  resistance: 'a resistance (Ω or ohm)',
  capacitance: 'a capacitance (pF, nF, uF)',
  temperature: 'a temperature (°C, K or °F)',
  energy: 'an energy (eV)',
  power: 'a power (W)',
  'thermal-resistance': 'a thermal resistance (K/W)',
  ratio: 'a ratio (% or ppm)',
  count: 'a count of ADC codes',
  time: 'a time (s, ms or min)',
  'temperature-rate': 'a rate of temperature change (K/min or K/s)',
  dimensionless: 'a plain number',
};

export interface UnitInfo {
  dimension: Dimension;
  /** Multiply by this to get base SI (for temperature: kelvin per unit). */
  scale: number;
  /** Added after scaling for absolute temperatures (K); 0 otherwise. */
  offset: number;
  /** True when the text was a bare SI prefix such as `k` in `10k`. */
  prefixOnly: boolean;
}

const PREFIX: Record<string, number> = {
  a: 1e-18, f: 1e-15, p: 1e-12, n: 1e-9, u: 1e-6, 'µ': 1e-6, 'μ': 1e-6, m: 1e-3, k: 1e3, M: 1e6, G: 1e9,
};

const ZERO_C = 273.15;

interface Core { dimension: Dimension; scale: number; offset: number; prefixable: boolean }

const CORE: Record<string, Core> = {
  V: { dimension: 'voltage', scale: 1, offset: 0, prefixable: true },
  A: { dimension: 'current', scale: 1, offset: 0, prefixable: true },
  ohm: { dimension: 'resistance', scale: 1, offset: 0, prefixable: true },
  ohms: { dimension: 'resistance', scale: 1, offset: 0, prefixable: true },
  Ohm: { dimension: 'resistance', scale: 1, offset: 0, prefixable: true },
  'Ω': { dimension: 'resistance', scale: 1, offset: 0, prefixable: true },
  W: { dimension: 'power', scale: 1, offset: 0, prefixable: true },
  eV: { dimension: 'energy', scale: 1, offset: 0, prefixable: true },
  K: { dimension: 'temperature', scale: 1, offset: 0, prefixable: true },
  C: { dimension: 'temperature', scale: 1, offset: ZERO_C, prefixable: false },
  '°C': { dimension: 'temperature', scale: 1, offset: ZERO_C, prefixable: false },
  '℃': { dimension: 'temperature', scale: 1, offset: ZERO_C, prefixable: false },
  // Fahrenheit: T[K] = (T[°F] + 459.67) * 5/9.
  F: { dimension: 'temperature', scale: 5 / 9, offset: 459.67 * (5 / 9), prefixable: false },
  '°F': { dimension: 'temperature', scale: 5 / 9, offset: 459.67 * (5 / 9), prefixable: false },
  '℉': { dimension: 'temperature', scale: 5 / 9, offset: 459.67 * (5 / 9), prefixable: false },
  '%': { dimension: 'ratio', scale: 1e-2, offset: 0, prefixable: false },
  ppm: { dimension: 'ratio', scale: 1e-6, offset: 0, prefixable: false },
  count: { dimension: 'count', scale: 1, offset: 0, prefixable: false },
  counts: { dimension: 'count', scale: 1, offset: 0, prefixable: false },
  LSB: { dimension: 'count', scale: 1, offset: 0, prefixable: false },
  s: { dimension: 'time', scale: 1, offset: 0, prefixable: true },
  min: { dimension: 'time', scale: 60, offset: 0, prefixable: false },
  Hz: { dimension: 'dimensionless', scale: 1, offset: 0, prefixable: true },
};

/** Unit texts for editors (model/language.ts): whole units, those that take an SI prefix, and the prefixes. */
export const UNIT_TEXTS = {
  whole: Object.keys(CORE).filter((u) => !CORE[u]!.prefixable),
  prefixable: [...Object.keys(CORE).filter((u) => CORE[u]!.prefixable), 'F'],
  prefixes: Object.keys(PREFIX),
};

/** The units completion offers after a number, per dimension, with what each is. */
export const SUGGESTED_UNITS: Record<Dimension, [string, string][]> = {
  voltage: [['V', 'volt'], ['mV', 'millivolt, 1e-3 V'], ['uV', 'microvolt, 1e-6 V']],
  current: [['mA', 'milliampere, 1e-3 A'], ['uA', 'microampere, 1e-6 A'], ['µA', 'microampere, 1e-6 A'], ['nA', 'nanoampere, 1e-9 A'], ['pA', 'picoampere, 1e-12 A'], ['fA', 'femtoampere, 1e-15 A'], ['A', 'ampere']],
  resistance: [['Ω', 'ohm'], ['kΩ', 'kilohm, 1e3 Ω'], ['MΩ', 'megohm, 1e6 Ω'], ['ohm', 'ohm'], ['kohm', 'kilohm, 1e3 Ω'], ['k', 'kilohm as in the resistor code 10k'], ['M', 'megohm as in the resistor code 1M']],
  capacitance: [['pF', 'picofarad, 1e-12 F'], ['nF', 'nanofarad, 1e-9 F'], ['uF', 'microfarad, 1e-6 F']],
  temperature: [['°C', 'degree Celsius'], ['K', 'kelvin'], ['°F', 'degree Fahrenheit']],
  energy: [['eV', 'electronvolt']],
  power: [['mW', 'milliwatt, 1e-3 W'], ['W', 'watt']],
  'thermal-resistance': [['K/W', 'kelvin per watt']],
  ratio: [['%', 'percent, 1e-2'], ['ppm', 'parts per million, 1e-6']],
  count: [['counts', 'ADC counts']],
  time: [['s', 'second'], ['ms', 'millisecond, 1e-3 s'], ['min', 'minute, 60 s']],
  'temperature-rate': [['K/min', 'kelvin per minute'], ['K/s', 'kelvin per second']],
  dimensionless: [],
};

/** Reads a unit text such as `kΩ`, `mV/K`, `°C`, `k`. Returns a message when unknown. */
export function readUnit(text: string): UnitInfo | string {
  const slash = text.indexOf('/');
  if (slash >= 0) {
    const num = readSimple(text.slice(0, slash));
    const den = readSimple(text.slice(slash + 1));
    if (typeof num === 'string') return num;
    if (typeof den === 'string') return den;
    if (num.dimension === 'temperature' && den.dimension === 'power') {
      return { dimension: 'thermal-resistance', scale: num.scale / den.scale, offset: 0, prefixOnly: false };
    }
    // A temperature change per time (a ramp): °C/min reads as K/min, the offset of °C drops out.
    if (num.dimension === 'temperature' && den.dimension === 'time') {
      return { dimension: 'temperature-rate', scale: num.scale / den.scale, offset: 0, prefixOnly: false };
    }
    return `unit '${text}' is not one the spec language knows; for a thermal resistance write K/W, for a ramp K/min`;
  }
  return readSimple(text);
}

function readSimple(text: string): UnitInfo | string {
  const core = CORE[text];
  if (core) return { dimension: core.dimension, scale: core.scale, offset: core.offset, prefixOnly: false };
  const prefix = PREFIX[text[0] ?? ''];
  if (prefix !== undefined) {
    const rest = text.slice(1);
    if (rest === '') return { dimension: 'dimensionless', scale: prefix, offset: 0, prefixOnly: true };
    // A prefixed F is the farad (10 nF); plain F stays Fahrenheit.
    if (rest === 'F') return { dimension: 'capacitance', scale: prefix, offset: 0, prefixOnly: false };
    const c = CORE[rest];
    if (c && c.prefixable) return { dimension: c.dimension, scale: c.scale * prefix, offset: 0, prefixOnly: false };
  }
  return `unknown unit '${text}'`;
}
