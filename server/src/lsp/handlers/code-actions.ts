// textDocument/codeAction and codeAction/resolve: the engine's quick fixes for diagnostics in the
// range, and "Generate conversion code for <channel>" on a channel (its edit is computed lazily in
// resolve when the client supports that, since generation takes a moment).
import {
  CodeActionKind,
  MessageType,
  ShowMessageNotification,
  type CodeAction,
  type CodeActionParams,
  type TextDocumentEdit,
  type CreateFile,
  type WorkspaceEdit,
  type TextEdit,
} from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { quickFixes, type FixEdit } from '../../engine';
import { conversionFilePath, generatableChannels, generateForChannel } from '../../engine';
import { blockAt } from '../../engine';
import { headerPathFor } from '../../engine';
import { scanGeneratedBlocks } from '../../engine';
import type { ServerContext } from '../context';
import { docForFile, toDiagnostic, toRange, toSpan } from '../convert';
import { pathToUri, readDisk } from '../documents';

export const GENERATE_KIND = `${CodeActionKind.Refactor}.generateConversion`;
/**
 * The client command run after a generation's edit is applied: it shows the written file at the
 * channel's block and says what was written. Offered only to a client that names it in
 * `initializationOptions.clientCommands` (ours does); any other client is told by a message.
 */
export const SHOW_GENERATED = 'thermoscribe.showGenerated';

/** The argument of SHOW_GENERATED. */
export interface ShowGeneratedArgs {
  uri: string;
  line: number;
  message: string;
}

interface GenerateData {
  uri: string;
  channel: string;
}

export function onCodeActions(ctx: ServerContext, params: CodeActionParams, lazy: boolean): CodeAction[] {
  const doc = ctx.documents.get(params.textDocument.uri);
  if (!doc) return [];
  const a = ctx.analyses.get(doc);
  const range = toSpan(doc, params.range);
  const only = params.context.only;
  const wants = (kind: string) => !only || only.some((k) => kind === k || kind.startsWith(`${k}.`));
  const out: CodeAction[] = [];
  if (wants(CodeActionKind.QuickFix)) {
    const fixes = quickFixes({ analysis: a, range, reanalyse: (overrides) => ctx.analyses.run(doc, overrides) });
    for (const fix of fixes) {
      out.push({
        title: fix.title,
        kind: CodeActionKind.QuickFix,
        diagnostics: [toDiagnostic(doc, fix.diagnostic)],
        ...(fix.preferred ? { isPreferred: true } : {}),
        edit: fixEdit(ctx, a, doc, fix.edits),
      });
    }
  }
  const block = blockAt(a.files[0]!.parse.tree, range.start);
  if (block && block.keyword.text === 'channel' && wants(GENERATE_KIND) && generatableChannels(a).includes(block.name.text)) {
    const data: GenerateData = { uri: doc.uri, channel: block.name.text };
    const action: CodeAction = { title: `Generate conversion code for ${block.name.text}`, kind: GENERATE_KIND, data };
    out.push(lazy ? action : onResolveCodeAction(ctx, action, false));
  }
  // The same generation as a quick fix of a `generated-stale` diagnostic (codegen/stale.ts).
  const stale = params.context.diagnostics.find((d) => d.code === 'generated-stale' && typeof (d.data as GenerateData | undefined)?.channel === 'string');
  const staleChannel = (stale?.data as GenerateData | undefined)?.channel;
  if (stale && staleChannel && wants(CodeActionKind.QuickFix) && generatableChannels(a).includes(staleChannel)) {
    const data: GenerateData = { uri: doc.uri, channel: staleChannel };
    const action: CodeAction = { title: `Regenerate conversion code for ${staleChannel}`, kind: CodeActionKind.QuickFix, diagnostics: [stale], isPreferred: true, data };
    out.push(lazy ? action : onResolveCodeAction(ctx, action, false));
  }
  // Removing an orphan block (a channel the spec no longer defines) from the C file and its header.
  for (const d of params.context.diagnostics) {
    const od = d.data as { channel?: unknown; codeFile?: unknown } | undefined;
    if (d.code !== 'generated-orphan' || typeof od?.channel !== 'string' || typeof od.codeFile !== 'string' || !wants(CodeActionKind.QuickFix)) continue;
    const changes: Record<string, TextEdit[]> = {};
    for (const file of [od.codeFile, headerPathFor(od.codeFile)]) {
      const open = ctx.documents.byPath(file);
      const text = open?.getText() ?? readDisk(file);
      const b = text === undefined ? undefined : scanGeneratedBlocks(text).blocks.find((x) => x.channel === od.channel);
      if (!b || text === undefined) continue;
      const uri = open?.uri ?? pathToUri(file);
      const td = TextDocument.create(uri, 'c', 0, text);
      changes[uri] = [{ range: { start: td.positionAt(b.start), end: td.positionAt(b.end) }, newText: '' }];
    }
    if (Object.keys(changes).length > 0) out.push({ title: `Remove the generated block of '${od.channel}'`, kind: CodeActionKind.QuickFix, diagnostics: [d], edit: { changes } });
  }
  return out;
}

