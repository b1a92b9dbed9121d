// Semantic tokens: keyword, type name, field (property), number, unit, string, comment, operator,
// option (enumMember) and other words (variable), with a `declaration` modifier on block names.
// `unit` is our own token type; editors that do not know it fall back to the TextMate colours.
import type { QuantityTerm, Span, SyntaxFile, Term } from '../syntax/ast';
import { blockSpec, fieldSpec } from '../model/schema';
import { commentSpans } from './comments';

export const TOKEN_TYPES = ['keyword', 'type', 'property', 'number', 'unit', 'string', 'comment', 'operator', 'enumMember', 'variable'] as const;
export const TOKEN_MODIFIERS = ['declaration'] as const;
export type TokenType = (typeof TOKEN_TYPES)[number];

export interface SemanticToken {
  start: number;
  length: number;
  type: TokenType;
  declaration?: boolean;
}

const VALUE_KEYWORDS = new Set(['resistor', 'current', 'from', 'per']);

export function semanticTokens(file: SyntaxFile): SemanticToken[] {
  const text = file.text;
  const out: SemanticToken[] = [];
  const add = (span: Span, type: TokenType, declaration = false) => {
    if (span.end > span.start) out.push({ start: span.start, length: span.end - span.start, type, ...(declaration ? { declaration } : {}) });
  };
  /** An operator written somewhere in [from, to) of the text. */
  const op = (from: number, to: number, pattern: RegExp) => {
    const m = pattern.exec(text.slice(from, to));
    if (m) add({ start: from + m.index, end: from + m.index + m[0].length }, 'operator');
  };
  const quantity = (q: QuantityTerm) => {
    add(q.number.span, 'number');
    if (q.unit) add(q.unit.span, 'unit');
    if (q.tolerance) {
      op(q.unit?.span.end ?? q.number.span.end, q.tolerance.span.start, /±|\+\/-|\+-/);
      quantity(q.tolerance);
    }
  };
  const term = (t: Term, wordType: TokenType) => {
    switch (t.kind) {
      case 'quantity':
        return quantity(t);
      case 'range':
        quantity(t.low);
        op(t.low.span.end, t.high.span.start, /\.\./);
        return quantity(t.high);
      case 'tolerance':
        op(t.span.start, t.amount.span.start, /±|\+\/-|\+-/);
        return quantity(t.amount);
      case 'string':
        return add(t.span, 'string');
      case 'unit':
        return add(t.span, 'unit');
      case 'word':
        return add(t.span, VALUE_KEYWORDS.has(t.text) ? 'keyword' : /^(counts?|LSB)$/.test(t.text) ? 'unit' : wordType);
    }
  };
  for (const item of file.parse.tree.items) {
    if (item.kind === 'use') {
      add({ start: item.span.start, end: item.span.start + 3 }, 'keyword');
      add(item.path.span, 'string');
      continue;
    }
    if (item.kind !== 'block') continue;
    add(item.keyword.span, 'keyword');
    add(item.name.span, 'type', true);
    const spec = blockSpec(item.keyword.text);
    for (const f of item.fields) {
      if (f.kind !== 'field') continue;
      add(f.key.span, 'property');
      if (f.value[0]) op(f.key.span.end, f.value[0].span.start, /=/);
      const form = spec ? fieldSpec(spec, f.key.text)?.form : undefined;
      const wordType: TokenType = form?.form === 'ref' ? 'type' : form?.form === 'choice' ? 'enumMember' : 'variable';
      for (const t of f.value) term(t, wordType);
    }
  }
  // The tree holds no `#` outside quoted paths, so comments never overlap the tokens above.
  for (const c of commentSpans(text)) add(c, 'comment');
  return out.sort((x, y) => x.start - y.start);
}
