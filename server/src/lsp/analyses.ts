// One analysis per open document version, reused by every request on that version (hover,
// completion, inlay hints...) so that only a change re-runs the engine. An entry is also stale
// when a file it uses has changed (an open document's version, or a disk change notice).
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { analyse, ParseCache, SweepCache, type Analysis } from '../engine';
import { uriToPath, type OpenDocuments } from './documents';

interface Entry {
  version: number;
  /** Version of every used file when analysed: an open document's version, or -1 for the disk. */
  deps: Map<string, number>;
  diskGeneration: number;
  analysis: Analysis;
}

export class AnalysisCache {
  private readonly entries = new Map<string, Entry>();
  /** Bumped when the client reports changed files on disk. */
  diskGeneration = 0;

  constructor(private readonly docs: OpenDocuments) {}

  /** The analysis of a document at its current version (computed when missing or stale). */
  get(doc: TextDocument): Analysis {
    const hit = this.entries.get(doc.uri);
    if (hit && hit.version === doc.version && this.fresh(hit)) return hit.analysis;
    const analysis = this.run(doc);
    const deps = new Map<string, number>();
    for (const f of analysis.files.slice(1)) deps.set(f.path, this.docs.byPath(f.path)?.version ?? -1);
    this.entries.set(doc.uri, { version: doc.version, deps, diskGeneration: this.diskGeneration, analysis });
    return analysis;
  }

  /** Analyses `doc` with some files replaced (to try out a fix); not cached. */
  run(doc: TextDocument, overrides?: Map<string, string>): Analysis {
    const p = uriToPath(doc.uri, this.docs.roots);
    const text = overrides?.get(p) ?? doc.getText();
    // Per-document caches: an edit re-parses and re-sweeps only the blocks it touched.
    const caches = overrides ? undefined : this.cachesFor(doc.uri);
    return analyse({ path: p, text, root: this.docs.rootFor(p), host: this.docs.host(overrides), cache: caches?.sweeps, parseCache: caches?.pieces });
  }

  private readonly incremental = new Map<string, { sweeps: SweepCache; pieces: ParseCache }>();

  private cachesFor(uri: string): { sweeps: SweepCache; pieces: ParseCache } {
    let c = this.incremental.get(uri);
    if (!c) this.incremental.set(uri, (c = { sweeps: new SweepCache(), pieces: new ParseCache() }));
    return c;
  }

  /** The last analysis of a document, whatever its version (for finding dependants). */
  peek(uri: string): Analysis | undefined {
    return this.entries.get(uri)?.analysis;
  }

  drop(uri: string): void {
    this.entries.delete(uri);
    this.incremental.delete(uri);
  }

  private fresh(e: Entry): boolean {
    if (e.diskGeneration !== this.diskGeneration && [...e.deps.values()].some((v) => v === -1)) return false;
    for (const [p, v] of e.deps) if ((this.docs.byPath(p)?.version ?? -1) !== v) return false;
    return true;
  }
}
