// textDocument/hover: the engine's hover at the cursor, as markdown.
import { MarkupKind, type Hover, type HoverParams } from 'vscode-languageserver/node';
import { hover } from '../../engine';
import type { ServerContext } from '../context';
import { toRange } from '../convert';

export function onHover(ctx: ServerContext, params: HoverParams): Hover | null {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return null;
  const h = hover(ctx.analyses.get(doc), doc.offsetAt(params.position));
  return h ? { contents: { kind: MarkupKind.Markdown, value: h.markdown }, range: toRange(doc, h.span) } : null;
}
