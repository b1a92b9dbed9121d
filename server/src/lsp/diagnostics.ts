// Diagnostics on open and on every change, debounced per document. A change to a file re-checks
// every open spec that uses it. A timer reset by a newer change is the cancellation of stale work;
// before publishing, the document version is checked again, so results for an old version are
// never published. Each document gets only the diagnostics of its own file (problems in a used
// file show on its `use` line through the engine's import-problems).
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { ServerContext } from './context';
import { toDiagnostic } from './convert';
import { uriToPath } from './documents';
import { staleDiagnostics } from '../engine';
import { isShutDown } from './guard';

export class DiagnosticScheduler {
  private readonly timers = new Map<string, NodeJS.Timeout>();

  constructor(private readonly ctx: ServerContext) {}

  /** The document changed (or opened): re-check it and every open document that uses it. */
  changed(doc: TextDocument): void {
    this.schedule(doc.uri);
    const p = uriToPath(doc.uri, this.ctx.documents.roots);
    for (const other of this.ctx.documents.docs.all()) {
      if (other.uri === doc.uri) continue;
      const a = this.ctx.analyses.peek(other.uri);
      if (a && a.files.some((f, i) => i > 0 && f.path === p)) this.schedule(other.uri);
    }
  }

  /** Re-check every open document (settings or files on disk changed). */
  all(): void {
    for (const d of this.ctx.documents.docs.all()) this.schedule(d.uri);
  }

  closed(uri: string): void {
    const t = this.timers.get(uri);
    if (t) clearTimeout(t);
    this.timers.delete(uri);
    this.ctx.analyses.drop(uri);
    if (!isShutDown(this.ctx.connection)) void this.ctx.connection.sendDiagnostics({ uri, diagnostics: [] });
  }

  /** Shutdown: pending checks are dropped and nothing more is published. */
  stop(): void {
    for (const t of this.timers.values()) clearTimeout(t);
    this.timers.clear();
  }

  private schedule(uri: string): void {
    if (isShutDown(this.ctx.connection)) return;
    const prior = this.timers.get(uri);
    if (prior) clearTimeout(prior);
    this.timers.set(uri, setTimeout(() => this.run(uri), this.ctx.settings.debounceMs));
  }

  private run(uri: string): void {
    this.timers.delete(uri);
    const doc = this.ctx.documents.get(uri);
    if (!doc || isShutDown(this.ctx.connection)) return;
    const version = doc.version;
    try {
      const analysis = this.ctx.analyses.get(doc);
      const current = this.ctx.documents.get(uri);
      if (!current || current.version !== version || isShutDown(this.ctx.connection)) return;
      const own = analysis.path;
      // Generated blocks in the C file beside the spec are compared at every check (cheap: a
      // marker scan), read through the host so an open, unsaved C buffer counts.
      const stale = staleDiagnostics(analysis, this.ctx.documents.host().read);
      const diagnostics = [...analysis.diagnostics, ...stale].filter((d) => d.file === own).map((d) => toDiagnostic(doc, d));
      void this.ctx.connection.sendDiagnostics({ uri, version, diagnostics });
    } catch (err) {
      this.ctx.connection.console.error(`thermoscribe: checking ${uri} (version ${version}) failed: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
    }
  }
}
