// Readers for the resistive sensors (thermistor and rtd blocks) and the channel fields that serve
// them: the divider bias, ratiometric reading, amplifier, lead wiring and comparison group.
// resolve.ts builds the BlockReader and calls these; they report with precise ranges and never throw.
import type { QuantityTerm, Term } from '../syntax/ast';
import type { BlockReader, Resolution } from './resolve';
import type { AdcDef, BiasDef, RtdDef, SensorDef, ThermistorDef, Toleranced, WiringDef } from './types';
import { checkDomain, noExtra, readPart, readQuantityValue, readTolerance, spanOf, trimNumber, formatSI } from './read-value';
import { BLOCKS, fieldSpec, PART_DOMAINS, type FieldForm } from './schema';
import { readUnit } from './units';
import { closest } from './suggest';
import { betaToSteinhartHart, fitSteinhartHart, shMonotonicMessage, shResistanceAt, type ShCoefficients } from '../physics/steinhart-hart';
import { CVD_HIGH_C, CVD_LOW_C, IEC60751, cvdCelsiusAt, cvdResistance, type RtdClass } from '../physics/callendar-van-dusen';
import { shown } from '../checks/shown';
import { kindWithArticle } from './schema';

const ZERO_C = 273.15;
const T25 = 25 + ZERO_C;

type Base = Pick<ThermistorDef, 'name' | 'file' | 'nameSpan' | 'span' | 'fieldSpans' | 'given'>;

/** Reads `x mW/K` (power per kelvin) and returns K/W; the dissipation constant of a sensor. */
function readDissipation(r: BlockReader, fallbackWPerK: number): number | null {
  const terms = r.terms('dissipation');
  if (!terms) return 1 / fallbackWPerK;
  const ctx = r.ctx('dissipation');
  const q = terms[0];
  const bad = () => {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), 'dissipation takes a power per kelvin such as `1.5 mW/K`');
    r.ok = false;
    return null;
  };
  if (!q || q.kind !== 'quantity' || !q.unit || !noExtra(terms, 1, ctx)) return bad();
  const [num, den] = q.unit.text.split('/');
  if (!num || !den) return bad();
  const n = readUnit(num);
  const d = readUnit(den);
  if (typeof n === 'string' || typeof d === 'string' || n.dimension !== 'power' || d.dimension !== 'temperature' || d.offset !== 0) return bad();
  const wPerK = (q.number.value * n.scale) / d.scale;
  if (!(wPerK >= 1e-6 && wPerK <= 10)) {
    r.sink.report('out-of-domain', r.ref.file, q.span, `dissipation must be from 0.001 mW/K to 10 W/K (found ${formatSI(wPerK, 'W/K')})`);
    r.ok = false;
    return null;
  }
  return 1 / wPerK;
}

/** `± 1 %` as a relative tolerance (0 when the field is absent). */
function readRelTolerance(r: BlockReader, name: string): number | null {
  const terms = r.terms(name);
  if (!terms) return 0;
  const t = terms[0];
  if (!t || t.kind !== 'tolerance' || !noExtra(terms, 1, r.ctx(name))) {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), `${name} takes a relative tolerance such as \`± 1 %\``);
    r.ok = false;
    return null;
  }
  const v = readTolerance(t.amount, 1, 'ratio', r.ctx(name));
  if (v === null) r.ok = false;
  return v;
}

/** A measured point `T R` (kelvin, ohm). */
function readPoint(r: BlockReader, name: string): [number, number] | null | undefined {
  const terms = r.terms(name);
  if (!terms) return undefined;
  const [t, q] = terms;
  if (!t || t.kind !== 'quantity' || !q || q.kind !== 'quantity' || !noExtra(terms, 2, r.ctx(name))) {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), `${name} takes a temperature and a resistance, e.g. \`${name} = 0 °C 32.65k\``);
    r.ok = false;
    return null;
  }
  const k = readPart(t, PART_DOMAINS.temperature, r.ctx(name));
  const ohms = readPart(q, PART_DOMAINS.pointResistance, r.ctx(name));
  if (k === null || ohms === null) return (r.ok = false), null;
  return [k, ohms];
}

