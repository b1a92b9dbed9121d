// Quick fixes computed by the engine. Each candidate edit is applied to the text and the spec is
// analysed again: a fix is offered only when it clears its diagnostic without adding a clip, and
// its title reports the figure it achieves. Keys on diagnostic codes and data, never on messages.
import type { Analysis } from '../analysis/result';
import type { Diagnostic } from '../diagnostics/diagnostic';
import type { BlockNode, FieldNode, QuantityTerm, Span } from '../syntax/ast';
import type { ChannelResult } from '../analysis/types';
import type { AdcDef, ChannelDef } from '../model/types';
import { blockKinds, blockSpec, fieldSpec } from '../model/schema';
import { closest } from '../model/suggest';
import { INDENT } from '../model/language';
import { E24 } from '../analysis/eseries';
import { pointAt, sweepKelvins } from '../analysis/sweep';
import { effectiveOversamplingBits, noiseSuffices, samplesForExtraBits } from '../budget/oversampling';
import { locate, fieldOf } from './locate';
import * as f from '../analysis/figures';

export interface FixEdit {
  file: string;
  span: Span;
  newText: string;
}

export interface QuickFix {
  title: string;
  diagnostic: Diagnostic;
  edits: FixEdit[];
  preferred?: boolean;
}

export interface FixInput {
  analysis: Analysis;
  /** Fixes are offered for diagnostics of the entry file overlapping this span. */
  range: Span;
  /** Analyses the entry spec again with some files' text replaced. */
  reanalyse(overrides: Map<string, string>): Analysis;
}

/** Voltage references sold as standard parts or built into MCUs (common practice, no source). */
export const COMMON_REFERENCES = [1.024, 1.1, 1.2, 1.25, 1.5, 1.8, 2.048, 2.5, 3.0, 3.3, 4.096, 5.0];

const CLIPS = new Set(['clip-high', 'clip-low', 'clip-tolerance']);

export function quickFixes(input: FixInput): QuickFix[] {
  const a = input.analysis;
  const out: QuickFix[] = [];
  for (const d of a.diagnostics) {
    if (d.file !== a.path || d.span.end < input.range.start || d.span.start > input.range.end) continue;
    try {
      switch (d.code) {
        case 'bias-current-low':
        case 'bias-current-high':
          push(out, biasFix(input, d));
          break;
        case 'resolution-short':
          // In the order an author tries them: parts on the board first, the converter last.
          push(out, resolutionBiasFix(input, d));
          push(out, referenceFix(input, d, 'down'));
          push(out, oversamplingFix(input, d));
          push(out, narrowerRangeFix(input, d));
          push(out, bitsFix(input, d));
          break;
        case 'accuracy-unmet':
          push(out, calibrationFix(input, d));
          break;
        case 'clip-high':
          push(out, referenceFix(input, d, 'up'));
          break;
        case 'unknown-field':
        case 'unknown-name':
        case 'unknown-block':
          push(out, didYouMean(a, d));
          break;
        default:
          break;
      }
    } catch {
      // A fix that cannot be computed is simply not offered; the diagnostic still stands.
    }
  }
  return out;
}

function push(out: QuickFix[], fix: QuickFix | null): void {
  if (fix && !out.some((x) => x.title === fix.title)) out.push(fix);
}

/** Writes a resistance in the IEC 60062 code: 4k7, 82k, 1M5; below 1 kΩ a plain number or 4R7. */
export function iecCode(ohms: number): string {
  const [scale, letter] = ohms >= 1e9 ? [1e9, 'G'] : ohms >= 1e6 ? [1e6, 'M'] : ohms >= 1e3 ? [1e3, 'k'] : [1, 'R'];
  const m = f.trimNumber(ohms / scale, 3);
  if (m.includes('.')) return m.replace('.', letter);
  return letter === 'R' ? m : m + letter;
}

