// Go to definition, find references, prepare rename and rename. References and renames gather
// the occurrences from every open spec that sees the definition's file, deduplicated.
import {
  ResponseError,
  ErrorCodes,
  type DefinitionParams,
  type Location,
  type PrepareRenameParams,
  type Range,
  type ReferenceParams,
  type RenameParams,
  type TextEdit,
  type WorkspaceEdit,
} from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { definition, occurrences, prepareRename, rename, symbolAt, type FileSpan } from '../../features/navigation';
import type { Analysis } from '../../engine';
import type { ServerContext } from '../context';
import { docForFile, toRange } from '../convert';
import { pathToUri } from '../documents';

/** URI and range of an engine span in one of an analysis' files. */
function location(ctx: ServerContext, a: Analysis, fs: FileSpan): Location | null {
  const open = ctx.documents.byPath(fs.file);
  const doc = docForFile(a, fs.file, open);
  return doc ? { uri: open?.uri ?? pathToUri(fs.file), range: toRange(doc, fs.span) } : null;
}

export function onDefinition(ctx: ServerContext, params: DefinitionParams): Location | null {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return null;
  const a = ctx.analyses.get(doc);
  const d = definition(a, doc.offsetAt(params.position));
  return d ? location(ctx, a, d) : null;
}

/** Occurrences of the symbol under the cursor in every open spec that sees its definition. */
function allOccurrences(ctx: ServerContext, doc: TextDocument, offset: number, includeDefinition: boolean): { a: Analysis; at: FileSpan }[] | null {
  const a = ctx.analyses.get(doc);
  const s = symbolAt(a, offset);
  if (!s) return null;
  const out: { a: Analysis; at: FileSpan }[] = [];
  const seen = new Set<string>();
  const analyses = [a, ...ctx.documents.docs.all().filter((d) => d.uri !== doc.uri).map((d) => ctx.analyses.get(d))];
  for (const other of analyses) {
    if (s.definition && !other.files.some((f) => f.path === s.definition!.file)) continue;
    if (!s.definition && other !== a) continue;
    for (const o of occurrences(other, s.name, s.kind, includeDefinition)) {
      const key = `${o.file}:${o.span.start}`;
      if (seen.has(key)) continue;
      seen.add(key);
      out.push({ a: other, at: o });
    }
  }
  return out;
}

export function onReferences(ctx: ServerContext, params: ReferenceParams): Location[] {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  const occ = allOccurrences(ctx, doc, doc.offsetAt(params.position), params.context.includeDeclaration) ?? [];
  return occ.map((o) => location(ctx, o.a, o.at)).filter((l): l is Location => l !== null);
}

export function onPrepareRename(ctx: ServerContext, params: PrepareRenameParams): { range: Range; placeholder: string } {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) throw new ResponseError(ErrorCodes.InvalidRequest, 'The document is not open.');
  const check = prepareRename(ctx.analyses.get(doc), doc.offsetAt(params.position));
  if (!check.ok) throw new ResponseError(ErrorCodes.InvalidRequest, check.message);
  return { range: toRange(doc, check.span), placeholder: check.placeholder };
}

export function onRename(ctx: ServerContext, params: RenameParams): WorkspaceEdit {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) throw new ResponseError(ErrorCodes.InvalidRequest, 'The document is not open.');
  const offset = doc.offsetAt(params.position);
  const checked = rename(ctx.analyses.get(doc), offset, params.newName);
  if (!checked.ok) throw new ResponseError(ErrorCodes.InvalidRequest, checked.message);
  const changes: Record<string, TextEdit[]> = {};
  for (const o of allOccurrences(ctx, doc, offset, true) ?? []) {
    const loc = location(ctx, o.a, o.at);
    if (loc) (changes[loc.uri] ??= []).push({ range: loc.range, newText: params.newName });
  }
  return { changes };
}
