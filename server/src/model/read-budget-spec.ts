// Readers for the error-budget fields of the spec (phrase fields of schema.ts): converter errors,
// the two-current bias, calibration, measured points, Monte Carlo settings and oversampling.
// Each reports bad input with the span of the offending term and returns null; never throws.
import type { QuantityTerm, Span, Term } from '../syntax/ast';
import type { BenchDataRef, BiasDef, CalibrationSpec, DynamicsSpec, MeasuredPoint, MonteCarloSpec } from './types';
import { askForRest, noExtra, readPart, readQuantityValue, readTolerance, spanOf, trimNumber, type ReadContext } from './read-value';
import { PART_DOMAINS } from './schema';
import { readUnit } from './units';
import { shown } from '../diagnostics/shown';

/** With `terms`: a half-typed phrase is asked for what it lacks instead (read-value.ts askForRest). */
function bad(ctx: ReadContext, span: Span, message: string, terms?: Term[]): null {
  if (terms && askForRest(terms, ctx)) return null;
  ctx.sink.report('bad-value', ctx.file, span, `${ctx.field}: ${message}`);
  return null;
}

function outOfDomain(ctx: ReadContext, span: Span, message: string): null {
  ctx.sink.report('out-of-domain', ctx.file, span, `${ctx.field}: ${message}`);
  return null;
}

/** The quantity of `± q` or of a bare `q` (taken as its magnitude). */
export function boundTerm(terms: Term[]): QuantityTerm | null {
  const t = terms[0];
  if (!t) return null;
  if (t.kind === 'tolerance') return t.amount;
  if (t.kind === 'quantity' && !t.tolerance) return t;
  return null;
}

/** `± 2 LSB` (also counts): a non-negative bound in LSB, at most 1000. */
export function readLsbBound(terms: Term[], ctx: ReadContext): number | null {
  const q = boundTerm(terms);
  if (!q || !noExtra(terms, 1, ctx)) return bad(ctx, spanOf(terms), 'takes a bound in LSB such as `± 2 LSB`');
  const v = readQuantityValue(q, 'count', ctx);
  if (v === null) return null;
  const abs = Math.abs(v);
  if (!(abs <= 1000)) return outOfDomain(ctx, q.span, `must be from 0 to 1000 LSB (found ${shown(q.number.text)})`);
  return abs;
}

/** `± 0.2 %`: a relative bound from 0 to below 50 %. */
export function readRelativeBound(terms: Term[], ctx: ReadContext): number | null {
  const q = boundTerm(terms);
  const u = q?.unit ? readUnit(q.unit.text) : null;
  if (!q || !u || typeof u === 'string' || u.dimension !== 'ratio' || !noExtra(terms, 1, ctx)) return bad(ctx, spanOf(terms), 'takes a relative bound such as `± 0.2 %`');
  const v = Math.abs(q.number.value * u.scale);
  if (!(v < 0.5)) return outOfDomain(ctx, q.span, `must be from 0 % to below 50 % (found ${shown(q.number.text)} ${shown(q.unit!.text)})`);
  return v;
}

/** `0.8 LSB rms` or `0.3 mV rms`: noise in LSB rms (volts are divided by the LSB). */
export function readNoise(terms: Term[], ctx: ReadContext, lsbVolts: number): number | null {
  const q = terms[0];
  const rms = terms[1];
  const hint = 'takes an rms noise such as `0.8 LSB rms` or `0.3 mV rms`';
  if (!q || q.kind !== 'quantity' || q.tolerance || (rms && (rms.kind !== 'word' || rms.text !== 'rms')) || !noExtra(terms, rms ? 2 : 1, ctx)) return bad(ctx, spanOf(terms), hint, terms);
  const u = q.unit ? readUnit(q.unit.text) : null;
  if (!u || typeof u === 'string') return bad(ctx, q.span, hint);
  let lsb: number | null;
  if (u.dimension === 'count') lsb = readQuantityValue(q, 'count', ctx);
  else if (u.dimension === 'voltage') {
    const v = readQuantityValue(q, 'voltage', ctx);
    lsb = v === null ? null : v / lsbVolts;
  } else return bad(ctx, q.span, hint);
  if (lsb === null) return null;
  if (!(lsb >= 0 && lsb <= 1e6)) return outOfDomain(ctx, q.span, `must be from 0 to 1e6 LSB rms (found ${trimNumber(lsb, 4)} LSB)`);
  return lsb;
}

export function isTwoCurrentBias(terms: Term[] | undefined): boolean {
  const h = terms?.[0];
  return h?.kind === 'word' && (h.text === 'currents' || h.text === 'resistors');
}

