// Comments are not in the syntax tree: this scanner finds them (`#` to the end of the line,
// outside a quoted path). Used by folding, semantic tokens and formatting.
import type { Span } from '../syntax/ast';

export function commentSpans(text: string): Span[] {
  const out: Span[] = [];
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === '\n' || ch === '\r') inString = false;
    else if (ch === '"') inString = !inString;
    else if (ch === '#' && !inString) {
      let end = i;
      while (end < text.length && text[end] !== '\n' && text[end] !== '\r') end++;
      out.push({ start: i, end });
      i = end - 1;
    }
  }
  return out;
}
