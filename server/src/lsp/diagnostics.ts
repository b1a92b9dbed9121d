// Diagnostics on open and on every change, per document. A change to a file re-checks every open
// spec that uses it. Before publishing, the document version is checked again, so results for an
// old version are never published.
//
// Adaptive debounce: a document whose analyses cost less than the debounce setting is checked at
// once (felt latency then at most two analyses, one under way and its own, which is less than the
// debounce plus one); a costlier one waits the debounce after the last change, so keystrokes typed
// meanwhile cost one analysis. A newer change resets the wait: the cancellation of stale work. The
// cost is the analysis' CPU time (a busy machine stretches wall time, not the work), the median of
// the last COST_SAMPLES, so one slow analysis (a collection, a costly channel) does not add the
// debounce to the next keystrokes.
//
// Syntax first: when a document of SYNTAX_FIRST_CHARS or more is first checked (a large spec opened),
// its syntax diagnostics, from a parse that keeps no field (engine `syntaxDiagnostics`, half a full
// parse's cost), are published at once and the analysis follows on a later turn, with no budget
// computed inline: every one follows in slices, so a hover sent meanwhile waits for the analysis
// alone, never for a budget (the bench's 1,600 channels showed no difference: their first eight
// budgets are cheap; a spec whose first channels run costly budgets gains).
//
// Two steps: the first publish carries every diagnostic whose worst-case budget was kept or cheap
// (lsp/analyses.ts INLINE_BUDGETS); the budgets left pending (a document just opened) are then
// computed in slices of SLICE_MS between which hovers, edits and other requests are served, and
// the full diagnostics follow. A newer version drops the rest of the slices (the budgets already
// made are kept by content in the document's state, so the next version's analysis finds them).
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { ServerContext } from './context';
import { toDiagnostic } from './convert';
import { uriToPath } from './documents';
import { keepWorstCaseBudget, staleDiagnostics, syntaxDiagnostics, type Analysis, type ChannelResult, type Diagnostic } from '../engine';
import { isShutDown } from './guard';

/** Longest stretch of budget work between two turns of the event loop. */
const SLICE_MS = 20;
/**
 * A document at least this long publishes its syntax diagnostics before its first analysis: about 170
 * channels of the bench's generated specs (200 channels are 117,000 characters; their warm full parse
 * measured 48-155 ms at load 5-7, 2026-12-03). Below it the analysis follows soon enough.
 */
const SYNTAX_FIRST_CHARS = 100_000;
/** The debounce follows the median CPU cost of this many last analyses. */
const COST_SAMPLES = 3;

/** CPU time of this process so far, ms (user + system). */
function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