/**
 * `currents I1 and I2` or `resistors R1 and R2 from V` (each with an optional tolerance; the
 * supply is shared, so its error is common to both readings).
 */
export function readTwoCurrentBias(terms: Term[], ctx: ReadContext): { first: BiasDef; second: BiasDef } | null {
  const span = spanOf(terms);
  const hint = 'takes `currents 10 uA and 100 uA` or `resistors 330k and 33k from 3.3 V` for the two-current method';
  const head = terms[0] as Extract<Term, { kind: 'word' }>;
  const a = terms[1];
  const and = terms[2];
  const b = terms[3];
  if (!a || a.kind !== 'quantity' || !and || and.kind !== 'word' || and.text !== 'and' || !b || b.kind !== 'quantity') return bad(ctx, span, hint, terms);
  const tolOf = (q: QuantityTerm, v: number, dim: 'current' | 'resistance' | 'voltage') => (q.tolerance ? readTolerance(q.tolerance, v, dim, ctx) : 0);
  if (head.text === 'currents') {
    if (!noExtra(terms, 4, ctx)) return null;
    const i1 = readPart(a, PART_DOMAINS.biasCurrent, ctx);
    const i2 = readPart(b, PART_DOMAINS.biasCurrent, ctx);
    if (i1 === null || i2 === null) return null;
    const t1 = tolOf(a, i1, 'current');
    const t2 = tolOf(b, i2, 'current');
    if (t1 === null || t2 === null) return null;
    if (!ratioOk(i1, i2, ctx, span)) return null;
    return {
      first: { kind: 'current', amps: { value: i1, tolerance: t1, span: a.span }, span },
      second: { kind: 'current', amps: { value: i2, tolerance: t2, span: b.span }, span },
    };
  }
  const from = terms[4];
  const v = terms[5];
  if (!from || from.kind !== 'word' || from.text !== 'from' || !v || v.kind !== 'quantity' || !noExtra(terms, 6, ctx)) return bad(ctx, span, hint, terms);
  const r1 = readPart(a, PART_DOMAINS.biasResistor, ctx);
  const r2 = readPart(b, PART_DOMAINS.biasResistor, ctx);
  const vs = readPart(v, PART_DOMAINS.supply, ctx);
  if (r1 === null || r2 === null || vs === null) return null;
  const t1 = tolOf(a, r1, 'resistance');
  const t2 = tolOf(b, r2, 'resistance');
  const tv = tolOf(v, vs, 'voltage');
  if (t1 === null || t2 === null || tv === null) return null;
  if (!ratioOk(r1, r2, ctx, span)) return null;
  const supply = { value: vs, tolerance: tv, span: v.span };
  return {
    first: { kind: 'resistor', ohms: { value: r1, tolerance: t1, span: a.span }, supply, span },
    second: { kind: 'resistor', ohms: { value: r2, tolerance: t2, span: b.span }, supply, span },
  };
}

/** The two biases must differ by at least 1.5:1 (else the difference is lost in noise) and at most 10^4:1. */
function ratioOk(x: number, y: number, ctx: ReadContext, span: Span): boolean {
  const ratio = Math.max(x, y) / Math.min(x, y);
  if (ratio >= 1.5 && ratio <= 1e4) return true;
  outOfDomain(ctx, span, `the two biases must differ by a ratio from 1.5 to 10000 (found ${trimNumber(ratio, 4)})`);
  return false;
}

function temperatureAt(t: Term | undefined, ctx: ReadContext, lowK: number, highK: number): number | null {
  if (!t || t.kind !== 'quantity' || t.tolerance) return null;
  const k = readQuantityValue(t, 'temperature', ctx);
  if (k === null) return null;
  if (!(k >= lowK - 1e-9 && k <= highK + 1e-9)) {
    return outOfDomain(ctx, t.span, `${shown(t.number.text)}${t.unit ? ' ' + t.unit.text : ''} is outside the channel range ${trimNumber(lowK - 273.15, 5)} °C .. ${trimNumber(highK - 273.15, 5)} °C`);
  }
  return k;
}

