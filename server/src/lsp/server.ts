// Wires the connection: capabilities, document sync, settings, diagnostics and one guarded
// handler per request (each in handlers/). No physics and no figures here.
import {
  CodeActionKind,
  DidChangeConfigurationNotification,
  TextDocumentSyncKind,
  type Connection,
  type InitializeParams,
  type InitializeResult,
} from 'vscode-languageserver/node';
import { AnalysisCache } from './analyses';
import type { ServerContext } from './context';
import { DiagnosticScheduler } from './diagnostics';
import { OpenDocuments, uriToPath } from './documents';
import { guard, markShutDown } from './guard';
import { DEFAULT_SETTINGS, mergeSettings } from './settings';
import { onHover } from './handlers/hover';
import { onCompletion } from './handlers/completion';
import { onInlayHints } from './handlers/inlay-hints';
import { onDocumentSymbols } from './handlers/document-symbols';
import { onFoldingRanges } from './handlers/folding';
import { LEGEND, onSemanticTokens } from './handlers/semantic-tokens';
import { onFormatting } from './handlers/formatting';
import { onDefinition, onPrepareRename, onReferences, onRename } from './handlers/navigation';
import { GENERATE_KIND, SHOW_GENERATED, onCodeActions, onResolveCodeAction } from './handlers/code-actions';
import { CONVERSION_CHANNELS, CONVERSION_CODE, onConversionChannels, onConversionCode, type ConversionChannelsParams, type ConversionCodeParams } from './handlers/conversion-code';
import { onCodeLens } from './handlers/code-lens';
import { PLOT_DATA, onPlotData, type PlotDataParams, type PlotDataResult } from './handlers/plot-data';
import { COMPARE_DATA, onCompareData, type CompareDataParams, type CompareDataResult } from './handlers/compare-data';
import { RUN_BUDGET, runBudgetHandler } from './handlers/run-budget';
import { MEMORY, onMemory, type MemoryResult } from './handlers/memory';
import { VERSION } from '../cli/version';

