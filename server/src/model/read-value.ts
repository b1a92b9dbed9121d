// Readers that turn a field's terms into numbers in base SI units, reporting every problem
// with the span of the offending term. They return null when the value is unusable.
import type { QuantityTerm, Span, Term } from '../syntax/ast';
import type { DiagnosticSink } from '../diagnostics/diagnostic';
import { DIMENSION_WORDS, readUnit, type Dimension, type UnitInfo } from './units';
import { HALF_TYPED, PART_DOMAINS, type FieldForm } from './schema';
import type { Toleranced } from './types';
import { shown } from '../diagnostics/shown';

export interface ReadContext {
  file: string;
  sink: DiagnosticSink;
  field: string;
}

type QuantityForm = Extract<FieldForm, { form: 'quantity' }>;

export function spanOf(terms: Term[]): Span {
  // One term: its own span (spans are never changed in place; shift.ts makes copies).
  if (terms.length === 1) return terms[0]!.span;
  return { start: terms[0]!.span.start, end: terms[terms.length - 1]!.span.end };
}

// The one way figures reach users (never NaN, Infinity or -0): diagnostics/numbers.ts, re-exported here.
export { formatSI, trimNumber, fixedNumber } from '../diagnostics/numbers';
import { trimNumber } from '../diagnostics/numbers';

function unitOf(term: QuantityTerm, ctx: ReadContext): UnitInfo | null {
  if (!term.unit) return null;
  const u = readUnit(term.unit.text);
  if (typeof u === 'string') {
    ctx.sink.report('wrong-unit', ctx.file, term.unit.span, `${ctx.field}: ${u}`);
    return null;
  }
  return u;
}

/**
 * Reads one quantity in the given dimension. Resistances may omit the unit or give only a
 * prefix (the resistor code of IEC 60062: 4k7, 10k); plain numbers need no unit.
 */
export function readQuantityValue(term: QuantityTerm, dimension: Dimension, ctx: ReadContext, difference = false): number | null {
  const raw = term.number.value;
  if (!Number.isFinite(raw)) {
    ctx.sink.report('out-of-domain', ctx.file, term.number.span, `${ctx.field}: '${shown(term.number.text)}' is too large to be a number`);
    return null;
  }
  const unit = term.unit ? unitOf(term, ctx) : undefined;
  if (unit === null) return null;
  if (unit === undefined || unit.prefixOnly) {
    const scale = unit ? unit.scale : 1;
    if (dimension === 'dimensionless' || dimension === 'resistance' || dimension === 'count') return scaleBy(raw, scale);
    ctx.sink.report('wrong-unit', ctx.file, term.span, `${ctx.field} takes ${DIMENSION_WORDS[dimension]}: add a unit, e.g. ${exampleUnit(dimension)}`);
    return null;
  }
  if (unit.dimension !== dimension) {
    ctx.sink.report('wrong-unit', ctx.file, term.unit!.span, `${ctx.field} takes ${DIMENSION_WORDS[dimension]}, but '${shown(term.unit!.text)}' is ${DIMENSION_WORDS[unit.dimension]}`);
    return null;
  }
  if (dimension === 'temperature') {
    return difference ? scaleBy(raw, unit.scale) : scaleBy(raw, unit.scale) + unit.offset;
  }
  return scaleBy(raw, unit.scale);
}

/** value * scale, dividing by 10^n for sub-unit prefixes so that 20 u gives exactly 2e-5. */
export function scaleBy(value: number, scale: number): number {
  if (scale < 1) {
    const inv = Math.round(1 / scale);
    if (Math.abs(inv * scale - 1) < 1e-12) return value / inv;
  }
  return value * scale;
}

function exampleUnit(d: Dimension): string {
  const ex: Record<Dimension, string> = {
    voltage: '3.3 V', current: '100 uA', resistance: '4k7', capacitance: '100 nF', temperature: '25 °C', energy: '1.11 eV',
    power: '10 mW', 'thermal-resistance': '350 K/W', ratio: '1 %', count: '8 counts', time: '10 s', 'temperature-rate': '2 K/min', dimensionless: '3',
  };
  return ex[d];
}