/** `none`, `one point at 25 °C`, `two points at 0 °C and 70 °C`. */
export function readCalibration(terms: Term[], ctx: ReadContext, lowK: number, highK: number): CalibrationSpec | null {
  const span = spanOf(terms);
  const hint = 'takes `none`, `one point at 25 °C` or `two points at 0 °C and 70 °C`';
  const w = (i: number) => {
    const t = terms[i];
    return t && t.kind === 'word' ? t.text : null;
  };
  if (w(0) === 'none') return noExtra(terms, 1, ctx) ? { mode: 'none', kelvins: [], span } : null;
  if (w(0) === 'one' && w(1) === 'point' && w(2) === 'at') {
    if (!noExtra(terms, 4, ctx)) return null;
    const k = temperatureAt(terms[3], ctx, lowK, highK);
    return k === null ? (terms[3]?.kind === 'quantity' ? null : bad(ctx, span, hint, terms)) : { mode: 'one-point', kelvins: [k], span };
  }
  if (w(0) === 'two' && w(1) === 'points' && w(2) === 'at' && w(4) === 'and') {
    if (!noExtra(terms, 6, ctx)) return null;
    const k1 = temperatureAt(terms[3], ctx, lowK, highK);
    const k2 = temperatureAt(terms[5], ctx, lowK, highK);
    if (k1 === null || k2 === null) return terms[3]?.kind === 'quantity' && terms[5]?.kind === 'quantity' ? null : bad(ctx, span, hint, terms);
    if (!(Math.abs(k2 - k1) >= 1)) return outOfDomain(ctx, span, 'the two calibration temperatures must be at least 1 K apart');
    return { mode: 'two-point', kelvins: k1 < k2 ? [k1, k2] : [k2, k1], span };
  }
  return bad(ctx, span, hint, terms);
}

/** `2110 counts at 25 °C and 1790 counts at 70 °C` (up to 32 points; codes inside the converter's). */
export function readMeasured(terms: Term[], ctx: ReadContext, bits: number): MeasuredPoint[] | null {
  const hint = 'takes points such as `2110 counts at 25 °C and 1790 counts at 70 °C`';
  const out: MeasuredPoint[] = [];
  let i = 0;
  while (i < terms.length) {
    if (i > 0) {
      const and = terms[i];
      if (!and || and.kind !== 'word' || and.text !== 'and') return bad(ctx, and?.span ?? spanOf(terms), hint, terms);
      i++;
    }
    const code = terms[i];
    const at = terms[i + 1];
    const temp = terms[i + 2];
    if (!code || code.kind !== 'quantity' || code.tolerance || !at || at.kind !== 'word' || at.text !== 'at' || !temp || temp.kind !== 'quantity' || temp.tolerance) {
      return bad(ctx, spanOf(terms.slice(i, i + 3).length ? terms.slice(i, i + 3) : terms), hint, terms);
    }
    const c = readQuantityValue(code, 'count', ctx);
    const k = readQuantityValue(temp, 'temperature', ctx);
    if (c === null || k === null) return null;
    const codeProblem = measuredCodeProblem(c, code.number.text, bits);
    if (codeProblem) return outOfDomain(ctx, code.span, codeProblem);
    if (!(k > 0)) return outOfDomain(ctx, temp.span, 'a temperature must be above 0 K (absolute zero)');
    out.push({ kelvin: k, code: c, span: { start: code.span.start, end: temp.span.end } });
    i += 3;
  }
  if (out.length === 0) return bad(ctx, spanOf(terms), hint, terms);
  if (out.length > 32) return outOfDomain(ctx, spanOf(terms), `at most 32 points (found ${out.length})`);
  return out;
}

/**
 * What is wrong with a measured code on a `bits`-bit converter (`written`: the code as the user wrote
 * it), or null: one rule for the spec's `measured` points and for rows of bench data.
 */
export function measuredCodeProblem(c: number, written: string, bits: number): string | null {
  const full = 2 ** bits;
  if (!(c >= 0 && c <= full - 1)) return `a ${bits}-bit code must be from 0 to ${full - 1} (found ${shown(written)})`;
  if (!Number.isInteger(c)) return `a code is a whole number of counts, 1 to ${full - 2} (found ${shown(written)}); give the code the converter returned`;
  // A code at either rail is a clipped reading: it says only "at or beyond", not which temperature.
  if (c === 0 || c === full - 1) return `code ${c} is the ${c === 0 ? 'bottom' : 'full scale'} of the ${bits}-bit converter: a clipped reading does not tell the temperature; use points whose codes lie from 1 to ${full - 2}`;
  return null;
}

/** `± 0.05 °C` (or K): the reference thermometer's uncertainty, a temperature difference from 0 to 10 K. */
export function readCalReference(terms: Term[], ctx: ReadContext): number | null {
  const q = boundTerm(terms);
  if (!q || !noExtra(terms, 1, ctx)) return bad(ctx, spanOf(terms), 'takes the reference thermometer\'s uncertainty such as `± 0.05 °C`');
  const k = readQuantityValue(q, 'temperature', ctx, true);
  if (k === null) return null;
  const abs = Math.abs(k);
  if (!(abs <= 10)) return outOfDomain(ctx, q.span, `must be from 0 to 10 K (found ${q.number.text}${q.unit ? ' ' + q.unit.text : ''})`);
  return abs;
}