/** The analysed channel whose block holds the diagnostic, and that block. */
function channelOf(a: Analysis, d: Diagnostic): { result: ChannelResult; block: BlockNode } | null {
  const tree = a.files[0]!.parse.tree;
  for (const item of tree.items) {
    if (item.kind !== 'block' || d.span.start < item.span.start || d.span.end > item.span.end) continue;
    const result = f.channelResult(a, item.name.text);
    return result ? { result, block: item } : null;
  }
  return null;
}

/** Span of a quantity's number and unit (without its tolerance). */
function numberAndUnit(q: QuantityTerm): Span {
  return { start: q.number.span.start, end: q.unit ? q.unit.span.end : q.number.span.end };
}

function applyEdits(a: Analysis, edits: FixEdit[]): Map<string, string> {
  const out = new Map<string, string>();
  for (const e of edits) {
    const text = out.get(e.file) ?? a.files.find((x) => x.path === e.file)?.text;
    if (text === undefined) throw new Error(`no text for ${e.file}`);
    out.set(e.file, text.slice(0, e.span.start) + e.newText + text.slice(e.span.end));
  }
  return out;
}

function clipCount(a: Analysis): number {
  return a.diagnostics.filter((d) => CLIPS.has(d.code)).length;
}

/** Re-analyses with the edits; returns the channel's new result when `cleared` holds. */
function trial(input: FixInput, edits: FixEdit[], channel: string, cleared: (after: Analysis, r: ChannelResult) => boolean): ChannelResult | null {
  const after = input.reanalyse(applyEdits(input.analysis, edits));
  const r = f.channelResult(after, channel);
  return r && cleared(after, r) ? r : null;
}

/** Diagnostics of a code reported inside a channel's block of the entry file. */
function hasCode(a: Analysis, channel: string, codes: string[]): boolean {
  const block = a.files[0]!.parse.tree.items.find((i): i is BlockNode => i.kind === 'block' && i.name.text === channel);
  if (!block) return false;
  return a.diagnostics.some((d) => d.file === a.path && codes.includes(d.code) && d.span.start >= block.span.start && d.span.end <= block.span.end);
}

function biasFix(input: FixInput, d: Diagnostic): QuickFix | null {
  const ohms = d.data?.['suggestedOhms'];
  const ch = channelOf(input.analysis, d);
  if (typeof ohms !== 'number' || !ch) return null;
  const bias = fieldOf(ch.block, 'bias');
  const q = bias?.value[1];
  if (!bias || bias.value[0]?.kind !== 'word' || bias.value[0].text !== 'resistor' || q?.kind !== 'quantity') return null;
  const code = iecCode(ohms);
  const edits = [{ file: input.analysis.path, span: numberAndUnit(q), newText: code }];
  const name = ch.result.channel.name;
  const before = clipCount(input.analysis);
  const r = trial(input, edits, name, (after) => !hasCode(after, name, ['bias-current-low', 'bias-current-high']) && clipCount(after) <= before);
  if (!r) return null;
  return { title: `Set the bias resistor to ${code} (E24): ${f.amps(r.summary.ampsMin)} .. ${f.amps(r.summary.ampsMax)}`, diagnostic: d, edits, preferred: true };
}

/** The syntax node of an ADC's field (in whichever file defines the ADC). */
function adcField(a: Analysis, adc: AdcDef, key: string): FieldNode | undefined {
  const file = a.files.find((x) => x.path === adc.file);
  const block = file?.parse.tree.items.find((i): i is BlockNode => i.kind === 'block' && i.name.text === adc.name);
  return block ? fieldOf(block, key) : undefined;
}

function bitsFix(input: FixInput, d: Diagnostic): QuickFix | null {
  const bits = d.data?.['neededBits'];
  const ch = channelOf(input.analysis, d);
  if (typeof bits !== 'number' || !ch || bits > 24) return null;
  const adc = ch.result.channel.adc;
  const field = adcField(input.analysis, adc, 'bits');
  const q = field?.value[0];
  if (!field || q?.kind !== 'quantity') return null;
  const edits = [{ file: adc.file, span: numberAndUnit(q), newText: String(bits) }];
  const name = ch.result.channel.name;
  const before = clipCount(input.analysis);
  const r = trial(input, edits, name, (after) => !hasCode(after, name, ['resolution-short']) && clipCount(after) <= before);
  if (!r) return null;
  return { title: `Use a ${bits}-bit converter for '${adc.name}' (most MCUs' ADCs are fixed: an external ADC): worst ${f.perCount(r.summary.worst.celsiusPerCount)}`, diagnostic: d, edits };
}

