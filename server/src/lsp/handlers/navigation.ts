// Go to definition, find references, prepare rename and rename. References and renames reach every
// spec of the workspace that sees the definition's file, open or not (read through the documents'
// SourceHost, so an open file is seen as typed); each place once.
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
import { TextDocument } from 'vscode-languageserver-textdocument';
import { definition, loadNames, prepareRename, rename, workspaceOccurrences, type FileSpan, type NamedSpec } from '../../engine';
import type { ServerContext } from '../context';
import { docForFile, toRange } from '../convert';
import { pathToUri, uriToPath } from '../documents';

/** URI and range of a span in a file whose text is given (the open document's, when it is open). */
function location(ctx: ServerContext, at: FileSpan & { text: string }): Location {
  const open = ctx.documents.byPath(at.file);
  const doc = open ?? TextDocument.create(pathToUri(at.file), 'tsense', 0, at.text);
  return { uri: open?.uri ?? pathToUri(at.file), range: toRange(doc, at.span) };
}

/** The workspace's other specs, names only, loaded one at a time as they are asked for. */
function* otherSpecs(ctx: ServerContext, except: string): Generator<NamedSpec> {
  const host = ctx.documents.host();
  for (const p of ctx.documents.workspaceSpecs()) {
    if (p === except) continue;
    const text = host.read(p);
    if (text !== undefined) yield loadNames(p, text, ctx.documents.rootFor(p), host);
  }
}

export function onDefinition(ctx: ServerContext, params: DefinitionParams): Location | null {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return null;
  const a = ctx.analyses.get(doc);
  const d = definition(a, doc.offsetAt(params.position));
  const target = d ? docForFile(a, d.file, ctx.documents.byPath(d.file)) : undefined;
  return d && target ? { uri: ctx.documents.byPath(d.file)?.uri ?? pathToUri(d.file), range: toRange(target, d.span) } : null;
}

export function onReferences(ctx: ServerContext, params: ReferenceParams): Location[] {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  const self = uriToPath(doc.uri, ctx.documents.roots);
  const occ = workspaceOccurrences(ctx.analyses.get(doc), doc.offsetAt(params.position), otherSpecs(ctx, self), params.context.includeDeclaration) ?? [];
  return occ.map((o) => location(ctx, o));
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
  const self = uriToPath(doc.uri, ctx.documents.roots);
  const checked = rename(ctx.analyses.get(doc), doc.offsetAt(params.position), params.newName, otherSpecs(ctx, self));
  if (!checked.ok) throw new ResponseError(ErrorCodes.InvalidRequest, checked.message);
  const changes: Record<string, TextEdit[]> = {};
  for (const o of checked.edits) {
    const loc = location(ctx, o);
    (changes[loc.uri] ??= []).push({ range: loc.range, newText: o.newText });
  }
  return { changes };
}