export class DiagnosticScheduler {
  private readonly timers = new Map<string, NodeJS.Timeout>();
  /** A check about to run at once, or the budget slices under way (lsp/diagnostics.ts `soon`, `follow`). */
  private readonly followers = new Map<string, NodeJS.Immediate>();
  /** CPU ms of the last analyses of each open document (the adaptive debounce's measure); empty after its first, cold one. */
  private readonly costs = new Map<string, number[]>();

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
    this.cancel(uri);
    this.costs.delete(uri);
    this.ctx.analyses.drop(uri);
    if (!isShutDown(this.ctx.connection)) void this.ctx.connection.sendDiagnostics({ uri, diagnostics: [] });
  }

  /** Shutdown: pending checks are dropped and nothing more is published. */
  stop(): void {
    for (const uri of [...this.timers.keys(), ...this.followers.keys()]) this.cancel(uri);
  }

  private cancel(uri: string): void {
    const t = this.timers.get(uri);
    if (t) clearTimeout(t);
    this.timers.delete(uri);
    const f = this.followers.get(uri);
    if (f) clearImmediate(f);
    this.followers.delete(uri);
  }

  private schedule(uri: string): void {
    if (isShutDown(this.ctx.connection)) return;
    this.cancel(uri);
    const debounce = this.ctx.settings.debounceMs;
    const cost = this.cost(uri);
    if (cost === undefined || cost < debounce) this.soon(uri, 2);
    else this.timers.set(uri, setTimeout(() => this.run(uri), debounce));
  }

  /**
   * Checks at once, but after the messages already received: the JSON-RPC connection handles one
   * message per turn of the event loop (vscode-jsonrpc's queue), so a change queued behind this one
   * reschedules, and cancels this, before the second turn.
   */
  private soon(uri: string, turns: number): void {
    this.followers.set(uri, setImmediate(() => {
      this.followers.delete(uri);
      if (turns > 1) this.soon(uri, turns - 1);
      else this.run(uri);
    }));
  }

  /** The median of the last analyses' CPU costs, ms; undefined before the first. */
  private cost(uri: string): number | undefined {
    const c = this.costs.get(uri);
    if (!c) return undefined;
    const sorted = [...c].sort((a, b) => a - b);
    return sorted[(sorted.length - 1) >> 1] ?? 0;
  }

  /** `syntaxShown`: this version's syntax diagnostics have been published (a large spec's first check). */
  private run(uri: string, syntaxShown = false): void {
    this.timers.delete(uri);
    const doc = this.ctx.documents.get(uri);
    if (!doc || isShutDown(this.ctx.connection)) return;
    const version = doc.version;
    try {
      const first = !this.costs.has(uri);
      if (first && !syntaxShown && doc.getText().length >= SYNTAX_FIRST_CHARS) {
        this.send(doc, version, syntaxDiagnostics(uriToPath(uri, this.ctx.documents.roots), doc.getText()));
        this.followers.set(uri, setImmediate(() => {
          this.followers.delete(uri);
          if (this.ctx.documents.get(uri)?.version === version) this.run(uri, true);
        }));
        return;
      }
      const c0 = cpuMs();
      const analysis = this.ctx.analyses.get(doc, false, syntaxShown ? 0 : undefined);
      // A document's first analysis is a cold one (every block read, every channel swept): not what
      // a keystroke costs, so the first keystroke is checked at once and measures that.
      const costs = this.costs.get(uri) ?? [];
      if (!first) costs.push(cpuMs() - c0);
      this.costs.set(uri, costs.slice(-COST_SAMPLES));
      if (!this.publish(doc, version, analysis)) return;
      if (analysis.budgetsPending.length > 0) this.follow(uri, version, analysis.budgetsPending, 0);
    } catch (err) {
      this.failed(uri, version, err);
    }
  }

  /** Computes the pending budgets a slice at a time, then publishes the full diagnostics of `version`. */
  private follow(uri: string, version: number, pending: readonly ChannelResult[], from: number): void {
    this.followers.set(uri, setImmediate(() => {
      this.followers.delete(uri);
      const doc = this.ctx.documents.get(uri);
      if (!doc || doc.version !== version || isShutDown(this.ctx.connection)) return;
      try {
        const end = performance.now() + SLICE_MS;
        let i = from;
        while (i < pending.length && performance.now() < end) keepWorstCaseBudget(pending[i++]!);
        if (i < pending.length) return this.follow(uri, version, pending, i);
        this.publish(doc, version, this.ctx.analyses.get(doc, true));
      } catch (err) {
        this.failed(uri, version, err);
      }
    }));
  }

  /** Publishes an analysis of `version` unless the document has moved on; false when it has not been published. */
  private publish(doc: TextDocument, version: number, analysis: Analysis): boolean {
    // Generated blocks in the C file beside the spec are compared at every check (cheap: a
    // marker scan), read through the host so an open, unsaved C buffer counts.
    if (!this.current(doc, version)) return false;
    const stale = staleDiagnostics(analysis, this.ctx.documents.host().read);
    return this.send(doc, version, [...analysis.diagnostics, ...stale].filter((d) => d.file === analysis.path));
  }

  /** Whether `version` is still the document's current version (and the server is not shut down). */
  private current(doc: TextDocument, version: number): boolean {
    const now = this.ctx.documents.get(doc.uri);
    return !!now && now.version === version && !isShutDown(this.ctx.connection);
  }

  /** Sends the diagnostics of the document's own file at `version`, unless the document has moved on. */
  private send(doc: TextDocument, version: number, own: readonly Diagnostic[]): boolean {
    if (!this.current(doc, version)) return false;
    void this.ctx.connection.sendDiagnostics({ uri: doc.uri, version, diagnostics: own.map((d) => toDiagnostic(doc, d)) });
    return true;
  }

  private failed(uri: string, version: number, err: unknown): void {
    this.ctx.connection.console.error(`thermoscribe: checking ${uri} (version ${version}) failed: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
  }
}
