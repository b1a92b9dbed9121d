// Files the server reads from the disk without the editor syncing them, watched here and reported
// to the server as workspace/didChangeWatchedFiles (LSP 3.17), its one way of hearing of disk
// changes (server/src/lsp/server.ts): a spec analysis using such a file is then made again and its
// diagnostics published again. Regenerated C files (the "generated code is out of date" check),
// bench data CSV files (`bench_data`: the measured points, their fit and residuals) and specs (a
// `use`d parts file that is not open, changed by a checkout or another program).
import * as vscode from 'vscode';
import type { LanguageClient } from '../../node_modules/vscode-languageclient/lib/node/main';
import { WATCHED } from './watched-files';


export function registerDiskWatch(context: vscode.ExtensionContext, getClient: () => LanguageClient | undefined): void {
  const notify = (uri: vscode.Uri, type: 1 | 2 | 3) => {
    const c = getClient();
    if (c?.isRunning()) void c.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uri.toString(), type }] }).catch(() => undefined);
  };
  for (const glob of WATCHED) {
    const watcher = vscode.workspace.createFileSystemWatcher(glob);
    watcher.onDidCreate((u) => notify(u, 1));
    watcher.onDidChange((u) => notify(u, 2));
    watcher.onDidDelete((u) => notify(u, 3));
    context.subscriptions.push(watcher);
  }
}
