// Document outline: each block (with its keyword as detail) and its fields as children.
import type { Span, SyntaxFile } from '../syntax/ast';
import { spanOf } from '../model/read-value';
import { sensorKind } from '../sensors/registry';

/** `sensor`: a block of any sensor kind (its keyword is the symbol's detail). */
export type SymbolKind = 'sensor' | 'adc' | 'channel' | 'unknown-block' | 'field' | 'use';

export interface OutlineSymbol {
  name: string;
  detail: string;
  kind: SymbolKind;
  /** What the outline shows as the symbol's kind: the block keyword for a block of a known kind. */
  label: string;
  span: Span;
  selection: Span;
  children: OutlineSymbol[];
}

export function documentSymbols(file: SyntaxFile): OutlineSymbol[] {
  const out: OutlineSymbol[] = [];
  for (const item of file.parse.tree.items) {
    if (item.kind === 'use') {
      out.push({ name: `use "${item.path.text}"`, detail: '', kind: 'use', label: 'use', span: item.span, selection: item.path.span, children: [] });
    } else if (item.kind === 'block') {
      const k = item.keyword.text;
      const kind: SymbolKind = sensorKind(k) ? 'sensor' : k === 'adc' || k === 'channel' ? k : 'unknown-block';
      const children: OutlineSymbol[] = [];
      for (const f of item.fields) {
        if (f.kind !== 'field') continue;
        const value = f.value.length ? file.text.slice(spanOf(f.value).start, spanOf(f.value).end) : '';
        children.push({ name: f.key.text, detail: value, kind: 'field', label: 'field', span: f.span, selection: f.key.span, children: [] });
      }
      out.push({ name: item.name.text, detail: k, kind, label: kind === 'unknown-block' ? kind : k, span: item.span, selection: item.name.span, children });
    }
  }
  return out;
}
