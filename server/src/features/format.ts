// Document formatting to one canonical layout: one field per line (fields joined by `;` are split), 2-space indent, `=` aligned
// within a block, one space around `±` and `..`, one blank line between blocks, comments kept
// (trailing ones two spaces after the code). Idempotent. A file with syntax errors is refused, and
// so is any result that would not hold exactly the same non-blank text as the input.
import { parse } from '../syntax/parse';
import type { BlockNode, QuantityTerm, Span, Term } from '../syntax/ast';
import { commentSpans } from './comments';
import { INDENT } from '../model/language';

export type FormatResult = { ok: true; text: string } | { ok: false; reason: string };

interface Event {
  start: number;
  end: number;
  kind: 'use' | 'header' | 'field' | 'close' | 'comment';
  /** For block parts: the block. */
  block?: BlockNode;
  render: () => string;
}

export function formatText(text: string): FormatResult {
  const { tree, problems } = parse(text);
  if (problems.length > 0) return { ok: false, reason: `the file has ${problems.length} syntax error${problems.length === 1 ? '' : 's'}; fix ${problems.length === 1 ? 'it' : 'them'} first` };
  const eol = text.includes('\r\n') ? '\r\n' : '\n';
  const events: Event[] = [];
  for (const item of tree.items) {
    if (item.kind === 'use') {
      events.push({ start: item.span.start, end: item.span.end, kind: 'use', render: () => `use "${item.path.text}"` });
    } else if (item.kind === 'block') {
      const keyWidth = Math.max(0, ...item.fields.map((f) => (f.kind === 'field' ? f.key.text.length : 0)));
      const brace = text.indexOf('{', item.name.span.end);
      events.push({ start: item.span.start, end: brace + 1, kind: 'header', block: item, render: () => `${item.keyword.text} ${item.name.text} {` });
      for (const f of item.fields) {
        if (f.kind !== 'field') continue;
        events.push({ start: f.span.start, end: f.span.end, kind: 'field', block: item, render: () => `${INDENT}${f.key.text.padEnd(keyWidth)} =${f.value.map((t) => ` ${term(t, text)}`).join('')}` });
      }
      const close = item.closeSpan!;
      events.push({ start: close.start, end: close.end, kind: 'close', block: item, render: () => '}' });
    }
  }
  for (const c of commentSpans(text)) {
    events.push({ start: c.start, end: c.end, kind: 'comment', render: () => text.slice(c.start, c.end).trimEnd() });
  }
  events.sort((a, b) => a.start - b.start);

  const lines: string[] = [];
  let depth = 0;
  let prev: Event | null = null;
  for (const e of events) {
    const between = prev ? text.slice(prev.end, e.start) : '';
    const sameLine = prev !== null && !/[\r\n]/.test(between);
    if (e.kind === 'comment' && sameLine) {
      lines[lines.length - 1] += `  ${e.render()}`;
      prev = e;
      continue;
    }
    if (e.kind === 'close') depth = 0;
    const sourceBlank = (between.match(/\r\n|\n|\r/g)?.length ?? 0) >= 2;
    if (prev && lines.length > 0) {
      let blank: boolean;
      if (depth > 0) blank = sourceBlank && prev.kind !== 'header';
      else if (e.kind === 'close') blank = false;
      else if (prev.kind === 'close') blank = true;
      else if (e.kind === 'header') blank = sourceBlank || prev.kind !== 'comment';
      else blank = sourceBlank;
      if (blank) lines.push('');
    }
    const indent = depth > 0 && e.kind === 'comment' ? INDENT : '';
    lines.push(indent + e.render());
    if (e.kind === 'header') depth = 1;
    prev = e;
  }
  // A byte-order mark at the start is kept as it was.
  const out = (text.charCodeAt(0) === 0xfeff ? '\uFEFF' : '') + (lines.length ? lines.join(eol) + eol : '');
  if (strip(out) !== strip(text)) return { ok: false, reason: 'formatting would change the text beyond layout; left as it is' };
  return { ok: true, text: out };
}

/** One whole-document edit, or none when the text is already canonical or cannot be formatted. */
export function formatEdits(text: string): { span: Span; newText: string }[] {
  const r = formatText(text);
  if (!r.ok || r.text === text) return [];
  return [{ span: { start: 0, end: text.length }, newText: r.text }];
}

/** The text without layout: no blanks, no optional `;` (comments kept whole otherwise). */
function strip(s: string): string {
  return s.replace(/[\s;]+/g, '');
}

function term(t: Term, text: string): string {
  switch (t.kind) {
    case 'quantity':
      return quantity(t, text);
    case 'range':
      return `${quantity(t.low, text)} .. ${quantity(t.high, text)}`;
    case 'tolerance':
      return `${symbol(text, t.span.start, t.amount.span.start)} ${quantity(t.amount, text)}`;
    case 'string':
      return `"${t.text}"`;
    case 'word':
    case 'unit':
      return t.text;
  }
}

function quantity(q: QuantityTerm, text: string): string {
  // A bare prefix of the resistor code stays glued (`10k`); a unit gets one space (`3.3 V`).
  let s = q.number.text;
  if (q.unit) s += (/^[afpnuµμmkMG]$/.test(q.unit.text) ? '' : ' ') + q.unit.text;
  if (q.tolerance) {
    const from = q.unit ? q.unit.span.end : q.number.span.end;
    s += ` ${symbol(text, from, q.tolerance.span.start)} ${quantity(q.tolerance, text)}`;
  }
  return s;
}

/** The ± sign as written (±, +/- or +-) between two offsets. */
function symbol(text: string, from: number, to: number): string {
  return /±|\+\/-|\+-/.exec(text.slice(from, to))?.[0] ?? '±';
}
