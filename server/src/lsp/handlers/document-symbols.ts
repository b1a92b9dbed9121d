// textDocument/documentSymbol: the outline (blocks with their fields as children).
import { SymbolKind, type DocumentSymbol, type DocumentSymbolParams } from 'vscode-languageserver/node';
import { documentSymbols, type OutlineSymbol, type SymbolKind as FeatureKind } from '../../engine';
import type { ServerContext } from '../context';
import { toRange } from '../convert';
import type { TextDocument } from 'vscode-languageserver-textdocument';

const KIND: Record<FeatureKind, SymbolKind> = {
  sensor: SymbolKind.Class,
  adc: SymbolKind.Interface,
  channel: SymbolKind.Object,
  'unknown-block': SymbolKind.Namespace,
  field: SymbolKind.Property,
  use: SymbolKind.File,
};

export function onDocumentSymbols(ctx: ServerContext, params: DocumentSymbolParams): DocumentSymbol[] {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  return documentSymbols(ctx.analyses.syntax(doc)).map((s) => convert(doc, s));
}

function convert(doc: TextDocument, s: OutlineSymbol): DocumentSymbol {
  return {
    name: s.name || '(unnamed)',
    ...(s.detail ? { detail: s.detail } : {}),
    kind: KIND[s.kind],
    range: toRange(doc, s.span),
    selectionRange: toRange(doc, s.selection),
    children: s.children.map((c) => convert(doc, c)),
  };
}
