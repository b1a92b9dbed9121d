// textDocument/formatting: the canonical layout; no edits when the file has syntax errors.
import type { DocumentFormattingParams, TextEdit } from 'vscode-languageserver/node';
import { formatEdits } from '../../engine';
import type { ServerContext } from '../context';
import { toRange } from '../convert';

export function onFormatting(ctx: ServerContext, params: DocumentFormattingParams): TextEdit[] {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  return formatEdits(doc.getText()).map((e) => ({ range: toRange(doc, e.span), newText: e.newText }));
}