function referenceFix(input: FixInput, d: Diagnostic, direction: 'up' | 'down'): QuickFix | null {
  const ch = channelOf(input.analysis, d);
  if (!ch) return null;
  const c = ch.result.channel;
  const adc = c.adc;
  const field = adcField(input.analysis, adc, 'reference');
  const q = field?.value[0];
  if (!field || q?.kind !== 'quantity') return null;
  const name = c.name;
  const vref = adc.reference.value;
  const before = clipCount(input.analysis) - (direction === 'up' ? 1 : 0);
  let candidates: number[];
  if (direction === 'up') {
    const limit = d.data?.['neededReference'];
    if (typeof limit !== 'number' || !(limit > 0)) return null;
    // Standard references first (nearest to the limit), then the limit rounded up to 3 digits.
    const step = 10 ** (Math.floor(Math.log10(limit)) - 2);
    candidates = [...COMMON_REFERENCES.filter((v) => v >= limit).slice(0, 2), Number((Math.ceil(limit / step) * step).toPrecision(3))];
  } else {
    // The largest common reference below the present one that meets the target and leaves the
    // signal, reference tolerance included, under full scale (computed on the channel's sweep).
    const need = c.resolutionKPerCount;
    if (need === null) return null;
    candidates = COMMON_REFERENCES.filter((v) => v < vref).reverse().filter((v) => {
      const alt: ChannelDef = { ...c, adc: { ...adc, reference: { ...adc.reference, value: v } } };
      const w = worstOf(alt);
      return w.perCount <= need && !w.clips;
    }).slice(0, 1);
  }
  const code = direction === 'up' ? 'clip-high' : 'resolution-short';
  const shared = input.analysis.channels.filter((r) => r.channel.adc.name === adc.name && r.channel.name !== name).length;
  for (const v of candidates) {
    const edits = [{ file: adc.file, span: numberAndUnit(q), newText: `${f.trimNumber(v, 4)} V` }];
    const r = trial(input, edits, name, (after) => !hasCode(after, name, [code]) && clipCount(after) <= Math.max(0, before));
    if (!r) continue;
    const headroom = `peak ${f.volts(r.summary.voltsMax)} = ${f.percent(r.summary.voltsMax / v)} of it${adc.reference.tolerance > 0 ? `, ${f.percent(r.summary.voltsMax / (v * (1 - adc.reference.tolerance)))} at its low tolerance` : ''}, no clipping`;
    const figure = direction === 'up'
      ? `peak ${f.volts(r.summary.voltsMax)} = ${f.percent(r.summary.voltsMax / v)} of it`
      : `worst ${f.perCount(r.summary.worst.celsiusPerCount / 2 ** effectiveOversamplingBits(r.channel))}; ${headroom}${shared ? `; also read by ${shared} other channel${shared > 1 ? 's' : ''}` : ''}`;
    return { title: `Set the reference of '${adc.name}' to ${f.trimNumber(v, 4)} V: ${figure}`, diagnostic: d, edits, preferred: direction === 'up' };
  }
  return null;
}

