// What lies under an offset in a parsed spec: block keyword or name, field key, a term of a
// field value (with the innermost quantity), or a `use` path. Shared by hover, navigation and
// completion. A cursor touching either end of a token counts as on it (editors place the caret
// after a word the user just typed).
import type { BlockNode, DocumentNode, FieldNode, QuantityTerm, Span, Term, UseNode } from '../syntax/ast';

export type Located =
  | { kind: 'block-keyword'; block: BlockNode }
  | { kind: 'block-name'; block: BlockNode }
  | { kind: 'field-key'; block: BlockNode; field: FieldNode }
  | { kind: 'term'; block: BlockNode; field: FieldNode; term: Term; index: number; quantity: QuantityTerm | null; unitHit: boolean }
  | { kind: 'use'; node: UseNode };

export function within(span: Span, offset: number): boolean {
  return span.start <= offset && offset <= span.end;
}

/** The block whose body holds the offset (between its header and its closing brace). */
export function blockAt(tree: DocumentNode, offset: number): BlockNode | null {
  for (const item of tree.items) {
    if (item.kind !== 'block') continue;
    const end = item.closeSpan ? item.closeSpan.start : item.span.end;
    if (item.span.start <= offset && offset <= end) return item;
  }
  return null;
}

export function locate(tree: DocumentNode, offset: number): Located | null {
  for (const item of tree.items) {
    if (item.kind === 'use') {
      if (within(item.span, offset)) return { kind: 'use', node: item };
      continue;
    }
    if (item.kind !== 'block' || !within(item.span, offset)) continue;
    if (within(item.keyword.span, offset)) return { kind: 'block-keyword', block: item };
    if (within(item.name.span, offset)) return { kind: 'block-name', block: item };
    for (const f of item.fields) {
      if (f.kind !== 'field' || !within(f.span, offset)) continue;
      if (within(f.key.span, offset)) return { kind: 'field-key', block: item, field: f };
      for (let i = 0; i < f.value.length; i++) {
        const t = f.value[i]!;
        if (!within(t.span, offset)) continue;
        const q = quantityIn(t, offset);
        return { kind: 'term', block: item, field: f, term: t, index: i, quantity: q, unitHit: !!q?.unit && within(q.unit.span, offset) };
      }
      return null;
    }
    return null;
  }
  return null;
}

/** The innermost quantity of a term that holds the offset (a range end, a tolerance amount). */
function quantityIn(t: Term, offset: number): QuantityTerm | null {
  switch (t.kind) {
    case 'quantity':
      if (t.tolerance && within(t.tolerance.span, offset) && !within(t.number.span, offset)) return t.tolerance;
      return t;
    case 'range':
      return within(t.low.span, offset) ? quantityIn(t.low, offset) : within(t.high.span, offset) ? quantityIn(t.high, offset) : null;
    case 'tolerance':
      return t.amount;
    default:
      return null;
  }
}

/** The field of a block with the given key (first one), if written. */
export function fieldOf(block: BlockNode, key: string): FieldNode | undefined {
  return block.fields.find((f): f is FieldNode => f.kind === 'field' && f.key.text === key);
}