/** Beta in kelvin; a bare number is taken as kelvin. */
function readBeta(r: BlockReader): Toleranced | null | undefined {
  const terms = r.terms('beta');
  if (!terms) return undefined;
  const q = terms[0];
  if (!q || q.kind !== 'quantity' || !noExtra(terms, 1, r.ctx('beta'))) {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), 'beta takes a value in kelvin such as `3950 K ± 1 %`');
    r.ok = false;
    return null;
  }
  const k = q.unit ? readQuantityValue(q, 'temperature', r.ctx('beta'), true) : q.number.value;
  if (k === null) return (r.ok = false), null;
  const form = fieldSpec(BLOCKS.thermistor, 'beta')!.form as Extract<FieldForm, { form: 'quantity' }>;
  if (!checkDomain(k, form, q.span, r.ctx('beta'), () => `${trimNumber(k, 6)} K; NTC thermistors sit around 3000 K to 5000 K`)) {
    r.ok = false;
    return null;
  }
  const tol = q.tolerance ? readTolerance(q.tolerance, k, 'temperature', { ...r.ctx('beta') }) : 0;
  if (tol === null) return (r.ok = false), null;
  return { value: k, tolerance: tol, span: q.span };
}

export function readThermistor(r: BlockReader, base: Base): ThermistorDef | null {
  const name = r.ref.node.name;
  const rated = r.range('rated', [-40 + ZERO_C, 125 + ZERO_C]);
  const theta = readDissipation(r, 1.5e-3);
  const has = (f: string) => r.terms(f) !== undefined;
  const forms = [
    has('beta') ? 'beta' : null,
    has('sh_a') || has('sh_b') || has('sh_c') ? 'coefficients' : null,
    has('point_1') || has('point_2') || has('point_3') ? 'points' : null,
  ].filter((x): x is 'beta' | 'coefficients' | 'points' => x !== null);
  if (forms.length !== 1) {
    r.sink.report(forms.length ? 'bad-value' : 'missing-field', r.ref.file, name.span,
      forms.length
        ? `thermistor '${shown(name.text)}' gives its curve ${forms.length} ways (${forms.join(', ')}); give exactly one`
        : `thermistor '${shown(name.text)}' needs its curve: \`r25\` with \`beta\`, or \`sh_a\`, \`sh_b\`, \`sh_c\`, or \`point_1\`..\`point_3\``);
    return null;
  }
  const form = forms[0]!;
  let coeffs: ShCoefficients | null = null;
  let r25: Toleranced | null = null;
  let beta: ThermistorDef['beta'] = null;
  if (form === 'beta') {
    const b = readBeta(r);
    const r25q = r.quantity('r25');
    const br = r.range('beta_range', [T25, 85 + ZERO_C]);
      if (b && r25q && br && r.ok) {
      coeffs = betaToSteinhartHart(r25q.value, b.value, T25);
      r25 = r25q;
      beta = { ...b, lowK: br.low, highK: br.high };
    }
  } else {
    for (const f of ['r25', 'beta_range']) {
      if (has(f)) {
        r.sink.report('bad-value', r.ref.file, r.fieldSpans[f]!, `${f} belongs to the beta form; with ${form === 'points' ? 'measured points' : 'Steinhart-Hart coefficients'} give the resistance tolerance as \`r_tolerance = ± 1 %\``);
        r.ok = false;
      }
    }
    const tol = readRelTolerance(r, 'r_tolerance');
    if (form === 'coefficients') {
      const A = r.quantity('sh_a');
      const B = r.quantity('sh_b');
      const C = r.quantity('sh_c');
      if (A && B && C) coeffs = { A: A.value, B: B.value, C: C.value };
    } else {
      const pts = [readPoint(r, 'point_1'), readPoint(r, 'point_2'), readPoint(r, 'point_3')];
      pts.forEach((p, i) => { if (p === undefined) r.missing(`point_${i + 1}`); });
      if (pts.every((p) => Array.isArray(p))) {
        const fit = fitSteinhartHart(pts as [number, number][]);
        if (typeof fit === 'string') {
          r.sink.report('out-of-domain', r.ref.file, name.span, `thermistor '${shown(name.text)}': ${fit}`);
          r.ok = false;
        } else coeffs = fit;
      }
    }
    if (coeffs && tol !== null) {
      const span = r.fieldSpans['r_tolerance'] ?? name.span;
      r25 = { value: NaN, tolerance: tol, span };
    }
  }
  if (!r.ok || !coeffs || !r25 || !rated || theta === null) return null;
  const mono = shMonotonicMessage(coeffs, rated.low, rated.high);
  if (mono) {
    r.sink.report('out-of-domain', r.ref.file, name.span, `thermistor '${shown(name.text)}': ${mono} (checked over its rated ${trimNumber(rated.low - ZERO_C, 4)} °C .. ${trimNumber(rated.high - ZERO_C, 4)} °C)`);
    return null;
  }
  if (form !== 'beta') r25 = { ...r25, value: shResistanceAt(coeffs, T25) };
  if (!Number.isFinite(r25.value) || !(r25.value > 0)) {
    r.sink.report('out-of-domain', r.ref.file, name.span, `thermistor '${shown(name.text)}': the curve gives no finite resistance at 25 °C`);
    return null;
  }
  return { kind: 'thermistor', ...base, params: { kind: 'ntc', ...coeffs }, form, r25, beta, ratedLowK: rated.low, ratedHighK: rated.high, thetaJA: theta };
}

