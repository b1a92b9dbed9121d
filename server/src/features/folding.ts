// Folding ranges: every block (header to closing brace) and every run of two or more comment-only lines.
import type { Span, SyntaxFile } from '../syntax/ast';
import { commentSpans } from './comments';

export interface Fold {
  span: Span;
  kind: 'region' | 'comment';
}

export function foldingRanges(file: SyntaxFile): Fold[] {
  const text = file.text;
  const out: Fold[] = [];
  for (const item of file.parse.tree.items) {
    if (item.kind !== 'block') continue;
    // Fold up to the end of the last line before the closing brace, so the brace stays visible.
    let end = item.closeSpan?.start ?? item.span.end;
    while (end > item.span.start && /\s/.test(text[end - 1]!)) end--;
    out.push({ span: { start: item.span.start, end }, kind: 'region' });
  }
  // Comment-only lines: nothing but blanks before the `#` on its line.
  const own = commentSpans(text).filter((c) => /^[ \t]*$/.test(text.slice(lineStart(text, c.start), c.start)));
  let run: Span[] = [];
  const flush = () => {
    if (run.length >= 2) out.push({ span: { start: run[0]!.start, end: run[run.length - 1]!.end }, kind: 'comment' });
    run = [];
  };
  for (const c of own) {
    const prev = run[run.length - 1];
    if (prev && !/^(\r\n|\n|\r)[ \t]*$/.test(text.slice(prev.end, c.start))) flush();
    run.push(c);
  }
  flush();
  return out.sort((x, y) => x.span.start - y.span.start);
}

function lineStart(text: string, offset: number): number {
  return Math.max(text.lastIndexOf('\n', offset - 1), text.lastIndexOf('\r', offset - 1)) + 1;
}