/** A channel's worst °C per count over its sweep (oversampling credited) and whether it clips. */
function worstOf(c: ChannelDef): { perCount: number; clips: boolean; ampsMax: number; selfHeatingK: number } {
  const os = effectiveOversamplingBits(c);
  const full = c.adc.reference.value * (1 - c.adc.reference.tolerance);
  let perCount = 0;
  let clips = false;
  let ampsMax = 0;
  let selfHeatingK = 0;
  for (const k of sweepKelvins(c)) {
    const p = pointAt(c, k);
    perCount = Math.max(perCount, p.celsiusPerCount / 2 ** os);
    if (!(p.volts < full) || p.volts < 0) clips = true;
    ampsMax = Math.max(ampsMax, p.amps);
    selfHeatingK = Math.max(selfHeatingK, p.selfHeatingK);
  }
  return { perCount: Number.isFinite(perCount) ? perCount : Infinity, clips, ampsMax, selfHeatingK };
}

/** The channel's diagnostics (codes) in its block of the entry file. */
function codesOf(a: Analysis, channel: string): string[] {
  const block = a.files[0]!.parse.tree.items.find((i): i is BlockNode => i.kind === 'block' && i.name.text === channel);
  if (!block) return [];
  return a.diagnostics.filter((x) => x.file === a.path && x.span.start >= block.span.start && x.span.end <= block.span.end).map((x) => x.code);
}

/** After the edit: `code` gone from the channel, no code there that was not there before, no new clip anywhere. */
function clearsOnly(input: FixInput, channel: string, code: string): (after: Analysis) => boolean {
  const before = new Set(codesOf(input.analysis, channel));
  const clips = clipCount(input.analysis);
  return (after) => {
    const now = codesOf(after, channel);
    return !now.includes(code) && now.every((x) => before.has(x)) && clipCount(after) <= clips;
  };
}

/** E24 values (IEC 60063) from a tenth to ten times `ohms`, nearest to it first. */
function e24Around(ohms: number): number[] {
  const out: number[] = [];
  const decade = Math.floor(Math.log10(ohms));
  for (let dd = decade - 2; dd <= decade + 2; dd++) {
    for (const m of E24) {
      const v = Number((m * 10 ** dd).toPrecision(2));
      if (v >= ohms / 10 && v <= ohms * 10 && Math.abs(Math.log(v / ohms)) > 1e-9) out.push(v);
    }
  }
  return out.sort((x, y) => Math.abs(Math.log(x / ohms)) - Math.abs(Math.log(y / ohms)));
}

/** resolution-short: the E24 bias or divider resistor nearest the present one that meets the target. */
function resolutionBiasFix(input: FixInput, d: Diagnostic): QuickFix | null {
  const ch = channelOf(input.analysis, d);
  if (!ch) return null;
  const c = ch.result.channel;
  const b = c.bias;
  const need = c.resolutionKPerCount;
  if (need === null || c.secondBias || (b.kind !== 'resistor' && b.kind !== 'divider')) return null;
  const bias = fieldOf(ch.block, 'bias');
  const q = bias?.value[1];
  if (!bias || q?.kind !== 'quantity') return null;
  const was = worstOf(c);
  const tried = e24Around(b.ohms.value).map((v) => ({ v, w: worstOf({ ...c, bias: { ...b, ohms: { ...b.ohms, value: v } } }) })).filter((x) => !x.w.clips);
  // The nearest value that meets the target; else the one that comes closest, if it helps enough.
  const meets = tried.find((x) => x.w.perCount <= need);
  const closer = tried.reduce<(typeof tried)[number] | undefined>((m, x) => (!m || x.w.perCount < m.w.perCount ? x : m), undefined);
  const pick = meets ?? (closer && closer.w.perCount <= was.perCount * WORTH_OFFERING ? closer : undefined);
  if (pick === undefined) return null;
  const code = iecCode(pick.v);
  const edits = [{ file: input.analysis.path, span: numberAndUnit(q), newText: code }];
  const r = trial(input, edits, c.name, meets ? clearsOnly(input, c.name, 'resolution-short') : addsNothing(input, c.name));
  if (!r) return null;
  const now = worstOf(r.channel);
  const heat = now.selfHeatingK > was.selfHeatingK ? `, self-heating up to ${f.rise(now.selfHeatingK)}` : '';
  const short = meets ? '' : ` (from ${f.perCount(was.perCount)}; ${f.trimNumber(need, 3)} needed)`;
  return {
    title: `Set the ${b.kind === 'divider' ? 'divider' : 'bias'} resistor to ${code} (E24): worst ${f.perCount(now.perCount)}${short}; current ${f.amps(r.summary.ampsMin)} .. ${f.amps(r.summary.ampsMax)}${heat}`,
    diagnostic: d, edits, preferred: meets !== undefined,
  };
}

