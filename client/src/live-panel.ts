// What the plot and comparison panels share: a webview panel beside the editor that follows edits
// of its spec. After a change it asks the server again once the server's own debounce and a little
// more have passed (a burst of typing asks once); a slow answer to an older question never
// replaces a newer one.
import * as vscode from 'vscode';

/** Extra wait after the server's own debounce. */
const DEBOUNCE_MS = 400;

export abstract class LivePanel<Answer> {
  private timer: ReturnType<typeof setTimeout> | undefined;
  private asked = 0;

  protected constructor(readonly uri: string, protected readonly panel: vscode.WebviewPanel, onDispose: () => void) {
    panel.onDidDispose(() => {
      if (this.timer) clearTimeout(this.timer);
      onDispose();
    });
  }

  reveal(): void {
    this.panel.reveal(undefined, true);
    void this.refresh();
  }

  schedule(): void {
    if (this.timer) clearTimeout(this.timer);
    const serverDebounce = vscode.workspace.getConfiguration('thermoscribe').get<number>('debounceMs', 200);
    this.timer = setTimeout(() => void this.refresh(), serverDebounce + DEBOUNCE_MS);
  }

  protected async refresh(): Promise<void> {
    const n = ++this.asked;
    const answer = await this.ask();
    if (n === this.asked) this.show(answer);
  }

  /** Asks the server; a failure comes back as an answer that shows the problem (never throws). */
  protected abstract ask(): Promise<Answer>;
  protected abstract show(answer: Answer): void;
}

/** Re-asks every open panel of a spec when the spec changes. */
export function followEdits(panels: Map<string, LivePanel<unknown>>): vscode.Disposable {
  return vscode.workspace.onDidChangeTextDocument((e) => {
    for (const p of panels.values()) if (p.uri === e.document.uri.toString()) p.schedule();
  });
}

export { escapeHtml, webviewPage } from './webview-page';
