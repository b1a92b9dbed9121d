// parse(): text -> syntax tree plus every syntax problem. Never throws.
//
// The grammar turns each line it cannot read into an error node and carries on. For each such
// node we re-parse just that line with a narrower start rule to get peggy's own account of what
// was expected and where, shifted back to document offsets.

import * as generated from './parser.generated.js';
import type { DocumentNode, ErrorNode, ParseResult, Span, SyntaxProblem, TopItem } from './ast';
import { shiftOffsets } from './shift';
import { shown } from '../diagnostics/shown';
import { TOP_WORDS } from './keywords.generated';

/**
 * Parses `text`. With a cache, the text is cut before every block header line and each piece is
 * parsed on its own (a header always ends the block before it, so the tree is the same as a whole
 * parse); pieces seen in the previous parse are reused with their offsets moved.
 */
export function parse(text: string, cache?: ParseCache): ParseResult {
  return cache ? cache.parse(text) : parseWhole(text);
}

// A block header at the start of a line (sticky: tested at each line start without slicing).
const HEADER_AT = /[ \t]*[A-Za-z_]\w*[ \t]+[A-Za-z_]\w*[ \t]*\{/y;

/** Reuse of parsed pieces between successive versions of one document. */
export class ParseCache {
  /** Per piece text: its first parse (made at `baseAt`), and the copy last placed (at `at`). */
  private pieces = new Map<string, PieceEntry>();

  /** Caches of the files this document uses, by path (their definitions are then kept too). */
  private readonly used = new Map<string, ParseCache>();

  /** The cache for a file used by this document. */
  forUsedFile(path: string): ParseCache {
    let c = this.used.get(path);
    if (!c) this.used.set(path, (c = new ParseCache()));
    return c;
  }

  /** Drops the caches of files this document no longer uses. */
  retainUsedFiles(paths: readonly string[]): void {
    for (const p of [...this.used.keys()]) if (!paths.includes(p)) this.used.delete(p);
  }

  parse(text: string): ParseResult {
    const next = new Map<string, PieceEntry>();
    const items: TopItem[] = [];
    const problems: SyntaxProblem[] = [];
    const spans = pieces(text);
    const slices = spans.map(({ start, end }) => text.slice(start, end));
    // Several new pieces (a document opened, text pasted): one parse of the whole text, whose
    // items are cut into the pieces where they stand (the same tree: see parse()). One new piece
    // (a keystroke): that piece alone.
    let fresh = 0;
    for (const piece of slices) if (!this.pieces.has(piece) && ++fresh > 1) break;
    const whole = fresh > 1 ? new WholeParse(parseWhole(text)) : undefined;
    spans.forEach(({ start, end }, k) => {
      const piece = slices[k]!;
      let entry = next.get(piece) ?? this.pieces.get(piece);
      if (!entry) {
        const base = whole ? whole.cut(start, end) : parseWhole(piece);
        const baseAt = whole ? start : 0;
        entry = { base, baseAt, at: baseAt, placed: base };
      }
      // A piece that did not move is reused as it is; one that moved is copied with new offsets.
      if (entry.at !== start) entry = { base: entry.base, baseAt: entry.baseAt, at: start, placed: shiftResult(entry.base, start - entry.baseAt) };
      next.set(piece, entry);
      items.push(...entry.placed.tree.items);
      problems.push(...entry.placed.problems);
    });
    this.pieces = next;
    return { tree: { kind: 'document', items, span: { start: 0, end: text.length } }, problems };
  }
}

/** A whole-text parse handed out piece by piece, in order (items and problems by where they start). */
class WholeParse {
  private item = 0;
  private problem = 0;
  constructor(private readonly r: ParseResult) {}

  cut(start: number, end: number): ParseResult {
    const items: TopItem[] = [];
    const problems: SyntaxProblem[] = [];
    const all = this.r.tree.items;
    while (this.item < all.length && all[this.item]!.span.start < start) this.item++;
    while (this.item < all.length && all[this.item]!.span.start < end) items.push(all[this.item++]!);
    const ps = this.r.problems;
    while (this.problem < ps.length && ps[this.problem]!.span.start < start) this.problem++;
    while (this.problem < ps.length && ps[this.problem]!.span.start < end) problems.push(ps[this.problem++]!);
    return { tree: { kind: 'document', items, span: { start, end } }, problems };
  }
}

/** A piece's first parse, made at offset `baseAt`, and the copy last placed at `at`. */
interface PieceEntry {
  base: ParseResult;
  baseAt: number;
  at: number;
  placed: ParseResult;
}

function shiftResult(r: ParseResult, by: number): ParseResult {
  const placed = { tree: { ...r.tree, items: shiftOffsets(r.tree.items, by) }, problems: shiftOffsets(r.problems, by) };
  placed.tree.items.forEach((item, i) => ORIGIN.set(item, { base: r.tree.items[i]!, by }));
  return placed;
}

/** For a top-level item placed by a ParseCache: the piece's first parse and how far it was moved from there. */
const ORIGIN = new WeakMap<TopItem, { base: TopItem; by: number }>();

/**
 * Where a top-level item came from: the first parse of the same piece of text (`base`, the same
 * object for every placement of that text) and the offset it was moved by from there. Lets later
 * stages keep what they derived from a block that only moved. Items not moved are their own base.
 */
export function pieceOrigin(item: TopItem): { base: TopItem; by: number } {
  return ORIGIN.get(item) ?? { base: item, by: 0 };
}

/** Offsets where block header lines start, as [start, end) pieces covering the text. */
function pieces(text: string): Span[] {
  const cuts = [0];
  let lineStart = 0;
  // Line breaks found with indexOf (a native scan, several times faster than a loop over
  // characters on every keystroke); the next \r is looked up again only once passed.
  let cr = text.indexOf('\r');
  while (lineStart < text.length) {
    // A header cannot span lines (the pattern has no line breaks), so matching at the line start suffices.
    if (lineStart > 0) {
      HEADER_AT.lastIndex = lineStart;
      if (HEADER_AT.test(text)) cuts.push(lineStart);
    }
    if (cr >= 0 && cr < lineStart) cr = text.indexOf('\r', lineStart);
    const lf = text.indexOf('\n', lineStart);
    const nl = lf < 0 ? cr : cr < 0 ? lf : Math.min(lf, cr);
    if (nl < 0) break;
    lineStart = nl + (text.charCodeAt(nl) === 13 && text.charCodeAt(nl + 1) === 10 ? 2 : 1);
  }
  cuts.push(text.length);
  const out: Span[] = [];
  for (let k = 0; k + 1 < cuts.length; k++) if (cuts[k + 1]! > cuts[k]! || out.length === 0) out.push({ start: cuts[k]!, end: cuts[k + 1]! });
  return out;
}

/**
 * The syntax problems of `text` alone, as `parse` finds them, from a parse that keeps no field (its
 * tree holds block names, braces and error nodes only). For the first diagnostics of a large spec:
 * building the fields' tree is most of a parse's cost (a generated 1,600-channel spec, 0.9 MB: 22 MB
 * of tree, 419,000 objects; this parse took 280 ms of CPU against 550 ms for the full one, measured
 * side by side at a load average of 6 on 2 cores, 2026-12-03).
 */
export function syntaxProblems(text: string): SyntaxProblem[] {
  return parseWhole(text, true).problems;
}

function parseWhole(text: string, syntaxOnly = false): ParseResult {
  let tree: DocumentNode;
  try {
    tree = generated.parse(text, { startRule: 'Document', syntaxOnly }) as DocumentNode;
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
      message: `block '${shown(item.name.text)}' is not closed: add '}' after its last field`,
      span: { start: item.name.span.start, end: item.name.span.end },
    });
    void at;
  }
}