/** A change that does not meet the target is offered when it takes at least a fifth off the worst °C per count. */
const WORTH_OFFERING = 0.8;

/** After the edit: no code in the channel that was not there before, no new clip anywhere. */
function addsNothing(input: FixInput, channel: string): (after: Analysis) => boolean {
  const before = new Set(codesOf(input.analysis, channel));
  const clips = clipCount(input.analysis);
  return (after) => codesOf(after, channel).every((x) => before.has(x)) && clipCount(after) <= clips;
}

/** Replaces a field's value in a channel block, or adds the field before the closing brace. */
function setField(a: Analysis, block: BlockNode, key: string, value: string): FixEdit | null {
  const field = fieldOf(block, key);
  if (field) {
    const first = field.value[0];
    const last = field.value[field.value.length - 1];
    return first && last ? { file: a.path, span: { start: first.span.start, end: last.span.end }, newText: value } : null;
  }
  const close = block.closeSpan;
  if (!close) return null;
  const text = a.files[0]!.text;
  const lineStart = Math.max(text.lastIndexOf('\n', close.start - 1), text.lastIndexOf('\r', close.start - 1)) + 1;
  const eol = text.includes('\r\n') ? '\r\n' : '\n';
  if (/^[ \t]*$/.test(text.slice(lineStart, close.start))) return { file: a.path, span: { start: lineStart, end: lineStart }, newText: `${INDENT}${key} = ${value}${eol}` };
  return { file: a.path, span: { start: close.start, end: close.start }, newText: `${eol}${INDENT}${key} = ${value}${eol}` };
}

/** At most this many extra bits by oversampling (4^8 = 65,536 readings a result). */
const MAX_OVERSAMPLING_BITS = 8;

/** resolution-short: oversampling and decimation, when the converter's stated noise lets it work. */
function oversamplingFix(input: FixInput, d: Diagnostic): QuickFix | null {
  const ch = channelOf(input.analysis, d);
  if (!ch) return null;
  const c = ch.result.channel;
  const need = c.resolutionKPerCount;
  if (need === null || c.secondBias || noiseSuffices(c) !== true) return null;
  const os = effectiveOversamplingBits(c);
  const perCount = ch.result.summary.worst.celsiusPerCount / 2 ** os;
  const n = os + Math.ceil(Math.log2(perCount / need) - 1e-12);
  if (!(n > os) || n > MAX_OVERSAMPLING_BITS) return null;
  const edit = setField(input.analysis, ch.block, 'oversampling', `${n} bits`);
  if (!edit) return null;
  const r = trial(input, [edit], c.name, clearsOnly(input, c.name, 'resolution-short'));
  if (!r) return null;
  const readings = samplesForExtraBits(n);
  const was = samplesForExtraBits(os);
  return {
    title: `Oversample by ${n} bits: worst ${f.perCount(r.summary.worst.celsiusPerCount / 2 ** n)}; ${readings} readings summed per result, ${readings / was}× the conversion time`,
    diagnostic: d, edits: [edit],
  };
}

