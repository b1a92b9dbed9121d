// textDocument/foldingRange: blocks and comment runs.
import { FoldingRangeKind, type FoldingRange, type FoldingRangeParams } from 'vscode-languageserver/node';
import { foldingRanges } from '../../engine';
import type { ServerContext } from '../context';

export function onFoldingRanges(ctx: ServerContext, params: FoldingRangeParams): FoldingRange[] {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  const out: FoldingRange[] = [];
  for (const f of foldingRanges(ctx.analyses.syntax(doc))) {
    const startLine = doc.positionAt(f.span.start).line;
    const endLine = doc.positionAt(f.span.end).line;
    if (endLine > startLine) out.push({ startLine, endLine, kind: f.kind === 'comment' ? FoldingRangeKind.Comment : FoldingRangeKind.Region });
  }
  return out;
}
