// Reads a thermistor block: its curve given one way (beta and R25, Steinhart-Hart coefficients, or
// three measured points fitted exactly), the resistance tolerance, rated range and dissipation.
import type { BlockReader } from '../../model/block-reader';
import type { Toleranced } from '../../model/types';
import { checkDomain, noExtra, readPart, readQuantityValue, readTolerance, spanOf, trimNumber } from '../../model/read-value';
import { fieldSpec, PART_DOMAINS, type FieldForm } from '../../model/schema';
import { betaToSteinhartHart, fitSteinhartHart, shMonotonicMessage, shResistanceAt, type ShCoefficients } from '../../physics/steinhart-hart';
import { shown } from '../../diagnostics/shown';
import type { DefBase } from '../../model/types';
import { readDissipation } from '../resistive/read';
import type { ThermistorDef } from './types';

const ZERO_C = 273.15;
const T25 = 25 + ZERO_C;

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
  const form = fieldSpec(r.spec, 'beta')!.form as Extract<FieldForm, { form: 'quantity' }>;
  if (!checkDomain(k, form, q.span, r.ctx('beta'), () => `${trimNumber(k, 6)} K; NTC thermistors sit around 3000 K to 5000 K`)) {
    r.ok = false;
    return null;
  }
  const tol = q.tolerance ? readTolerance(q.tolerance, k, 'temperature', { ...r.ctx('beta') }) : 0;
  if (tol === null) return (r.ok = false), null;
  return { value: k, tolerance: tol, span: q.span };
}

export function readThermistor(r: BlockReader, base: DefBase): ThermistorDef | null {
  const name = r.ref.node.name;
  const rated = r.range('rated', [-40 + ZERO_C, 125 + ZERO_C]);
  const theta = readDissipation(r, 1.5e-3);
  // A field written with no value (asked for already) still says which way the curve is given.
  const has = (f: string) => r.terms(f) !== undefined || r.empty.has(f);
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
