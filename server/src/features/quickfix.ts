// Quick fixes computed by the engine. Each candidate edit is applied to the text and the spec is
// analysed again: a fix is offered only when it clears its diagnostic without adding a clip, and
// its title reports the figure it achieves. Keys on diagnostic codes and data, never on messages.
import type { Analysis } from '../analysis/result';
import type { Diagnostic } from '../diagnostics/diagnostic';
import type { BlockNode, FieldNode, QuantityTerm, Span } from '../syntax/ast';
import type { ChannelResult } from '../analysis/types';
import type { AdcDef } from '../model/types';
import { blockKinds, blockSpec, fieldSpec } from '../model/schema';
import { closest } from '../model/suggest';
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
          push(out, bitsFix(input, d));
          push(out, referenceFix(input, d, 'down'));
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
  return { title: `Use ${bits} bits for '${adc.name}': worst ${f.perCount(r.summary.worst.celsiusPerCount)}`, diagnostic: d, edits };
}

function referenceFix(input: FixInput, d: Diagnostic, direction: 'up' | 'down'): QuickFix | null {
  const limit = d.data?.[direction === 'up' ? 'neededReference' : 'maxReference'];
  const ch = channelOf(input.analysis, d);
  if (typeof limit !== 'number' || !(limit > 0) || !ch) return null;
  const adc = ch.result.channel.adc;
  const field = adcField(input.analysis, adc, 'reference');
  const q = field?.value[0];
  if (!field || q?.kind !== 'quantity') return null;
  const name = ch.result.channel.name;
  const before = clipCount(input.analysis) - (direction === 'up' ? 1 : 0);
  // Standard references first (nearest to the limit), then the limit rounded to 3 digits.
  const step = 10 ** (Math.floor(Math.log10(limit)) - 2);
  const roundedSafe = Number(((direction === 'up' ? Math.ceil(limit / step) : Math.floor(limit / step)) * step).toPrecision(3));
  const standard = direction === 'up' ? COMMON_REFERENCES.filter((v) => v >= limit).slice(0, 2) : COMMON_REFERENCES.filter((v) => v <= limit).reverse().slice(0, 2);
  const code = direction === 'up' ? 'clip-high' : 'resolution-short';
  for (const v of [...standard, roundedSafe]) {
    const edits = [{ file: adc.file, span: numberAndUnit(q), newText: `${f.trimNumber(v, 4)} V` }];
    const r = trial(input, edits, name, (after) => !hasCode(after, name, [code]) && clipCount(after) <= Math.max(0, before));
    if (!r) continue;
    const figure = direction === 'up'
      ? `peak ${f.volts(r.summary.voltsMax)} = ${f.percent(r.summary.voltsMax / v)} of it`
      : `worst ${f.perCount(r.summary.worst.celsiusPerCount)}, peak at ${f.percent(r.summary.voltsMax / v)}`;
    return { title: `Set the reference of '${adc.name}' to ${f.trimNumber(v, 4)} V: ${figure}`, diagnostic: d, edits, preferred: direction === 'up' };
  }
  return null;
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
