// Waiting on editor events rather than on timers: diagnostics arrive when the server publishes them.
import * as vscode from 'vscode';

/** Resolves with the diagnostics of `uri` once `accept` holds for them; rejects after `timeoutMs`. */
export function waitForDiagnostics(
  uri: vscode.Uri,
  accept: (diagnostics: vscode.Diagnostic[]) => boolean,
  timeoutMs: number,
  what: string,
): Promise<vscode.Diagnostic[]> {
  return new Promise((resolve, reject) => {
    const done = (fn: () => void): void => {
      clearTimeout(timer);
      listener.dispose();
      fn();
    };
    const check = (): boolean => {
      const diagnostics = vscode.languages.getDiagnostics(uri);
      if (!accept(diagnostics)) return false;
      done(() => resolve(diagnostics));
      return true;
    };
    const listener = vscode.languages.onDidChangeDiagnostics((event) => {
      if (event.uris.some((u) => u.toString() === uri.toString())) check();
    });
    const timer = setTimeout(() => {
      const seen = vscode.languages.getDiagnostics(uri).map(codeOf).join(', ') || 'none';
      done(() => reject(new Error(`timed out after ${timeoutMs} ms waiting for ${what}; diagnostics seen: ${seen}`)));
    }, timeoutMs);
    check();
  });
}

export function codeOf(d: vscode.Diagnostic): string {
  if (d.code === undefined) return '(no code)';
  return typeof d.code === 'object' ? String(d.code.value) : String(d.code);
}