/** `2000 runs`, `2000 runs seed 7`, optionally followed by `normal` or `uniform`. */
export function readMonteCarlo(terms: Term[], ctx: ReadContext): MonteCarloSpec | null {
  const hint = 'takes `1000 runs`, `2000 runs seed 7` or `2000 runs seed 7 normal`';
  const n = terms[0];
  const runs = terms[1];
  if (!n || n.kind !== 'quantity' || n.unit || n.tolerance || !runs || runs.kind !== 'word' || runs.text !== 'runs') return bad(ctx, spanOf(terms), hint, terms);
  if (!(Number.isInteger(n.number.value) && n.number.value >= 10 && n.number.value <= 1_000_000)) return outOfDomain(ctx, n.span, `runs must be a whole number from 10 to 1000000 (found ${shown(n.number.text)})`);
  let seed = 1;
  let distribution: MonteCarloSpec['distribution'] = 'uniform';
  let i = 2;
  const seedWord = terms[i];
  if (seedWord && seedWord.kind === 'word' && seedWord.text === 'seed') {
    const s = terms[i + 1];
    if (!s || s.kind !== 'quantity' || s.unit || s.tolerance) return bad(ctx, spanOf(terms), hint, terms);
    if (!(Number.isInteger(s.number.value) && s.number.value >= 0 && s.number.value <= 4294967295)) return outOfDomain(ctx, s.span, `seed must be a whole number from 0 to 4294967295 (found ${shown(s.number.text)})`);
    seed = s.number.value;
    i += 2;
  }
  const dist = terms[i];
  if (dist && dist.kind === 'word' && (dist.text === 'normal' || dist.text === 'uniform')) {
    distribution = dist.text;
    i++;
  }
  if (!noExtra(terms, i, ctx)) return null;
  return { runs: n.number.value, seed, distribution };
}

/** `2 bits`: 0 to 8 extra bits (4^8 = 65536 readings per result). */
export function readOversampling(terms: Term[], ctx: ReadContext): number | null {
  const q = terms[0];
  const w = terms[1];
  if (!q || q.kind !== 'quantity' || q.unit || q.tolerance || !w || w.kind !== 'word' || (w.text !== 'bits' && w.text !== 'bit') || !noExtra(terms, 2, ctx)) {
    return bad(ctx, spanOf(terms), 'takes a number of extra bits such as `2 bits`', terms);
  }
  if (!(Number.isInteger(q.number.value) && q.number.value >= 0 && q.number.value <= 8)) return outOfDomain(ctx, q.span, `must be a whole number of bits from 0 to 8 (found ${shown(q.number.text)})`);
  return q.number.value;
}

const BENCH_HINT = 'takes a CSV file path, optionally with a board, such as `"bench/run1.csv"` or `"bench/run1.csv" board A7`';

/** Reads the field's terms: `"file.csv"` or `"file.csv" board ID`. */
export function readBenchRef(terms: Term[], ctx: ReadContext): BenchDataRef | null {
  const bad = (span: Span, message: string): null => {
    ctx.sink.report('bad-value', ctx.file, span, `${ctx.field}: ${message}`);
    return null;
  };
  const file = terms[0];
  if (!file || file.kind !== 'string') return bad(spanOf(terms), BENCH_HINT);
  if (file.text.trim() === '') return bad(file.span, 'the file path is empty; ' + BENCH_HINT);
  if (terms.length === 1) return { path: file.text, span: file.span };
  const word = terms[1];
  const id = terms[2];
  if (terms.length !== 3 || !word || word.kind !== 'word' || word.text !== 'board' || !id) return bad(spanOf(terms.slice(1)), BENCH_HINT);
  const board = id.kind === 'string' || id.kind === 'word' ? id.text : id.kind === 'quantity' && !id.unit && !id.tolerance ? id.number.text : null;
  if (board === null || board === '') return bad(id.span, 'the board is a name, a number or a quoted text such as `A7`, `12` or `"line 2/7"`');
  return { path: file.text, board, span: file.span };
}

// ---------------------------------------------------------------- dynamics
// The channel's dynamics fields (time_constant, sample_period, settling, ramp_lag, noise_limit).
// What a figure still needs (an accuracy for `settling`, the adc noise for `noise_limit`) is the
// dynamics check's to say (checks/dynamics.ts), not the reader's.

