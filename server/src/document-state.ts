// One document's incremental state: everything kept between analyses of one document, in one
// place, with one rule for dropping it.
//
// Invalidation rule: every entry is keyed by what it was derived from (a piece of the document's
// text, or a channel's inputs with where they were written aside), so an entry is never stale,
// only unused. Each analysis keeps exactly what it used and drops the rest; closing the document
// drops the whole state. So the state never holds more than the latest version needs, and no cache
// grows for the life of the process. A trial analysis (a quick fix tried out) reads the state and
// changes nothing.
//
// What it holds: the parsed pieces of the document and of the files it uses (syntax/parse.ts
// ParseCache), the definitions read from those pieces (model/resolve.ts, by piece), and per channel
// content its sweep, worst-case budget, Monte Carlo budget (on first use) and checks' diagnostics.
import type { ChannelResult } from './analysis/types';
import { channelKey } from './analysis/cache';
import type { BudgetResult } from './analysis/budget-types';
import type { Diagnostic } from './diagnostics/diagnostic';
import type { ChannelDef } from './model/types';
import { contentToken } from './model/moved';
import { ParseCache } from './syntax/parse';
import type { KeptDefinitions } from './model/resolve';

/** What was derived from one channel content (the same for a channel that only moved). */
export interface ChannelDerived {
  /** channelKey of the content. */
  key: string;
  table: ChannelResult['table'];
  summary: ChannelResult['summary'];
  /** The worst case alone, when an analysis with the error budget asked for it. */
  worstCaseBudget?: BudgetResult;
  /** The Monte Carlo budget once read (`value` undefined when it could not be computed). */
  budget?: { value: BudgetResult | undefined };
  /** The checks' diagnostics of this very definition object (a moved one has other offsets). */
  checked?: { channel: ChannelDef; withBudget: boolean; diagnostics: Diagnostic[] };
}

export class DocumentState {
  /** Parsed pieces of the document and of the files it uses. */
  readonly pieces = new ParseCache();
  /** Definitions read from a piece of text, by the piece's first parse (model/resolve.ts). Weak: a piece the parse cache dropped takes its definitions with it. */
  readonly definitions: KeptDefinitions = new WeakMap();
  private byToken = new Map<object, ChannelDerived>();
  private byKey = new Map<string, ChannelDerived>();
  /** What the analysis under way has used (becomes the whole state at `end`). */
  private usedToken: Map<object, ChannelDerived> | null = null;
  private usedKey: Map<string, ChannelDerived> | null = null;

  /** An analysis starts: what it uses from here on is kept. */
  begin(): void {
    this.usedToken = new Map();
    this.usedKey = new Map();
  }

  /** The analysis ended: everything it did not use is dropped (files no longer used included). */
  end(usedFiles: readonly string[]): void {
    if (this.usedToken && this.usedKey) {
      this.byToken = this.usedToken;
      this.byKey = this.usedKey;
    }
    this.usedToken = this.usedKey = null;
    this.pieces.retainUsedFiles(usedFiles);
  }

  /** What was derived from this channel's content, if kept; marks it used. `record` false: a trial, change nothing. */
  find(c: ChannelDef, record: boolean): ChannelDerived | undefined {
    const token = contentToken(c);
    let d = this.byToken.get(token) ?? this.usedToken?.get(token);
    if (!d) {
      const key = channelKey(c);
      d = this.byKey.get(key) ?? this.usedKey?.get(key);
    }
    if (d && record) this.use(token, d);
    return d;
  }

  /** Keeps what was derived from this channel's content. */
  keep(c: ChannelDef, d: ChannelDerived): void {
    this.use(contentToken(c), d);
  }

  /** Entries kept now (for tests and the bench's memory figure). */
  get size(): number {
    return this.byKey.size;
  }

  private use(token: object, d: ChannelDerived): void {
    this.usedToken?.set(token, d);
    this.usedKey?.set(d.key, d);
  }
}