export function createServer(connection: Connection): ServerContext {
  const documents = new OpenDocuments();
  const ctx: ServerContext = {
    connection,
    documents,
    analyses: new AnalysisCache(documents),
    settings: { ...DEFAULT_SETTINGS },
    client: { configuration: false, resourceCreate: false, hierarchicalSymbols: false, showGenerated: false },
  };
  const diagnostics = new DiagnosticScheduler(ctx);
  let lazyActions = false;

  connection.onInitialize((params: InitializeParams): InitializeResult => {
    const caps = params.capabilities;
    ctx.client.configuration = caps.workspace?.configuration === true;
    ctx.client.resourceCreate = caps.workspace?.workspaceEdit?.resourceOperations?.includes('create') === true;
    ctx.client.hierarchicalSymbols = caps.textDocument?.documentSymbol?.hierarchicalDocumentSymbolSupport === true;
    lazyActions = caps.textDocument?.codeAction?.resolveSupport?.properties.includes('edit') === true;
    const folders = params.workspaceFolders?.map((f) => uriToPath(f.uri)) ?? (params.rootUri ? [uriToPath(params.rootUri)] : []);
    documents.roots = folders;
    const init = params.initializationOptions as Record<string, unknown> | undefined;
    ctx.settings = mergeSettings(ctx.settings, init?.['thermoscribe'] ?? init);
    const clientCommands = init?.['clientCommands'];
    ctx.client.showGenerated = Array.isArray(clientCommands) && clientCommands.includes(SHOW_GENERATED);
    return {
      capabilities: {
        textDocumentSync: TextDocumentSyncKind.Incremental,
        hoverProvider: true,
        completionProvider: { triggerCharacters: ['=', ' '], resolveProvider: false },
        inlayHintProvider: true,
        documentSymbolProvider: true,
        foldingRangeProvider: true,
        semanticTokensProvider: { legend: LEGEND, full: true, range: false },
        documentFormattingProvider: true,
        definitionProvider: true,
        referencesProvider: true,
        renameProvider: { prepareProvider: true },
        codeActionProvider: { codeActionKinds: [CodeActionKind.QuickFix, GENERATE_KIND], resolveProvider: true },
        codeLensProvider: { resolveProvider: false },
      },
      serverInfo: { name: 'thermoscribe', version: VERSION },
    };
  });

  connection.onInitialized(() => {
    if (ctx.client.configuration) {
      void connection.client.register(DidChangeConfigurationNotification.type, { section: 'thermoscribe' }).catch(() => undefined);
      void pullSettings();
    }
  });

  const pullSettings = async (): Promise<void> => {
    try {
      const raw: unknown = await connection.workspace.getConfiguration('thermoscribe');
      const before = ctx.settings;
      ctx.settings = mergeSettings(ctx.settings, raw);
      if (before.inlayHintsEnabled !== ctx.settings.inlayHintsEnabled) void connection.languages.inlayHint.refresh().catch(() => undefined);
    } catch (err) {
      connection.console.warn(`thermoscribe: could not read settings: ${err instanceof Error ? err.message : String(err)}`);
    }
  };

  connection.onDidChangeConfiguration((change) => {
    const pushed = (change.settings as Record<string, unknown> | null)?.['thermoscribe'];
    if (pushed) ctx.settings = mergeSettings(ctx.settings, pushed);
    if (ctx.client.configuration) void pullSettings();
    diagnostics.all();
  });

  // Analyses that read a changed file from the disk are made again; every open spec is published
  // again, as its generated C file's check reads the disk at each publication.
  connection.onDidChangeWatchedFiles((p) => {
    ctx.analyses.diskChanged(p.changes.map((c) => uriToPath(c.uri, ctx.documents.roots)));
    diagnostics.all();
  });

  documents.docs.onDidChangeContent((e) => diagnostics.changed(e.document));
  documents.docs.onDidClose((e) => {
    diagnostics.closed(e.document.uri);
    // Specs that used the closed file now read it from the disk.
    diagnostics.changed(e.document);
  });

  connection.onHover(guard(connection, 'hover', null, (p) => onHover(ctx, p)));
  connection.onCompletion(guard(connection, 'completion', [], (p) => onCompletion(ctx, p)));
  connection.languages.inlayHint.on(guard(connection, 'inlayHint', [], (p) => onInlayHints(ctx, p)));
  connection.onDocumentSymbol(guard(connection, 'documentSymbol', [], (p) => onDocumentSymbols(ctx, p)));
  connection.onFoldingRanges(guard(connection, 'foldingRange', [], (p) => onFoldingRanges(ctx, p)));
  connection.languages.semanticTokens.on(guard(connection, 'semanticTokens', { data: [] }, (p) => onSemanticTokens(ctx, p)));
  connection.onDocumentFormatting(guard(connection, 'formatting', [], (p) => onFormatting(ctx, p)));
  connection.onDefinition(guard(connection, 'definition', null, (p) => onDefinition(ctx, p)));
  connection.onReferences(guard(connection, 'references', [], (p) => onReferences(ctx, p)));
  connection.onPrepareRename(guard(connection, 'prepareRename', null, (p) => onPrepareRename(ctx, p)));
  connection.onRenameRequest(guard(connection, 'rename', null, (p) => onRename(ctx, p)));
  connection.onCodeAction(guard(connection, 'codeAction', [], (p) => onCodeActions(ctx, p, lazyActions)));
  connection.onCodeActionResolve((p) => guard(connection, 'codeAction/resolve', p, (q: typeof p) => onResolveCodeAction(ctx, q))(p));
  connection.onRequest(CONVERSION_CHANNELS, guard(connection, CONVERSION_CHANNELS, [], (p: ConversionChannelsParams) => onConversionChannels(ctx, p)));
  connection.onRequest(CONVERSION_CODE, guard(connection, CONVERSION_CODE, null, (p: ConversionCodeParams) => onConversionCode(ctx, p)));
  connection.onCodeLens(guard(connection, 'codeLens', [], (p) => onCodeLens(ctx, p)));
  connection.onRequest(PLOT_DATA, guard<PlotDataParams, PlotDataResult | null>(connection, PLOT_DATA, null, (p) => onPlotData(ctx, p)));
  connection.onRequest(COMPARE_DATA, guard<CompareDataParams, CompareDataResult | null>(connection, COMPARE_DATA, null, (p) => onCompareData(ctx, p)));
  connection.onRequest(RUN_BUDGET, runBudgetHandler(ctx));
  connection.onRequest(MEMORY, guard<unknown, MemoryResult | null>(connection, MEMORY, null, () => onMemory()));
  connection.onShutdown(() => {
    markShutDown(connection);
    diagnostics.stop();
  });

  documents.docs.listen(connection);
  return ctx;
}
