// After "Generate conversion code for <channel>" is applied: show the written C file at the
// channel's block and say what was written. The server attaches this command to the code action
// (it runs after the edit) because the client names it in `initializationOptions.clientCommands`;
// the summary (method, worst error, sizes) is the server's own sentence.
import * as vscode from 'vscode';

export const SHOW_GENERATED = 'thermoscribe.showGenerated';

interface ShowGeneratedArgs {
  uri: string;
  line: number;
  message: string;
}

export function registerShowGenerated(context: vscode.ExtensionContext): void {
  context.subscriptions.push(vscode.commands.registerCommand(SHOW_GENERATED, (args: ShowGeneratedArgs) => showGenerated(args)));
}

async function showGenerated(args: ShowGeneratedArgs | undefined): Promise<void> {
  if (!args || typeof args.uri !== 'string') return;
  const doc = await vscode.workspace.openTextDocument(vscode.Uri.parse(args.uri));
  const line = Math.min(Math.max(0, args.line | 0), Math.max(0, doc.lineCount - 1));
  const at = new vscode.Range(line, 0, line, 0);
  // Beside the spec, so the channel being worked on stays in view.
  const editor = await vscode.window.showTextDocument(doc, { viewColumn: vscode.ViewColumn.Beside, preview: false, selection: at });
  editor.revealRange(at, vscode.TextEditorRevealType.AtTop);
  const unsaved = doc.isDirty ? ' The file is open with the change not yet saved.' : '';
  void vscode.window.showInformationMessage(`Thermoscribe: ${args.message}${unsaved}`);
}
