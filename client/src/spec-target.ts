// The spec a command works on (its argument, else the active .tsense editor) and the running
// language client; warns and returns undefined when either is missing.
import * as vscode from 'vscode';
import type { LanguageClient } from '../../node_modules/vscode-languageclient/lib/node/main';

const LANGUAGE_ID = 'tsense';

export function specTarget(uriArg: unknown, getClient: () => LanguageClient | undefined, purpose: string): { uri: string; client: LanguageClient } | undefined {
  let uri = typeof uriArg === 'string' ? uriArg : uriArg instanceof vscode.Uri ? uriArg.toString() : undefined;
  if (!uri) {
    const editor = vscode.window.activeTextEditor;
    if (!editor || editor.document.languageId !== LANGUAGE_ID) {
      void vscode.window.showWarningMessage(`Thermoscribe: open a .tsense spec to ${purpose}.`);
      return undefined;
    }
    uri = editor.document.uri.toString();
  }
  const client = getClient();
  if (!client?.isRunning()) {
    void vscode.window.showWarningMessage('Thermoscribe: the language server is not running (see "Thermoscribe: Show Language Server Log").');
    return undefined;
  }
  return { uri, client };
}