// TOP_WORDS (keywords.generated.ts, from the schema): words that may start a top-level line; peggy's
// own message is precise after them.

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

// What peggy expects where a value or another term of it may start (the grammar's names of the
// term kinds, grammar/tsense.peggy): a message names them together as "a value".
const TERM_EXPECTATIONS = new Set(['±', 'a name', 'a number such as 4k7, 1.5e-3 or 3.3 V', 'a quoted path such as "parts.tsense"', 'a unit such as °C', '"±"', '"+/-"', '"+-"', '".."']);
const VALUE_WORDS = 'a value such as 4k7, 3.3 V ± 1 %, -40 °C .. 125 °C or a name';
const LINE_END_WORDS = new Set(['";"', 'a comment', 'end of line', 'the end of the line']);

/**
 * Peggy's expectations in plain words: the term kinds as "a value" (after `=`) or "another value
 * or word" (after a term), and a half-typed term's own need (the grammar names RangeEnd and
 * ToleranceAmount), such as "expected the upper end of a range, such as 125 °C".
 */
function plainMessage(err: unknown, line: string): string {
  if (!(err instanceof generated.SyntaxError)) return errorMessage(err);
  const e = err as unknown as { expected: { type: string; text?: string; description?: string }[] | null; found: string | null; location: { start: { offset: number } } };
  if (!e.expected) return err.message;
  const words: string[] = [];
  for (const x of e.expected) {
    const w = x.type === 'literal' ? JSON.stringify(x.text) : x.type === 'end' ? 'the end of the line' : x.type === 'other' ? x.description! : null;
    if (w === null) return err.message;
    if (!words.includes(w)) words.push(w);
  }
  let list = words;
  if (words.includes('a number such as 4k7, 1.5e-3 or 3.3 V')) {
    const afterEquals = /=\s*$/.test(line.slice(0, e.location.start.offset));
    // After `=` a value may also be missing (the reader then asks for it), but what stands there
    // was not one: ask for the value alone.
    const rest = words.filter((w) => !TERM_EXPECTATIONS.has(w) && !(afterEquals && LINE_END_WORDS.has(w)));
    list = [afterEquals ? VALUE_WORDS : 'another value or word', ...rest];
  }
  list = [...new Set(list.map((w) => (w === 'end of line' ? 'the end of the line' : w)))];
  const expected = list.length <= 1 ? (list[0] ?? 'something else') : `${list.slice(0, -1).join(', ')} or ${list[list.length - 1]}`;
  const found = e.found === null ? 'the end of the line' : JSON.stringify(e.found);
  return `expected ${expected}, found ${found}`;
}

function errorMessage(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

function clip(s: string): string {
  return s.length > 40 ? s.slice(0, 37) + '...' : s;
}
