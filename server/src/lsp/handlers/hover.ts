// textDocument/hover: the engine's hover at the cursor, as markdown.
import { MarkupKind, type Hover, type HoverParams } from 'vscode-languageserver/node';
import { hover } from '../../engine';
import type { ServerContext } from '../context';
import { toRange } from '../convert';
import { SHOW_PLOT_COMMAND } from './code-lens';

export function onHover(ctx: ServerContext, params: HoverParams): Hover | null {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return null;
  // The channel hover links to the plot panel (the client trusts this one command in hovers).
  const plotLink = (channel: string) => `command:${SHOW_PLOT_COMMAND}?${encodeURIComponent(JSON.stringify([doc.uri, channel]))}`;
  const h = hover(ctx.analyses.get(doc), doc.offsetAt(params.position), { plotLink });
  return h ? { contents: { kind: MarkupKind.Markdown, value: h.markdown }, range: toRange(doc, h.span) } : null;
}
