// "Thermoscribe: Compare Sensor Designs": a webview panel beside the editor with the spec's
// candidate channels side by side, one table per compare_group. The server sends the rows and their
// cells already formatted (thermoscribe/compareData, the same text as `thermoscribe compare`); this
// panel only lays them out as plain HTML tables in the editor's colours. It runs no script: the page
// is rebuilt on each answer. It follows edits of its spec (debounced).
import * as vscode from 'vscode';
import type { LanguageClient } from '../../node_modules/vscode-languageclient/lib/node/main';
import { escapeHtml, followEdits, LivePanel, webviewPage } from './live-panel';

const COMMAND = 'thermoscribe.showComparison';
const REQUEST = 'thermoscribe/compareData';
const LANGUAGE_ID = 'tsense';

interface CompareAnswer {
  ok: boolean;
  groupNames: string[];
  headers?: string[];
  groups?: { name: string; rows: { channel: string; notes: string[] }[]; cells: string[][] }[];
  errors?: number;
  explain?: string;
  caution?: string;
  message?: string;
}

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

function problem(message: string): string {
  return `<p class="status problem">${escapeHtml(message)}</p>`;
}

function tables(a: CompareAnswer): string {
  const headers = a.headers ?? [];
  const out: string[] = [];
  for (const g of a.groups ?? []) {
    out.push(`<h2>Measurement <code>${escapeHtml(g.name)}</code>: ${g.rows.length} candidate${g.rows.length === 1 ? '' : 's'}</h2>`);
    out.push('<table><thead><tr>' + headers.map((h, i) => `<th class="${i < 2 ? 'text' : 'num'}">${escapeHtml(h)}</th>`).join('') + '</tr></thead><tbody>');
    for (const row of g.cells) out.push('<tr>' + row.map((c, i) => `<td class="${i < 2 ? 'text' : 'num'}">${escapeHtml(c)}</td>`).join('') + '</tr>');
    out.push('</tbody></table>');
    const notes = g.rows.flatMap((r) => r.notes.map((n) => `<li><code>${escapeHtml(r.channel)}</code>: ${escapeHtml(n)}</li>`));
    if (notes.length) out.push(`<ul class="notes">${notes.join('')}</ul>`);
  }
  if (a.errors) out.push(problem(`The spec has ${a.errors} error${a.errors === 1 ? '' : 's'}; channels with errors may be missing (see the problems list).`));
  if (a.explain) out.push(`<p class="explain">${escapeHtml(a.explain)}</p>`);
  if (a.caution) out.push(`<p class="caution">${escapeHtml(a.caution)}</p>`);
  return out.join('\n');
}

function page(title: string, body: string): string {
  // No script, nothing remote: only the inline style, admitted by its nonce.
  const style = `  h2 { font-size: 1.1em; font-weight: 600; margin: 16px 0 6px; }
  table { border-collapse: collapse; margin-bottom: 6px; }
  th, td { padding: 3px 10px; border-bottom: 1px solid var(--vscode-panel-border, var(--vscode-editorWidget-border)); white-space: nowrap; }
  th { color: var(--vscode-descriptionForeground); font-weight: 600; }
  .num { text-align: right; font-variant-numeric: tabular-nums; }
  .text { text-align: left; }
  tbody tr:hover { background: var(--vscode-list-hoverBackground); }
  code { font-family: var(--vscode-editor-font-family); }
  .notes, .explain, .caution, .status { color: var(--vscode-descriptionForeground); }
  .problem { color: var(--vscode-errorForeground); }
  .caution { border-left: 3px solid var(--vscode-editorWarning-foreground); padding-left: 8px; white-space: pre-line; }`;
  return webviewPage(title, (nonce) => `default-src 'none'; style-src 'nonce-${nonce}';`, style, () => body);
}
