// parse(): text -> syntax tree plus every syntax problem. Never throws.
//
// The grammar turns each line it cannot read into an error node and carries on. For each such
// node we re-parse just that line with a narrower start rule to get peggy's own account of what
// was expected and where, shifted back to document offsets.

import * as generated from './parser.generated.js';
import type { DocumentNode, ErrorNode, ParseResult, Span, SyntaxProblem, TopItem } from './ast';

/**
 * Parses `text`. With a cache, the text is cut before every block header line and each piece is
 * parsed on its own (a header always ends the block before it, so the tree is the same as a whole
 * parse); pieces seen in the previous parse are reused with their offsets moved.
 */
export function parse(text: string, cache?: ParseCache): ParseResult {
  return cache ? cache.parse(text) : parseWhole(text);
}

const HEADER_LINE = /^[ \t]*[A-Za-z_]\w*[ \t]+[A-Za-z_]\w*[ \t]*\{/;

/** Reuse of parsed pieces between successive versions of one document. */
export class ParseCache {
  /** Per piece text: its parse at offset 0, and the copy last placed (at `at`). */
  private pieces = new Map<string, { base: ParseResult; at: number; placed: ParseResult }>();

  parse(text: string): ParseResult {
    const next = new Map<string, { base: ParseResult; at: number; placed: ParseResult }>();
    const items: TopItem[] = [];
    const problems: SyntaxProblem[] = [];
    for (const { start, end } of pieces(text)) {
      const piece = text.slice(start, end);
      let entry = next.get(piece) ?? this.pieces.get(piece);
      if (!entry) {
        const base = parseWhole(piece);
        entry = { base, at: 0, placed: base };
      }
      // A piece that did not move is reused as it is; one that moved is copied with new offsets.
      if (entry.at !== start) entry = { base: entry.base, at: start, placed: shiftResult(entry.base, start) };
      next.set(piece, entry);
      items.push(...entry.placed.tree.items);
      problems.push(...entry.placed.problems);
    }
    this.pieces = next;
    return { tree: { kind: 'document', items, span: { start: 0, end: text.length } }, problems };
  }
}

function shiftResult(r: ParseResult, by: number): ParseResult {
  return { tree: { ...r.tree, items: shift(r.tree.items, by) as TopItem[] }, problems: shift(r.problems, by) as SyntaxProblem[] };
}

/** Offsets where block header lines start, as [start, end) pieces covering the text. */
function pieces(text: string): Span[] {
  const cuts = [0];
  let lineStart = 0;
  for (let i = 0; i <= text.length; i++) {
    const ch = text.charCodeAt(i);
    if (i === text.length || ch === 10 || ch === 13) {
      if (lineStart > 0 && HEADER_LINE.test(text.slice(lineStart, Math.min(i, lineStart + 200)))) cuts.push(lineStart);
      if (ch === 13 && text.charCodeAt(i + 1) === 10) i++;
      lineStart = i + 1;
    }
  }
  cuts.push(text.length);
  const out: Span[] = [];
  for (let k = 0; k + 1 < cuts.length; k++) if (cuts[k + 1]! > cuts[k]! || out.length === 0) out.push({ start: cuts[k]!, end: cuts[k + 1]! });
  return out;
}

/** A copy of a tree fragment with every span moved by `by` (spans are the only start/end keys). */
function shift(node: unknown, by: number): unknown {
  if (Array.isArray(node)) {
    const out = new Array<unknown>(node.length);
    for (let i = 0; i < node.length; i++) out[i] = shift(node[i], by);
    return out;
  }
  if (node === null || typeof node !== 'object') return node;
  const src = node as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  for (const k in src) {
    const v = src[k];
    out[k] = (k === 'start' || k === 'end') && typeof v === 'number' ? v + by : typeof v === 'object' && v !== null ? shift(v, by) : v;
  }
  return out;
}

function parseWhole(text: string): ParseResult {
  let tree: DocumentNode;
  try {
    tree = generated.parse(text, { startRule: 'Document' }) as DocumentNode;
  } catch (err) {
    // The grammar has catch-all rules, so this is a bug; still report instead of crashing.
    const span = errorSpan(err, 0, text.length);
    return {
      tree: { kind: 'document', items: [], span: { start: 0, end: text.length } },
      problems: [{ message: `internal parser failure: ${errorMessage(err)}`, span }],
    };
  }
  const problems: SyntaxProblem[] = [];
  for (const item of tree.items) collectProblems(item, text, problems);
  problems.sort((a, b) => a.span.start - b.span.start);
  return { tree, problems };
}

function collectProblems(item: TopItem, text: string, out: SyntaxProblem[]): void {
  if (item.kind === 'error') {
    out.push(explainBadLine(item, text));
    return;
  }
  if (item.kind !== 'block') return;
  for (const f of item.fields) if (f.kind === 'error') out.push(explainBadLine(f, text));
  if (!item.closed) {
    const at = item.span.end;
    out.push({
      message: `block '${item.name.text}' is not closed: add '}' after its last field`,
      span: { start: item.name.span.start, end: item.name.span.end },
    });
    void at;
  }
}

/** Words that may start a top-level line; peggy's own message is precise after them. */
const TOP_WORDS = ['use', 'junction', 'adc', 'channel', 'thermistor', 'rtd'];

function explainBadLine(node: ErrorNode, text: string): SyntaxProblem {
  const line = text.slice(node.span.start, node.span.end);
  const trimmed = line.trim();
  if (node.context === 'top') {
    if (trimmed.startsWith('}')) return { message: "unmatched '}': no block is open here", span: node.span };
    if (tryParse(line, 'FieldLine') === null) {
      return { message: 'a field must stand inside a block such as `channel name { ... }`', span: node.span };
    }
    const first = /^[A-Za-z_]\w*/.exec(trimmed)?.[0];
    if (first === undefined || !TOP_WORDS.includes(first)) {
      return { message: 'expected `use "file.tsense"` or a block header such as `channel name {`', span: node.span };
    }
  }
  const err = tryParse(line, node.context === 'top' ? 'TopLine' : 'FieldLine');
  if (err === null) return { message: `cannot read '${clip(trimmed)}'`, span: node.span };
  const span = errorSpan(err, node.span.start, node.span.end);
  return { message: plainMessage(err, line), span };
}

/** Returns null when the line parses, else the error peggy raised. */
function tryParse(line: string, rule: 'FieldLine' | 'TopLine'): unknown {
  try {
    generated.parse(line, { startRule: rule });
    return null;
  } catch (err) {
    return err;
  }
}

function errorSpan(err: unknown, base: number, limit: number): Span {
  if (err instanceof generated.SyntaxError) {
    const start = Math.min(base + err.location.start.offset, limit);
    let end = Math.min(base + err.location.end.offset, limit);
    if (end <= start) end = Math.min(start + 1, limit);
    return { start: Math.min(start, end), end: Math.max(start, end) };
  }
  return { start: base, end: limit };
}

/** Turns peggy's "Expected a, b, or c but "x" found." into plain words. */
function plainMessage(err: unknown, line: string): string {
  if (!(err instanceof generated.SyntaxError)) return errorMessage(err);
  const m = /^Expected (.*) but (.*) found\.$/s.exec(err.message);
  if (!m) return err.message;
  const found = m[2] === 'end of input' ? 'the end of the line' : m[2];
  const expected = m[1].replace(/end of input/g, 'the end of the line');
  void line;
  return `expected ${expected}, found ${found}`;
}

function errorMessage(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

function clip(s: string): string {
  return s.length > 40 ? s.slice(0, 37) + '...' : s;
}