/** Relative tolerance from `± 1 %` (ratio) or `± 0.1 V` (absolute, divided by the value). */
export function readTolerance(tol: QuantityTerm, nominal: number, dimension: Dimension, ctx: ReadContext): number | null {
  const unit = tol.unit ? readUnit(tol.unit.text) : null;
  if (typeof unit === 'string') {
    ctx.sink.report('wrong-unit', ctx.file, tol.unit!.span, `${ctx.field}: ${unit}`);
    return null;
  }
  let rel: number;
  if (unit && unit.dimension === 'ratio') rel = scaleBy(tol.number.value, unit.scale);
  else {
    const abs = readQuantityValue(tol, dimension, ctx, true);
    if (abs === null) return null;
    if (nominal === 0) {
      ctx.sink.report('bad-value', ctx.file, tol.span, `${ctx.field}: give the tolerance of a zero value in % or ppm`);
      return null;
    }
    rel = Math.abs(abs / nominal);
  }
  if (!(rel >= 0) || rel >= 1) {
    const found = rel * 100 < 1e6 ? `${trimNumber(rel * 100, 4)} %` : shortText(tol.number.text) + (tol.unit ? ` ${tol.unit.text}` : '');
    ctx.sink.report('out-of-domain', ctx.file, tol.span, `${ctx.field}: a tolerance must be from 0 % to below 100 % (found ${found})`);
    return null;
  }
  return rel;
}

const BASE_UNIT: Record<Dimension, string> = {
  voltage: 'V', current: 'A', resistance: 'Ω', capacitance: 'F', temperature: 'K', energy: 'eV', power: 'W',
  'thermal-resistance': 'K/W', ratio: '', count: 'counts', time: 's', 'temperature-rate': 'K/s', dimensionless: '',
};

/** A quantity's domain in words: "from 1 to 1000000 Ω", "above 0 and at most 1". */
export function describeDomain(form: QuantityForm): string {
  const base = BASE_UNIT[form.dimension] ? ` ${BASE_UNIT[form.dimension]}` : '';
  const kind = form.integer ? 'a whole number ' : '';
  return form.minInclusive ? `${kind}from ${form.min} to ${form.max}${base}` : `${kind}above ${form.min} and at most ${form.max}${base}`;
}

/** Checks the domain of a quantity field and reports a precise range when it is outside. */
/** `shown` gives the value as written, for the message (made only when there is one). */
export function checkDomain(value: number, form: QuantityForm, span: Span, ctx: ReadContext, shown: () => string): boolean {
  const lowOk = form.minInclusive ? value >= form.min : value > form.min;
  const highOk = value <= form.max;
  const intOk = !form.integer || Number.isInteger(value);
  if (lowOk && highOk && intOk) return true;
  ctx.sink.report('out-of-domain', ctx.file, span, `${ctx.field} must be ${describeDomain(form)} (found ${shown()})`);
  return false;
}

/** A value inside a phrase or range read in its stated domain (schema.ts PART_DOMAINS); null when outside (reported). */
export function readPart(term: QuantityTerm, domain: QuantityForm, ctx: ReadContext): number | null {
  const value = readQuantityValue(term, domain.dimension, ctx, domain.difference ?? false);
  if (value === null) return null;
  return checkDomain(value, domain, term.span, ctx, () => showValue(value, term, domain.dimension)) ? value : null;
}

/** Reads a quantity field, with its optional tolerance. */
export function readQuantityField(terms: Term[], form: QuantityForm, ctx: ReadContext): Toleranced | null {
  const first = terms[0];
  if (!first || first.kind !== 'quantity') {
    ctx.sink.report('bad-value', ctx.file, spanOf(terms), `${ctx.field} takes ${DIMENSION_WORDS[form.dimension]}, e.g. ${exampleUnit(form.dimension)}`);
    return null;
  }
  if (!noExtra(terms, 1, ctx)) return null;
  const value = readQuantityValue(first, form.dimension, ctx, form.difference ?? false);
  if (value === null) return null;
  if (!checkDomain(value, form, first.span, ctx, () => showValue(value, first, form.dimension))) return null;
  let tolerance = 0;
  if (first.tolerance) {
    if (!form.tolerance) {
      ctx.sink.report('bad-value', ctx.file, first.tolerance.span, `${ctx.field} takes no tolerance`);
      return null;
    }
    const t = readTolerance(first.tolerance, value, form.dimension, ctx);
    if (t === null) return null;
    tolerance = t;
  }
  return { value, tolerance, span: first.span };
}