function fixEdit(ctx: ServerContext, a: ReturnType<ServerContext['analyses']['get']>, doc: TextDocument, edits: FixEdit[]): WorkspaceEdit {
  const changes: Record<string, TextEdit[]> = {};
  for (const e of edits) {
    const open = e.file === a.path ? doc : ctx.documents.byPath(e.file);
    const target = docForFile(a, e.file, open);
    if (!target) continue;
    const uri = open?.uri ?? pathToUri(e.file);
    (changes[uri] ??= []).push({ range: toRange(target, e.span), newText: e.newText });
  }
  return { changes };
}

/** `tell`: say what was written when the client has no command for it (not on an eager list of actions). */
export function onResolveCodeAction(ctx: ServerContext, action: CodeAction, tell = true): CodeAction {
  const data = action.data as GenerateData | undefined;
  if ((action.kind !== GENERATE_KIND && action.kind !== CodeActionKind.QuickFix) || typeof data?.channel !== 'string') return action;
  const doc = ctx.documents.get(data.uri);
  if (!doc) return action;
  const a = ctx.analyses.get(doc);
  const target = conversionFilePath(a.path);
  const open = ctx.documents.byPath(target);
  const existing = open?.getText() ?? readDisk(target);
  const g = generateForChannel(a, data.channel, existing);
  if (!g.ok) {
    ctx.connection.console.warn(`thermoscribe: ${g.message}`);
    // A client that refuses the request does not take the server down (lsp/start.ts logs the rejection).
    void ctx.connection.window.showWarningMessage(g.message);
    return { ...action, disabled: { reason: g.message } };
  }
  const uri = open?.uri ?? pathToUri(target);
  const old = TextDocument.create(uri, 'c', 0, existing ?? '');
  const replace: TextEdit = { range: { start: { line: 0, character: 0 }, end: old.positionAt(old.getText().length) }, newText: g.result.text };
  let edit: WorkspaceEdit;
  if (existing === undefined && ctx.client.resourceCreate) {
    const create: CreateFile = { kind: 'create', uri, options: { ignoreIfExists: true } };
    const write: TextDocumentEdit = { textDocument: { uri, version: null }, edits: [replace] };
    edit = { documentChanges: [create, write] };
  } else {
    edit = { changes: { [uri]: [replace] } };
  }
  if (ctx.client.showGenerated) {
    const args: ShowGeneratedArgs = { uri, line: g.result.line, message: g.result.summary };
    return { ...action, edit, command: { title: 'Show the generated code', command: SHOW_GENERATED, arguments: [args] } };
  }
  // A notification: nothing to answer, and it reaches the client before the resolved action.
  if (tell) void ctx.connection.sendNotification(ShowMessageNotification.type, { type: MessageType.Info, message: g.result.summary });
  return { ...action, edit };
}
