// textDocument/completion: the engine's context-aware items, with their documentation.
import { CompletionItemKind, InsertTextFormat, MarkupKind, type CompletionItem, type CompletionParams } from 'vscode-languageserver/node';
import { completion, type CompletionKind } from '../../engine';
import type { ServerContext } from '../context';
import { toRange } from '../convert';

const KIND: Record<CompletionKind, CompletionItemKind> = {
  keyword: CompletionItemKind.Keyword,
  field: CompletionItemKind.Property,
  unit: CompletionItemKind.Unit,
  reference: CompletionItemKind.Reference,
  option: CompletionItemKind.EnumMember,
  form: CompletionItemKind.Snippet,
  snippet: CompletionItemKind.Snippet,
};

export function onCompletion(ctx: ServerContext, params: CompletionParams): CompletionItem[] {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  const items = completion(ctx.analyses.get(doc), doc.offsetAt(params.position));
  return items.map((it, i) => ({
    label: it.label,
    kind: KIND[it.kind],
    ...(it.detail ? { detail: it.detail } : {}),
    ...(it.documentation ? { documentation: { kind: MarkupKind.Markdown, value: it.documentation } } : {}),
    textEdit: { range: toRange(doc, it.replace), newText: it.insertText ?? it.label },
    insertTextFormat: it.snippet ? InsertTextFormat.Snippet : InsertTextFormat.PlainText,
    sortText: String(i).padStart(4, '0'),
  }));
}
