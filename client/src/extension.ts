// VS Code client of the Thermoscribe language server. Deliberately thin: every feature lives in
// the server (`dist/cli.js serve --stdio`); this file starts it, restarts it and shows its log.
import * as vscode from 'vscode';
// The file path rather than `vscode-languageclient/node`: the root tsconfig's `moduleResolution: node`
// ignores package `exports`, and a file path resolves the same under every setting and in esbuild.
import { LanguageClient, TransportKind, type LanguageClientOptions, type ServerOptions } from '../../node_modules/vscode-languageclient/lib/node/main';
import { registerInsertConversion } from './insert-conversion';
import { registerDiskWatch } from './disk-watch';
import { registerPlotPanel } from './plot-panel';
import { registerRunBudget } from './run-budget';
import { registerComparePanel } from './compare-panel';
import { SERVER_NODE_FLAGS } from './server-flags';
import { registerShowGenerated, SHOW_GENERATED } from './show-generated';

const LANGUAGE_ID = 'tsense';
// Client id: vscode-languageclient reads the `thermoscribe.trace.server` setting from it.
const CLIENT_ID = 'thermoscribe';

let client: LanguageClient | undefined;
let log: vscode.LogOutputChannel | undefined;

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  log = vscode.window.createOutputChannel('Thermoscribe Language Server', { log: true });
  context.subscriptions.push(log);

  context.subscriptions.push(
    vscode.commands.registerCommand('thermoscribe.restartServer', () => restart(context)),
    vscode.commands.registerCommand('thermoscribe.showServerLog', () => log?.show(true)),
  );
  registerInsertConversion(context, () => client);
  registerDiskWatch(context, () => client);
  registerPlotPanel(context, () => client);
  registerRunBudget(context, () => client);
  registerComparePanel(context, () => client);
  registerShowGenerated(context);

  await start(context);
}

export async function deactivate(): Promise<void> {
  await stop();
}

function createClient(context: vscode.ExtensionContext, channel: vscode.LogOutputChannel): LanguageClient {
  const module = context.asAbsolutePath('dist/cli.js');
  // With TransportKind.stdio the client forks `module` under the extension host's own Node and
  // appends `--stdio` itself, so the server runs as `cli.js serve --stdio`.
  const serverOptions: ServerOptions = {
    run: { module, transport: TransportKind.stdio, args: ['serve'], options: { execArgv: [...SERVER_NODE_FLAGS] } },
    debug: { module, transport: TransportKind.stdio, args: ['serve'], options: { execArgv: [...SERVER_NODE_FLAGS, '--nolazy', '--inspect=6019'] } },
  };
  const clientOptions: LanguageClientOptions = {
    documentSelector: [
      { scheme: 'file', language: LANGUAGE_ID },
      { scheme: 'untitled', language: LANGUAGE_ID },
    ],
    // Push `thermoscribe.*` changes to the server as well; it may also pull them with workspace/configuration.
    synchronize: { configurationSection: 'thermoscribe' },
    // Commands this client runs itself; the server attaches them to its code actions.
    initializationOptions: { clientCommands: [SHOW_GENERATED] },
    outputChannel: channel,
    traceOutputChannel: channel,
    // The channel hover's link opens the plot panel; no other command runs from a hover.
    markdown: { isTrusted: { enabledCommands: ['thermoscribe.showPlot'] } },
  };
  return new LanguageClient(CLIENT_ID, 'Thermoscribe Language Server', serverOptions, clientOptions);
}

async function start(context: vscode.ExtensionContext): Promise<void> {
  if (!log) return;
  client = createClient(context, log);
  try {
    await client.start();
  } catch (err) {
    // A failed start must not take the editor down: say so and point at the log.
    const message = err instanceof Error ? err.message : String(err);
    log.error(`the language server did not start: ${message}`);
    const choice = await vscode.window.showErrorMessage('Thermoscribe: the language server did not start.', 'Show Log');
    if (choice === 'Show Log') log.show(true);
  }
}

async function stop(): Promise<void> {
  const current = client;
  client = undefined;
  if (!current) return;
  try {
    await current.stop(5000);
  } catch (err) {
    log?.error(`stopping the language server failed: ${err instanceof Error ? err.message : String(err)}`);
  }
}

async function restart(context: vscode.ExtensionContext): Promise<void> {
  log?.info('restarting the language server');
  await stop();
  await start(context);
}