function showValue(value: number, term: QuantityTerm, dimension?: Dimension): string {
  const text = shortText(shown(term.number.text)) + (term.unit ? ` ${shown(term.unit.text)}` : '');
  const base = dimension && BASE_UNIT[dimension] ? ` ${BASE_UNIT[dimension]}` : '';
  // The value in base units only where it reads as a figure (a far-out value is shown as written).
  const readable = value === 0 || (Math.abs(value) >= 1e-15 && Math.abs(value) < 1e15);
  return value === term.number.value || !readable ? text : `${text} = ${trimNumber(value, 6)}${base}`;
}

/** A number as written, shortened when very long (a 100,000-digit value is not echoed in full). */
function shortText(text: string): string {
  return text.length > 24 ? `${text.slice(0, 20)}…` : text;
}

export function noExtra(terms: Term[], used: number, ctx: ReadContext): boolean {
  if (terms.length <= used) return true;
  const extra = spanOf(terms.slice(used));
  ctx.sink.report('bad-value', ctx.file, extra, `${ctx.field}: unexpected text after the value`);
  return false;
}

/**
 * Reports what a half-typed phrase lacks (schema.ts HALF_TYPED, from the word or number it ends
 * with) at its end, and returns true; false when the phrase does not end that way.
 */
export function askForRest(terms: Term[], ctx: ReadContext): boolean {
  const last = terms[terms.length - 1];
  const table = HALF_TYPED[ctx.field];
  const before = terms[terms.length - 2];
  // A number after a word (`resistor 47k`) is looked up as `resistor _`, else as ''.
  const afterWord = last?.kind === 'quantity' && before?.kind === 'word' ? table?.[`${before.text} _`] : undefined;
  const key = last?.kind === 'word' ? last.text : last?.kind === 'quantity' ? '' : undefined;
  const want = afterWord ?? (key === undefined ? undefined : table?.[key]);
  if (!last || want === undefined) return false;
  ctx.sink.report('bad-value', ctx.file, last.span, `${ctx.field} is not finished: add ${want}`);
  return true;
}

/** Reads `low .. high` in a dimension; the low end may borrow the high end's unit (-40 .. 125 °C). */
export function readRange(terms: Term[], dimension: Dimension, ctx: ReadContext): { low: number; high: number; span: Span } | null {
  const t = terms[0];
  if (t && t.kind === 'quantity' && terms.length === 1) {
    // Half-typed: one end only. Ask for the upper end (a range ends with a value, not a word).
    const high = dimension === 'temperature' ? '125 °C' : exampleUnit(dimension);
    ctx.sink.report('bad-value', ctx.file, t.span, `${ctx.field} needs its upper end: add \`.. ${high}\` after the lower end (a range reads \`low .. high\`)`);
    return null;
  }
  if (!t || t.kind !== 'range') {
    ctx.sink.report('bad-value', ctx.file, spanOf(terms), `${ctx.field} takes a range such as ${dimension === 'temperature' ? '-40 °C .. 125 °C' : `${exampleUnit(dimension)} .. ${exampleUnit(dimension)}`}`);
    return null;
  }
  if (!noExtra(terms, 1, ctx)) return null;
  const lowTerm: QuantityTerm = t.low.unit || !t.high.unit ? t.low : { ...t.low, unit: t.high.unit };
  const domain = dimension === 'temperature' ? PART_DOMAINS.temperature : dimension === 'current' ? PART_DOMAINS.currentBound : null;
  const read = (q: QuantityTerm) => (domain ? readPart(q, domain, ctx) : readQuantityValue(q, dimension, ctx));
  const low = read(lowTerm);
  const high = read(t.high);
  if (low === null || high === null) return null;
  if (!(high > low)) {
    ctx.sink.report('out-of-domain', ctx.file, t.span, `${ctx.field}: the upper end must be above the lower end`);
    return null;
  }
  return { low, high, span: t.span };
}