/** The fields this reader takes, in the schema's order. */
export const DYNAMICS_FIELDS = ['time_constant', 'sample_period', 'settling', 'ramp_lag', 'noise_limit'] as const;

function badTerms(ctx: ReadContext, terms: Term[], hint: string): null {
  ctx.sink.report('bad-value', ctx.file, spanOf(terms), `${ctx.field}: ${hint}`);
  return null;
}

/** A plain quantity (no tolerance) at index i, or null. */
function quantityAt(terms: Term[], i: number): QuantityTerm | null {
  const t = terms[i];
  return t && t.kind === 'quantity' && !t.tolerance ? t : null;
}

function wordAt(terms: Term[], i: number, word: string): boolean {
  const t = terms[i];
  return t?.kind === 'word' && t.text === word;
}

/** `30 s` or `30 s for 20 K step`. */
export function readSettling(terms: Term[], ctx: ReadContext): NonNullable<DynamicsSpec['settling']> | null {
  const hint = 'takes a time such as `30 s`, or `30 s for 20 K step` for a step other than the whole range';
  const t = quantityAt(terms, 0);
  if (!t) return badTerms(ctx, terms, hint);
  if (terms.length === 1) {
    const seconds = readPart(t, PART_DOMAINS.settleTime, ctx);
    return seconds === null ? null : { seconds };
  }
  const d = quantityAt(terms, 2);
  if (!wordAt(terms, 1, 'for') || !d || !wordAt(terms, 3, 'step')) return badTerms(ctx, terms, hint);
  if (!noExtra(terms, 4, ctx)) return null;
  const seconds = readPart(t, PART_DOMAINS.settleTime, ctx);
  const stepK = readPart(d, PART_DOMAINS.settleStep, ctx);
  return seconds === null || stepK === null ? null : { seconds, stepK };
}

/** `0.5 K at 2 K/min`. */
export function readRampLag(terms: Term[], ctx: ReadContext): NonNullable<DynamicsSpec['rampLag']> | null {
  const lag = quantityAt(terms, 0);
  const ramp = quantityAt(terms, 2);
  if (!lag || !wordAt(terms, 1, 'at') || !ramp) return badTerms(ctx, terms, 'takes a lag and a ramp such as `0.5 K at 2 K/min`');
  if (!noExtra(terms, 3, ctx)) return null;
  const lagK = readPart(lag, PART_DOMAINS.rampLag, ctx);
  const rampKPerS = readPart(ramp, PART_DOMAINS.ramp, ctx);
  return lagK === null || rampKPerS === null ? null : { lagK, rampKPerS };
}

/** `0.05 °C rms` (or K; `rms` may be left out). */
export function readNoiseLimit(terms: Term[], ctx: ReadContext): number | null {
  const q = quantityAt(terms, 0);
  const rms = terms.length > 1 ? wordAt(terms, 1, 'rms') : true;
  if (!q || !rms) return badTerms(ctx, terms, 'takes an rms temperature noise such as `0.05 °C rms`');
  if (!noExtra(terms, terms.length > 1 ? 2 : 1, ctx)) return null;
  return readPart(q, PART_DOMAINS.noiseLimit, ctx);
}

/**
 * The channel's dynamics: undefined when it gives none of the fields, null when one is bad (reported).
 * `quantity` reads a quantity field with its tolerance (the block reader's own).
 */
export function readDynamics(
  terms: (name: string) => Term[] | undefined,
  ctx: (name: string) => ReadContext,
  quantity: (name: string) => { value: number; tolerance: number } | null,
): DynamicsSpec | null | undefined {
  if (!DYNAMICS_FIELDS.some((n) => terms(n))) return undefined;
  let ok = true;
  const out: DynamicsSpec = {};
  if (terms('time_constant')) {
    const q = quantity('time_constant');
    if (q) out.timeConstant = { seconds: q.value, tolerance: q.tolerance };
    else ok = false;
  }
  if (terms('sample_period')) {
    const q = quantity('sample_period');
    if (q) out.samplePeriodS = q.value;
    else ok = false;
  }
  const phrase = <T>(name: string, read: (t: Term[], c: ReadContext) => T | null, put: (v: T) => void) => {
    const t = terms(name);
    if (!t) return;
    const v = read(t, ctx(name));
    if (v === null) ok = false;
    else put(v);
  };
  phrase('settling', readSettling, (v) => (out.settling = v));
  phrase('ramp_lag', readRampLag, (v) => (out.rampLag = v));
  phrase('noise_limit', readNoiseLimit, (v) => (out.noiseLimitK = v));
  return ok ? out : null;
}