export function readRtd(r: BlockReader, base: Base): RtdDef | null {
  const r0 = r.quantity('r0');
  const A = r.quantity('cvd_a', IEC60751.A);
  const B = r.quantity('cvd_b', IEC60751.B);
  const C = r.quantity('cvd_c', IEC60751.C);
  const cls = r.terms('class') ? (r.choice('class', 'B') as RtdClass) : null;
  const element = r.terms('element') ? (r.choice('element', 'film') as 'film' | 'wire') : null;
  const rated = r.range('rated', [CVD_LOW_C + ZERO_C, CVD_HIGH_C + ZERO_C]);
  const theta = readDissipation(r, 2.5e-3);
  if (!r.ok || !r0 || !A || !B || !C || !rated || theta === null) return null;
  const k = { A: A.value, B: B.value, C: C.value };
  // The curve must rise over the rated range (dR/dt > 0) for the reading to have one temperature.
  const name = r.ref.node.name;
  const tLow = rated.low - ZERO_C;
  const tHigh = rated.high - ZERO_C;
  if (!(k.A > 0) || !(k.A + 2 * k.B * tHigh > 0) || !(k.A + 2 * k.B * tLow > 0) || !(cvdResistance(r0.value, k, tLow) > 0)) {
    r.sink.report('out-of-domain', r.ref.file, name.span, `rtd '${shown(name.text)}': with these coefficients the resistance does not rise steadily and stay positive over the rated ${trimNumber(tLow, 4)} °C .. ${trimNumber(tHigh, 4)} °C`);
    return null;
  }
  if (!Number.isFinite(cvdCelsiusAt(r0.value, k, cvdResistance(r0.value, k, tHigh)))) {
    r.sink.report('out-of-domain', r.ref.file, name.span, `rtd '${shown(name.text)}': the coefficients cannot be inverted at ${trimNumber(tHigh, 4)} °C`);
    return null;
  }
  return { kind: 'rtd', ...base, params: { kind: 'platinum', R0: r0.value, ...k }, r0, toleranceClass: cls, element, ratedLowK: rated.low, ratedHighK: rated.high, thetaJA: theta };
}

/** The channel's `sensor`: a junction, thermistor or rtd definition. */
export function readSensorRef(r: BlockReader, res: Resolution): SensorDef | null {
  const terms = r.terms('sensor');
  if (!terms) {
    r.missing('sensor');
    return null;
  }
  const t = terms[0]!;
  if (t.kind !== 'word') {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), 'sensor takes the name of a junction, thermistor or rtd definition');
    r.ok = false;
    return null;
  }
  if (!noExtra(terms, 1, r.ctx('sensor'))) r.ok = false;
  const block = res.blocks.get(t.text);
  const kinds = ['junction', 'thermistor', 'rtd'];
  if (!block) {
    const pool = [...res.blocks.values()].filter((b) => kinds.includes(b.kind)).map((b) => b.node.name.text);
    const near = closest(t.text, pool);
    r.sink.report('unknown-name', r.ref.file, t.span, `no sensor named '${shown(t.text)}' is defined${near ? ` (did you mean '${near}'?)` : pool.length ? `; defined: ${pool.join(', ')}` : ''}`);
    r.ok = false;
    return null;
  }
  if (!kinds.includes(block.kind)) {
    r.sink.report('wrong-kind', r.ref.file, t.span, `'${shown(t.text)}' is ${kindWithArticle(block.kind)}, but sensor needs a junction, thermistor or rtd`);
    r.ok = false;
    return null;
  }
  const def = block.kind === 'junction' ? res.junctions.get(t.text) : res.resistiveSensors.get(t.text);
  if (!def) r.ok = false;
  return def ?? null;
}

