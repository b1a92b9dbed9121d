// "Thermoscribe: Show Plot" and the channel code lens: a webview panel beside the editor with the
// channel's transfer curve and error bands. The server sends the numbers (thermoscribe/plotData);
// the webview script (client/webview/plot-view.ts, bundled to dist/webview/plot-view.js) draws them
// with the shared chart spec in the editor's colours. The panel follows edits of its spec (debounced).
import * as vscode from 'vscode';
import type { LanguageClient } from '../../node_modules/vscode-languageclient/lib/node/main';
import { specTarget } from './spec-target';
import { escapeHtml, followEdits, LivePanel, webviewPage } from './live-panel';

const COMMAND = 'thermoscribe.showPlot';
const REQUEST = 'thermoscribe/plotData';

type PlotAnswer = { ok: true; data: unknown } | { ok: false; message: string; channels: string[]; blocked?: boolean };

const panels = new Map<string, PlotPanel>();

export function registerPlotPanel(context: vscode.ExtensionContext, getClient: () => LanguageClient | undefined): void {
  context.subscriptions.push(
    vscode.commands.registerCommand(COMMAND, (uri?: unknown, channel?: unknown) => showPlot(context, getClient, uri, channel)),
    followEdits(panels),
  );
}

async function showPlot(context: vscode.ExtensionContext, getClient: () => LanguageClient | undefined, uriArg?: unknown, channelArg?: unknown): Promise<void> {
  const target = specTarget(uriArg, getClient, 'plot one of its channels');
  if (!target) return;
  const { uri, client } = target;
  let channel = typeof channelArg === 'string' ? channelArg : undefined;
  if (!channel) {
    // No channel given (command palette): ask the server which channels the spec has.
    let answer: PlotAnswer | null;
    try {
      answer = await client.sendRequest<PlotAnswer | null>(REQUEST, { uri });
    } catch (err) {
      void vscode.window.showErrorMessage(`Thermoscribe: ${err instanceof Error ? err.message : String(err)}`);
      return;
    }
    const names = answer && !answer.ok ? answer.channels : [];
    if (names.length === 0) {
      void vscode.window.showWarningMessage('Thermoscribe: this spec has no channel to plot.');
      return;
    }
    channel = names.length === 1 ? names[0] : await vscode.window.showQuickPick(names, { title: 'Plot which channel?', placeHolder: 'channel name' });
    if (!channel) return;
  }
  const key = `${uri}#${channel}`;
  const existing = panels.get(key);
  if (existing) {
    existing.reveal();
    return;
  }
  panels.set(key, new PlotPanel(context, getClient, uri, channel, () => panels.delete(key)));
}

class PlotPanel extends LivePanel<unknown> {
  constructor(context: vscode.ExtensionContext, private readonly getClient: () => LanguageClient | undefined, uri: string, private readonly channel: string, onDispose: () => void) {
    super(uri, vscode.window.createWebviewPanel('thermoscribe.plot', `Plots: ${channel}`, { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, {
      enableScripts: true,
      localResourceRoots: [vscode.Uri.joinPath(context.extensionUri, 'dist', 'webview')],
    }), onDispose);
    this.panel.webview.html = html(this.panel.webview, vscode.Uri.joinPath(context.extensionUri, 'dist', 'webview', 'plot-view.js'), channel);
    this.panel.webview.onDidReceiveMessage((m: { type?: string }) => {
      if (m?.type === 'ready') void this.refresh();
    });
  }

  protected async ask(): Promise<unknown> {
    const client = this.getClient();
    if (!client?.isRunning()) return { type: 'problem', message: 'The language server is not running.', channels: [] };
    try {
      const answer = await client.sendRequest<PlotAnswer | null>(REQUEST, { uri: this.uri, channel: this.channel });
      if (!answer) return { type: 'problem', message: 'The server could not compute the plots (see the server log).', channels: [] };
      return answer.ok ? { type: 'data', data: answer.data } : { type: 'problem', message: answer.message, channels: answer.channels, blocked: answer.blocked === true };
    } catch (err) {
      return { type: 'problem', message: err instanceof Error ? err.message : String(err), channels: [] };
    }
  }

  protected show(message: unknown): void {
    void this.panel.webview.postMessage(message);
  }
}

function html(webview: vscode.Webview, script: vscode.Uri, channel: string): string {
  // Nothing remote: the script comes from the extension, styles are inline with a nonce, images are data: URIs.
  const csp = (nonce: string) => `default-src 'none'; script-src 'nonce-${nonce}'; style-src ${webview.cspSource} 'nonce-${nonce}'; img-src ${webview.cspSource} data:; font-src ${webview.cspSource};`;
  const style = `  #status { color: var(--vscode-descriptionForeground); margin: 4px 0 8px; }
  #status.problem { color: var(--vscode-errorForeground); }
  #chart svg { max-width: 100%; height: auto; }
  #budget .caption { font-weight: bold; margin: 12px 0 4px; }
  #budget table { border-collapse: collapse; }
  #budget th, #budget td { padding: 2px 10px 2px 0; text-align: left; }
  #budget td + td { text-align: right; }`;
  return webviewPage(`Plots: ${channel}`, csp, style, (nonce) => `<div id="status">Computing the plots of ${escapeHtml(channel)}…</div>
<div id="chart" data-state="waiting"></div>
<div id="budget"></div>
<script nonce="${nonce}" src="${webview.asWebviewUri(script).toString()}"></script>`);
}
