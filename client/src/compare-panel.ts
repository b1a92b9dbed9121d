// "Thermoscribe: Compare Sensor Designs": a webview panel beside the editor with the spec's
// candidate channels side by side, one table per compare_group. The server sends the rows and their
// cells already formatted (thermoscribe/compareData, the same text as `thermoscribe compare`); this
// panel only lays them out as plain HTML tables in the editor's colours. It runs no script: the page
// is rebuilt on each answer. It follows edits of its spec (debounced).
import * as vscode from 'vscode';
import type { LanguageClient } from '../../node_modules/vscode-languageclient/lib/node/main';
import { followEdits, LivePanel } from './live-panel';
import { comparePage as page, compareProblem as problem, compareTables as tables, type CompareAnswer } from './compare-html';

const COMMAND = 'thermoscribe.showComparison';
const REQUEST = 'thermoscribe/compareData';
const LANGUAGE_ID = 'tsense';

const panels = new Map<string, ComparePanel>();

export function registerComparePanel(context: vscode.ExtensionContext, getClient: () => LanguageClient | undefined): void {
  context.subscriptions.push(
    vscode.commands.registerCommand(COMMAND, (uri?: unknown, group?: unknown) => showComparison(getClient, uri, group)),
    followEdits(panels),
  );
}

function showComparison(getClient: () => LanguageClient | undefined, uriArg?: unknown, groupArg?: unknown): void {
  let uri = typeof uriArg === 'string' ? uriArg : uriArg instanceof vscode.Uri ? uriArg.toString() : undefined;
  if (!uri) {
    const editor = vscode.window.activeTextEditor;
    if (!editor || editor.document.languageId !== LANGUAGE_ID) {
      void vscode.window.showWarningMessage('Thermoscribe: open a .tsense spec to compare its channels.');
      return;
    }
    uri = editor.document.uri.toString();
  }
  const group = typeof groupArg === 'string' ? groupArg : undefined;
  const key = `${uri}#${group ?? ''}`;
  const existing = panels.get(key);
  if (existing) {
    existing.reveal();
    return;
  }
  panels.set(key, new ComparePanel(getClient, uri, group, () => panels.delete(key)));
}

class ComparePanel extends LivePanel<string> {
  private readonly title: string;

  constructor(private readonly getClient: () => LanguageClient | undefined, uri: string, private readonly group: string | undefined, onDispose: () => void) {
    const title = `Compare: ${group ?? vscode.Uri.parse(uri).path.split('/').pop() ?? uri}`;
    super(uri, vscode.window.createWebviewPanel('thermoscribe.compare', title, { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, {
      enableScripts: false,
      localResourceRoots: [],
    }), onDispose);
    this.title = title;
    this.panel.webview.html = page(this.title, `<p class="status">Computing the comparison…</p>`);
    void this.refresh();
  }

  /** The page body: the tables, or the problem. */
  protected async ask(): Promise<string> {
    const client = this.getClient();
    if (!client?.isRunning()) return problem('The language server is not running (see "Thermoscribe: Show Language Server Log").');
    try {
      const answer = await client.sendRequest<CompareAnswer | null>(REQUEST, { uri: this.uri, group: this.group });
      if (!answer) return problem('The server could not compute the comparison (see the server log).');
      if (!answer.ok) return problem(`${answer.message ?? 'no comparison'}${answer.groupNames.length ? `; groups: ${answer.groupNames.join(', ')}` : ''}`);
      return tables(answer);
    } catch (err) {
      return problem(err instanceof Error ? err.message : String(err));
    }
  }

  protected show(body: string): void {
    this.panel.webview.html = page(this.title, body);
  }
}