/** `divider R above|below from V` with optional tolerances on R and V. */
export function readDividerBias(r: BlockReader, terms: Term[]): BiasDef | null {
  const ctx = r.ctx('bias');
  const span = spanOf(terms);
  const bad = () => {
    r.sink.report('bad-value', r.ref.file, span, 'a divider bias reads `divider R above from V` (fixed resistor on the supply side) or `divider R below from V` (fixed resistor to ground), e.g. `divider 10k ± 0.1 % above from 3.3 V`');
    r.ok = false;
    return null;
  };
  const [, rq, pos, from, vq] = terms;
  if (!rq || rq.kind !== 'quantity' || !pos || pos.kind !== 'word' || (pos.text !== 'above' && pos.text !== 'below') || !from || from.kind !== 'word' || from.text !== 'from' || !vq || vq.kind !== 'quantity' || !noExtra(terms, 5, ctx)) return bad();
  const ohms = readPart(rq, PART_DOMAINS.biasResistor, ctx);
  const volts = readPart(vq, PART_DOMAINS.supply, ctx);
  if (ohms === null || volts === null) return (r.ok = false), null;
  const tol = (q: QuantityTerm, v: number, dim: 'resistance' | 'voltage') => (q.tolerance ? readTolerance(q.tolerance, v, dim, ctx) : 0);
  const rt = tol(rq, ohms, 'resistance');
  const vt = tol(vq, volts, 'voltage');
  if (rt === null || vt === null) return (r.ok = false), null;
  return { kind: 'divider', ohms: { value: ohms, tolerance: rt, span: rq.span }, supply: { value: volts, tolerance: vt, span: vq.span }, position: pos.text, span };
}

/** `2 wires 0.5 ohm`, `3 wires 0.5 ohm`, `4 wires`. */
function readWiring(r: BlockReader): WiringDef | null | undefined {
  const terms = r.terms('wiring');
  if (!terms) return undefined;
  const span = spanOf(terms);
  const bad = () => {
    r.sink.report('bad-value', r.ref.file, span, 'wiring takes `2 wires 0.5 ohm`, `3 wires 0.5 ohm` or `4 wires` (the resistance is that of one lead)');
    r.ok = false;
    return null;
  };
  const [n, w, q] = terms;
  if (!n || n.kind !== 'quantity' || n.unit || !w || w.kind !== 'word' || (w.text !== 'wires' && w.text !== 'wire')) return bad();
  const wires = n.number.value;
  if (wires !== 2 && wires !== 3 && wires !== 4) {
    r.sink.report('out-of-domain', r.ref.file, n.span, `wiring: a sensor has 2, 3 or 4 wires (found ${shown(n.number.text)})`);
    return (r.ok = false), null;
  }
  let lead = 0;
  if (q) {
    if (q.kind !== 'quantity' || !noExtra(terms, 3, r.ctx('wiring'))) return bad();
    const v = readQuantityValue(q, 'resistance', r.ctx('wiring'));
    if (v === null) return (r.ok = false), null;
    if (!(v >= 0) || v > 1e4) {
      r.sink.report('out-of-domain', r.ref.file, q.span, `wiring: the lead resistance must be from 0 Ω to 10 kΩ (found ${shown(q.number.text)})`);
      return (r.ok = false), null;
    }
    lead = v;
  } else if (wires !== 4) {
    r.sink.report('bad-value', r.ref.file, span, `wiring: give the resistance of one lead, e.g. \`${wires} wires 0.5 ohm\``);
    return (r.ok = false), null;
  }
  return { wires, leadOhms: lead, span };
}

/**
 * The element's resistance over the channel range must stay within 1 mΩ .. 1 TΩ (beyond that the
 * model and the arithmetic are meaningless); returns a message otherwise.
 */