/** resolution-short: the widest part of the range (whole °C) where the target is met. */
function narrowerRangeFix(input: FixInput, d: Diagnostic): QuickFix | null {
  const ch = channelOf(input.analysis, d);
  if (!ch) return null;
  const c = ch.result.channel;
  const need = c.resolutionKPerCount;
  const field = fieldOf(ch.block, 'range');
  const term = field?.value[0];
  if (need === null || c.secondBias || term?.kind !== 'range') return null;
  const os = effectiveOversamplingBits(c);
  const pts = ch.result.sweep;
  let best: [number, number] | null = null;
  for (let i = 0; i < pts.length; ) {
    if (!(pts[i]!.celsiusPerCount / 2 ** os <= need)) { i++; continue; }
    let j = i;
    while (j + 1 < pts.length && pts[j + 1]!.celsiusPerCount / 2 ** os <= need) j++;
    if (!best || pts[j]!.celsius - pts[i]!.celsius > best[1] - best[0]) best = [pts[i]!.celsius, pts[j]!.celsius];
    i = j + 1;
  }
  if (!best) return null;
  const lo = Math.ceil(best[0] - 1e-9);
  const hi = Math.floor(best[1] + 1e-9);
  const [from, to] = [c.lowK - 273.15, c.highK - 273.15];
  if (!(hi - lo >= 1) || (lo <= from && hi >= to)) return null;
  const edits = [{ file: input.analysis.path, span: term.span, newText: `${lo} °C .. ${hi} °C` }];
  const r = trial(input, edits, c.name, clearsOnly(input, c.name, 'resolution-short'));
  if (!r) return null;
  const lost = [lo > from ? `${f.celsius(from)} .. ${f.celsius(lo)}` : null, hi < to ? `${f.celsius(hi)} .. ${f.celsius(to)}` : null].filter((x) => x !== null).join(' and ');
  return {
    title: `Narrow the range to ${f.celsius(lo)} .. ${f.celsius(hi)}: worst ${f.perCount(r.summary.worst.celsiusPerCount / 2 ** os)}; ${lost} no longer covered`,
    diagnostic: d, edits,
  };
}

/** accuracy-unmet whose message names a calibration that meets the target: that calibration line. */
function calibrationFix(input: FixInput, d: Diagnostic): QuickFix | null {
  const text = d.data?.['calibration'];
  const ch = channelOf(input.analysis, d);
  if (typeof text !== 'string' || !ch) return null;
  const edit = setField(input.analysis, ch.block, 'calibration', text);
  if (!edit) return null;
  const r = trial(input, [edit], ch.result.channel.name, clearsOnly(input, ch.result.channel.name, 'accuracy-unmet'));
  const worst = r?.worstCaseBudget?.stated.worstAbsK;
  if (!r || worst === undefined) return null;
  const points = r.channel.calibration?.mode === 'two-point' ? 'two temperatures' : 'one temperature';
  return {
    title: `Calibrate each board: ${text}: worst case ±${f.kelvinDelta(worst)}; every board is measured at ${points}`,
    diagnostic: d, edits: [edit], preferred: true,
  };
}

/** "Did you mean": the nearest field name, definition name or block kind, from the schema and model. */
function didYouMean(a: Analysis, d: Diagnostic): QuickFix | null {
  const tree = a.files[0]!.parse.tree;
  const at = locate(tree, d.span.start);
  if (!at) return null;
  let word: string;
  let span: Span;
  let pool: string[];
  if (d.code === 'unknown-block' && at.kind === 'block-keyword') {
    word = at.block.keyword.text;
    span = at.block.keyword.span;
    pool = blockKinds();
  } else if (d.code === 'unknown-field' && at.kind === 'field-key') {
    const spec = blockSpec(at.block.keyword.text);
    if (!spec) return null;
    word = at.field.key.text;
    span = at.field.key.span;
    pool = spec.fields.map((x) => x.name);
  } else if (d.code === 'unknown-name' && at.kind === 'term' && at.term.kind === 'word') {
    const spec = blockSpec(at.block.keyword.text);
    const form = spec ? fieldSpec(spec, at.field.key.text)?.form : undefined;
    if (form?.form !== 'ref') return null;
    word = at.term.text;
    span = at.term.span;
    pool = [...a.model.blocks.values()].filter((b) => b.kind === form.target).map((b) => b.node.name.text);
  } else return null;
  const near = closest(word, pool);
  if (!near || near === word) return null;
  return { title: `Change '${word}' to '${near}'`, diagnostic: d, edits: [{ file: a.path, span, newText: near }], preferred: true };
}
