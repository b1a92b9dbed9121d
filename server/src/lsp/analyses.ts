// Per open document: its engine state (document-state.ts: what analyses keep between versions, and
// when they drop it), its analysis at the current version (reused by every request on that version:
// hover, completion, inlay hints...) and its parse at the current version (for the syntax-only
// features: folding, outline, semantic tokens, which never wait for an analysis). An analysis is also
// stale when a file it uses or a data file it names (bench data) has changed: an open document's
// version, or a disk change notice for that file (workspace/didChangeWatchedFiles, `diskChanged`).
// Closing the document drops all of it. An analysis here computes at most INLINE_BUDGETS missing
// worst-case budgets (a keystroke changes one channel); on open the rest follow a few at a time
// (lsp/diagnostics.ts), so the first diagnostics and every request in between need not wait for them.
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { analyse, DocumentState, type Analysis, type SyntaxFile } from '../engine';
import { uriToPath, type OpenDocuments } from './documents';
import { realPathOnDisk } from '../disk';

/** Missing worst-case budgets an analysis here computes at once; the rest are left pending. */
export const INLINE_BUDGETS = 8;

interface Analysed {
  version: number;
  /** Version of every used file when analysed: an open document's version, or -1 for the disk. */
  deps: Map<string, number>;
  analysis: Analysis;
}

interface Entry {
  state: DocumentState;
  analysed?: Analysed;
  parsed?: { version: number; file: SyntaxFile };
}

export class AnalysisCache {
  private readonly entries = new Map<string, Entry>();

  constructor(private readonly docs: OpenDocuments) {}

  /**
   * The analysis of a document at its current version (computed when missing or stale; `complete`:
   * also when the kept one has budgets pending, then with every budget, once they have been kept).
   * `inline`: missing budgets computed at once when not complete (a large spec's open takes none).
   */
  get(doc: TextDocument, complete = false, inline = INLINE_BUDGETS): Analysis {
    const entry = this.entryFor(doc.uri);
    const hit = entry.analysed;
    if (hit && hit.version === doc.version && this.fresh(hit) && !(complete && hit.analysis.budgetsPending.length > 0)) return hit.analysis;
    const p = uriToPath(doc.uri, this.docs.roots);
    const analysis = analyse({ path: p, text: doc.getText(), root: this.docs.rootFor(p), host: this.docs.host(), state: entry.state, errorBudget: complete ? true : inline });
    const deps = new Map<string, number>();
    for (const f of analysis.files.slice(1)) deps.set(f.path, this.docs.byPath(f.path)?.version ?? -1);
    // Bench data files are read from the disk (or an open document) like used files, so their changes count the same way.
    for (const f of analysis.dataFiles) if (!deps.has(f)) deps.set(f, this.docs.byPath(f)?.version ?? -1);
    entry.analysed = { version: doc.version, deps, analysis };
    return analysis;
  }

  /** The document's text and parse at its current version: the analysis' when there is one, else a parse alone. */
  syntax(doc: TextDocument): SyntaxFile {
    const entry = this.entryFor(doc.uri);
    if (entry.analysed?.version === doc.version) return entry.analysed.analysis.files[0]!;
    if (entry.parsed?.version !== doc.version) {
      const text = doc.getText();
      // The same parse cache as the analysis: its parse of this text then finds every piece.
      entry.parsed = { version: doc.version, file: { text, parse: entry.state.pieces.parse(text) } };
    }
    return entry.parsed.file;
  }

  /** Analyses `doc` with some files replaced (to try out a fix): reads the document's state, changes nothing; budgets as a keystroke gets them (a code action never waits for the budgets an open left pending). */
  run(doc: TextDocument, overrides?: Map<string, string>): Analysis {
    const p = uriToPath(doc.uri, this.docs.roots);
    const text = overrides?.get(p) ?? doc.getText();
    return analyse({ path: p, text, root: this.docs.rootFor(p), host: this.docs.host(overrides), state: this.entries.get(doc.uri)?.state, trial: true, errorBudget: INLINE_BUDGETS });
  }

  /** The last analysis of a document, whatever its version (for finding dependants). */
  peek(uri: string): Analysis | undefined {
    return this.entries.get(uri)?.analysed?.analysis;
  }

  drop(uri: string): void {
    this.entries.delete(uri);
  }

  private entryFor(uri: string): Entry {
    let e = this.entries.get(uri);
    if (!e) this.entries.set(uri, (e = { state: new DocumentState() }));
    return e;
  }

  /**
   * Files changed on disk (absolute paths): the analyses that read one of them from the disk are
   * dropped, the others kept. Compared by real path too, so a file reached through a link counts.
   */
  diskChanged(paths: readonly string[]): void {
    const changed = new Set(paths.flatMap((p) => [p, realPathOnDisk(p)]));
    for (const e of this.entries.values()) {
      const deps = e.analysed?.deps;
      if (deps && [...deps].some(([p, v]) => v === -1 && (changed.has(p) || changed.has(realPathOnDisk(p))))) e.analysed = undefined;
    }
  }

  private fresh(e: Analysed): boolean {
    for (const [p, v] of e.deps) if ((this.docs.byPath(p)?.version ?? -1) !== v) return false;
    return true;
  }
}