export function elementRangeMessage(sensor: SensorDef, lowK: number, highK: number): string | null {
  if (sensor.kind === 'junction') return null;
  const ohmsAt = (k: number) => sensor.kind === 'thermistor' ? shResistanceAt(sensor.params, k) : cvdResistance(sensor.params.R0, sensor.params, k - ZERO_C);
  const a = ohmsAt(lowK);
  const b = ohmsAt(highK);
  const ok = (v: number) => Number.isFinite(v) && v >= 1e-3 && v <= 1e12;
  if (ok(a) && ok(b)) return null;
  return `over the range '${sensor.name}' runs from ${formatSI(a, 'Ω')} to ${formatSI(b, 'Ω')}; the engine handles 1 mΩ to 1 TΩ: narrow the range or check the sensor's values`;
}

export interface ChannelExtras {
  ratiometric?: boolean;
  amplifier?: { gain: number; offsetVolts: number };
  wiring?: WiringDef;
  compareGroup?: string;
}

/** The resistive-sensor fields of a channel, checked against its sensor, bias and ADC. */
export function readChannelExtras(r: BlockReader, sensor: SensorDef | null, bias: BiasDef | null, adc: AdcDef | null, range?: { low: number; high: number } | null): ChannelExtras {
  const out: ChannelExtras = {};
  const file = r.ref.file;
  const elementMsg = sensor && range ? elementRangeMessage(sensor, range.low, range.high) : null;
  if (elementMsg) {
    r.sink.report('out-of-domain', file, r.fieldSpans['range'] ?? r.ref.node.name.span, elementMsg);
    r.ok = false;
  }
  const resistive = sensor !== null && sensor.kind !== 'junction';
  const junctionOnly = (field: string) => {
    r.sink.report('bad-value', file, r.fieldSpans[field]!, `${field} applies to thermistor and rtd channels; '${sensor!.name}' is a junction`);
    r.ok = false;
  };
  if (sensor && sensor.kind === 'junction' && bias?.kind === 'divider') {
    r.sink.report('bad-value', file, bias.span, 'a divider bias is for a thermistor or an rtd; bias a junction with `resistor R from V` or `current I`');
    r.ok = false;
  }
  if (resistive && bias?.kind === 'resistor') {
    r.sink.report('bad-value', file, bias.span, `'${sensor.name}' is a ${sensor.kind}: write its bias as \`divider ${formatSI(bias.ohms.value, 'Ω').replace(' ', '')} above from ${formatSI(bias.supply.value, 'V')}\` (or \`below\`), or \`current I\``);
    r.ok = false;
  }
  const ratio = r.choice('ratiometric', 'no');
  if (r.terms('ratiometric') && ratio === 'yes') {
    if (!bias || bias.kind !== 'divider') {
      if (bias) {
        r.sink.report('bad-value', file, r.fieldSpans['ratiometric']!, 'ratiometric = yes needs a divider bias (the ADC reference is the divider supply)');
        r.ok = false;
      }
    } else if (adc && Math.abs(bias.supply.value - adc.reference.value) > 1e-9 * adc.reference.value) {
      r.sink.report('out-of-domain', file, bias.supply.span, `ratiometric: the divider supply (${formatSI(bias.supply.value, 'V')}) must be the same rail as the reference of '${adc.name}' (${formatSI(adc.reference.value, 'V')})`);
      r.ok = false;
    } else out.ratiometric = true;
  }
  const hasAmp = r.terms('gain') !== undefined || r.terms('offset') !== undefined;
  if (hasAmp) {
    if (sensor && !resistive) {
      if (r.terms('gain')) junctionOnly('gain');
      if (r.terms('offset')) junctionOnly('offset');
    } else {
      const g = r.quantity('gain', 1);
      const o = r.quantity('offset', 0);
      // Domains (schema.ts) are checked as they are read.
      if (g && o) out.amplifier = { gain: g.value, offsetVolts: o.value };
    }
  }
  const wiring = readWiring(r);
  if (wiring) {
    if (sensor && !resistive) junctionOnly('wiring');
    else out.wiring = wiring;
  }
  const g = r.terms('compare_group');
  if (g) {
    const w = g[0]!;
    if (w.kind !== 'word' || !noExtra(g, 1, r.ctx('compare_group'))) {
      r.sink.report('bad-value', file, spanOf(g), 'compare_group takes a name such as `fridge`');
      r.ok = false;
    } else out.compareGroup = w.text;
  }
  return out;
}

