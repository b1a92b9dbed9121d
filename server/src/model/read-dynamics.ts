// Reader of a channel's dynamics fields (schema.ts: time_constant, sample_period, settling, ramp_lag,
// noise_limit). Each bad value is reported with the span of the offending term and a precise range;
// never throws. What a figure still needs (an accuracy for `settling`, the adc noise for
// `noise_limit`) is the dynamics check's to say (checks/dynamics.ts), not the reader's.
import type { QuantityTerm, Term } from '../syntax/ast';
import type { DynamicsSpec } from './types';
import { noExtra, readPart, spanOf, type ReadContext } from './read-value';
import { PART_DOMAINS } from './schema';

/** The fields this reader takes, in the schema's order. */
export const DYNAMICS_FIELDS = ['time_constant', 'sample_period', 'settling', 'ramp_lag', 'noise_limit'] as const;

function bad(ctx: ReadContext, terms: Term[], hint: string): null {
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
  if (!t) return bad(ctx, terms, hint);
  if (terms.length === 1) {
    const seconds = readPart(t, PART_DOMAINS.settleTime, ctx);
    return seconds === null ? null : { seconds };
  }
  const d = quantityAt(terms, 2);
  if (!wordAt(terms, 1, 'for') || !d || !wordAt(terms, 3, 'step')) return bad(ctx, terms, hint);
  if (!noExtra(terms, 4, ctx)) return null;
  const seconds = readPart(t, PART_DOMAINS.settleTime, ctx);
  const stepK = readPart(d, PART_DOMAINS.settleStep, ctx);
  return seconds === null || stepK === null ? null : { seconds, stepK };
}

/** `0.5 K at 2 K/min`. */
export function readRampLag(terms: Term[], ctx: ReadContext): NonNullable<DynamicsSpec['rampLag']> | null {
  const lag = quantityAt(terms, 0);
  const ramp = quantityAt(terms, 2);
  if (!lag || !wordAt(terms, 1, 'at') || !ramp) return bad(ctx, terms, 'takes a lag and a ramp such as `0.5 K at 2 K/min`');
  if (!noExtra(terms, 3, ctx)) return null;
  const lagK = readPart(lag, PART_DOMAINS.rampLag, ctx);
  const rampKPerS = readPart(ramp, PART_DOMAINS.ramp, ctx);
  return lagK === null || rampKPerS === null ? null : { lagK, rampKPerS };
}

/** `0.05 °C rms` (or K; `rms` may be left out). */
export function readNoiseLimit(terms: Term[], ctx: ReadContext): number | null {
  const q = quantityAt(terms, 0);
  const rms = terms.length > 1 ? wordAt(terms, 1, 'rms') : true;
  if (!q || !rms) return bad(ctx, terms, 'takes an rms temperature noise such as `0.05 °C rms`');
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
