// "Thermoscribe: Insert Conversion Code" in a C or C++ file: pick a channel of the .tsense specs in
// the file's workspace folder (the server lists them), insert its generated block, markers
// included, at the cursor. All generation happens in the server (thermoscribe/conversionCode).
import * as vscode from 'vscode';
import type { LanguageClient } from '../../node_modules/vscode-languageclient/lib/node/main';

const COMMAND = 'thermoscribe.insertConversion';
const C_LANGUAGES = new Set(['c', 'cpp', 'objective-c', 'objective-cpp']);

interface ChannelItem extends vscode.QuickPickItem {
  uri: string;
  channel: string;
}

export function registerInsertConversion(context: vscode.ExtensionContext, getClient: () => LanguageClient | undefined): void {
  // Regenerated C files are reported to the server by the one disk watcher (disk-watch.ts).
  context.subscriptions.push(vscode.commands.registerCommand(COMMAND, () => insertConversion(getClient())));
}

async function insertConversion(client: LanguageClient | undefined): Promise<void> {
  const editor = vscode.window.activeTextEditor;
  if (!editor || !C_LANGUAGES.has(editor.document.languageId)) {
    void vscode.window.showWarningMessage('Thermoscribe: open a C or C++ file and place the cursor where the conversion code should go.');
    return;
  }
  if (!client?.isRunning()) {
    void vscode.window.showWarningMessage('Thermoscribe: the language server is not running (see "Thermoscribe: Show Language Server Log").');
    return;
  }
  const folder = vscode.workspace.getWorkspaceFolder(editor.document.uri);
  const specs = folder
    ? await vscode.workspace.findFiles(new vscode.RelativePattern(folder, '**/*.tsense'), '**/node_modules/**', 200)
    : await vscode.workspace.findFiles(new vscode.RelativePattern(vscode.Uri.joinPath(editor.document.uri, '..'), '*.tsense'), undefined, 200);
  if (specs.length === 0) {
    void vscode.window.showWarningMessage('Thermoscribe: no .tsense spec found in this workspace folder.');
    return;
  }
  let channels: { uri: string; channel: string }[];
  try {
    channels = await client.sendRequest('thermoscribe/conversionChannels', { uris: specs.map((u) => u.toString()) });
  } catch (err) {
    void vscode.window.showErrorMessage(`Thermoscribe: ${err instanceof Error ? err.message : String(err)}`);
    return;
  }
  if (channels.length === 0) {
    void vscode.window.showWarningMessage('Thermoscribe: no channel without errors in the specs of this workspace folder.');
    return;
  }
  const items: ChannelItem[] = channels.map((c) => ({ label: c.channel, description: vscode.workspace.asRelativePath(vscode.Uri.parse(c.uri)), uri: c.uri, channel: c.channel }));
  const pick = await vscode.window.showQuickPick(items, { title: 'Insert conversion code for which channel?', matchOnDescription: true });
  if (!pick) return;
  const eol = editor.document.eol === vscode.EndOfLine.CRLF ? '\r\n' : '\n';
  let result: { text: string; method: string; maxErrorC: number };
  try {
    result = await client.sendRequest('thermoscribe/conversionCode', { uri: pick.uri, channel: pick.channel, eol });
  } catch (err) {
    void vscode.window.showErrorMessage(`Thermoscribe: ${err instanceof Error ? err.message : String(err)}`);
    return;
  }
  const ok = await editor.edit((b) => b.insert(editor.selection.active, result.text));
  if (ok) vscode.window.setStatusBarMessage(`Thermoscribe: ${pick.channel} (${result.method}, max error ${result.maxErrorC.toFixed(4)} °C vs the model)`, 5000);
}
