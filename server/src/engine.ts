// The engine's façade: the whole API that the CLI and the language server call.
// Text in, syntax tree + model + per-channel results + diagnostics out. No IO, no editor types.
import * as path from 'node:path';
// Registers every sensor kind before anything reads the registry (sensors/kinds.ts).
import './sensors/kinds';
import { DiagnosticSink, type Diagnostic } from './diagnostics/diagnostic';
import { channelChecks } from './checks/index';
import { analyseChannel, channelResult } from './analysis/sweep';
import { channelBudget, liveBudget } from './budget/budget';
import { channelKey } from './analysis/cache';
import type { ChannelResult } from './analysis/types';
import type { ChannelDef } from './model/types';
import { loadWorkspace, reportSyntax, type LoadedFile, type SourceHost } from './model/workspace';
import { syntaxProblems } from './syntax/parse';
import { resolveModel } from './model/resolve';
import { attachBenchData, benchDataPath } from './model/bench-data';
import type { ChannelDerived, DocumentState } from './document-state';
import { shown } from './diagnostics/shown';

export type { Diagnostic } from './diagnostics/diagnostic';
export type { SourceHost, LoadedFile } from './model/workspace';
export type { SyntaxFile } from './syntax/ast';
export type { ChannelResult, SweepPoint, ChannelSummary } from './analysis/types';
export type { ChannelDef, SensorDef, AdcDef } from './model/types';
export { CATALOGUE, type DiagnosticCode, type Severity } from './diagnostics/catalogue';
export { LineIndex } from './syntax/line-index';
export { DocumentState } from './document-state';
export type { Analysis } from './analysis/result';
import type { Analysis } from './analysis/result';

export interface AnalyseInput {
  /** Absolute path of the spec (for an unsaved buffer, any absolute path in its folder). */
  path: string;
  text: string;
  /** Workspace root: `use` may not leave it. Defaults to the file's own folder. */
  root?: string;
  /** Reads files brought in with `use`. Defaults to a host that reads nothing. */
  host?: SourceHost;
  /**
   * What earlier analyses of the same document kept (optional; see document-state.ts for what it
   * holds and when it drops it). Without it every block is read and every channel swept afresh.
   */
  state?: DocumentState;
  /** Read `state` but change nothing in it (a quick fix tried out on other text). */
  trial?: boolean;
  /**
   * Compute each channel's worst-case error budget, which the accuracy check needs (default true).
   * Without it every other check runs and `accuracy-unmet` is not reported. A number n: the budgets
   * kept in `state` are used and at most n missing ones computed, of channels whose content the
   * state has not seen (a channel kept without a budget waits for the work already computing it);
   * the channels left without one are listed in `budgetsPending`, and their budget checks wait (the language server computes them
   * after its first publish, a few at a time: `keepWorstCaseBudget`, lsp/diagnostics.ts).
   */
  errorBudget?: boolean | number;
}


const NO_FILES: SourceHost = { read: () => undefined };

export function analyse(input: AnalyseInput): Analysis {
  const entry = path.resolve(input.path);
  const root = path.resolve(input.root ?? path.dirname(entry));
  const sink = new DiagnosticSink();
  // A trial reads kept channel results but neither parses into the state nor resolves from it.
  const own = input.trial ? undefined : input.state;
  own?.begin();
  const files = loadWorkspace(entry, input.text, root, input.host ?? NO_FILES, sink, own?.pieces);
  const model = resolveModel(files, sink, own?.definitions);
  // Bench data files are read here, through the same host as used files, on every analysis (a file
  // may change while the spec does not); an unchanged file gives the very same channel object.
  const host = input.host ?? NO_FILES;
  model.channels = model.channels.map((c) => attachBenchData(c, root, host, sink));
  const dataFiles = [...new Set(model.channels.map(benchDataPath).filter((p): p is string => p !== null))];
  const channels: ChannelResult[] = [];
  const budgets: BudgetAllowance = { left: typeof input.errorBudget === 'number' ? Math.max(0, input.errorBudget) : input.errorBudget === false ? 0 : Infinity, pending: [] };
  for (const c of model.channels) {
    try {
      channels.push(analyseOne(c, sink, input.state, !input.trial, input.errorBudget !== false, budgets));
    } catch (err) {
      // The resolver checks domains first; a physics guard firing here is still reported, not thrown.
      sink.report('out-of-domain', c.file, c.nameSpan, `channel '${c.name}' cannot be analysed: ${err instanceof Error ? err.message : String(err)}`);
    }
  }
  own?.end(files.slice(1).map((f) => f.path));
  reportUsedFileProblems(files, sink);
  const diagnostics = capPerFile(sink.items.sort((a, b) => (a.file === b.file ? a.span.start - b.span.start : a.file < b.file ? -1 : 1)));
  return { path: entry, files, model, channels, diagnostics, budgetsPending: budgets.pending, dataFiles };
}

/**
 * The syntax diagnostics of one file's text alone, as `analyse` reports them, from a parse that keeps
 * no field (syntax/parse.ts `syntaxProblems`, half the cost of a full parse): the language server
 * publishes these first when a large spec is opened, before its analysis.
 */
export function syntaxDiagnostics(file: string, text: string): Diagnostic[] {
  const sink = new DiagnosticSink();
  reportSyntax(path.resolve(file), syntaxProblems(text), sink);
  return capPerFile(sink.items.sort((a, b) => a.span.start - b.span.start));
}

/** How many missing worst-case budgets an analysis may still compute, and the channels left without one. */
interface BudgetAllowance {
  left: number;
  pending: ChannelResult[];
}

/**
 * Computes and keeps the worst-case budget of a channel an analysis left pending (`budgetsPending`),
 * where the next analysis with the same document state finds it. A budget that cannot be computed
 * is left missing: the next full analysis reports why.
 */
export function keepWorstCaseBudget(r: ChannelResult): void {
  const kept = HOLDER.get(r.table);
  if (!kept || kept.worstCaseBudget) return;
  try {
    kept.worstCaseBudget = kept.budget?.value ?? channelBudget(r.channel, { runs: 0 });
  } catch {
    // reported by the full analysis that follows
  }
}

/** At most this many diagnostics are listed for one file; one closing "and N more" stands for the rest. */
export const MAX_DIAGNOSTICS_PER_FILE = 200;

/**
 * The first MAX_DIAGNOSTICS_PER_FILE diagnostics of each file (already sorted by file and offset),
 * then one `more-problems` at the first one left off, as severe as the worst of those, so the exit
 * status and the editor's error count still see an error that was not listed.
 */
function capPerFile(sorted: Diagnostic[]): Diagnostic[] {
  if (sorted.length <= MAX_DIAGNOSTICS_PER_FILE) return sorted;
  const out: Diagnostic[] = [];
  const rank: Record<Diagnostic['severity'], number> = { info: 0, warning: 1, error: 2 };
  for (let i = 0; i < sorted.length; ) {
    const file = sorted[i]!.file;
    let j = i;
    while (j < sorted.length && sorted[j]!.file === file) j++;
    const n = j - i;
    if (n <= MAX_DIAGNOSTICS_PER_FILE) {
      for (let k = i; k < j; k++) out.push(sorted[k]!);
    } else {
      for (let k = i; k < i + MAX_DIAGNOSTICS_PER_FILE; k++) out.push(sorted[k]!);
      let worst: Diagnostic['severity'] = 'info';
      for (let k = i + MAX_DIAGNOSTICS_PER_FILE; k < j; k++) if (rank[sorted[k]!.severity] > rank[worst]) worst = sorted[k]!.severity;
      const first = sorted[i + MAX_DIAGNOSTICS_PER_FILE]!;
      const more = n - MAX_DIAGNOSTICS_PER_FILE;
      out.push({
        code: 'more-problems',
        severity: worst,
        file,
        span: first.span,
        message: `and ${more} more problem${more === 1 ? '' : 's'} in this file from here on (only the first ${MAX_DIAGNOSTICS_PER_FILE} of ${n} are listed); fix these and check again`,
      });
    }
    i = j;
  }
  return out;
}

/**
 * One channel: its sweep, worst-case budget and checks. With a document state, what was derived
 * from the same content before is taken from it (the same for a channel that only moved), and the
 * checks' diagnostics too when the definition is the very same object (a moved channel's have other
 * offsets, so its checks run again).
 */
function analyseOne(c: ChannelDef, sink: DiagnosticSink, state: DocumentState | undefined, record: boolean, wantBudget: boolean, budgets: BudgetAllowance): ChannelResult {
  let kept = state?.find(c, record);
  // Content no earlier analysis of the state has seen (the channel just edited): its missing budget
  // comes first; a channel kept without one is left to the work already computing it.
  const isNew = kept === undefined;
  const result: ChannelResult = kept ? channelResult(c, kept.table, kept.summary) : analyseChannel(c);
  if (!kept) {
    // The key is only needed to find the entry again (and a miss in `find` has already made it).
    kept = { key: state && record ? channelKey(c) : '', table: result.table, summary: result.summary };
    if (record) state?.keep(c, kept);
    HOLDER.set(kept.table, kept);
  }
  // A budget kept, or one the allowance still covers; else the channel's budget checks wait.
  const known = kept.worstCaseBudget ?? kept.budget?.value;
  const withBudget = wantBudget && (known !== undefined || budgets.left === Infinity || (isNew && budgets.left > 0));
  if (wantBudget && !withBudget) budgets.pending.push(result);
  if (withBudget && known === undefined) budgets.left--;
  if (withBudget) try {
    // A Monte Carlo budget already made holds the worst case too.
    kept.worstCaseBudget ??= kept.budget?.value ?? channelBudget(c, { runs: 0 });
    result.worstCaseBudget = kept.worstCaseBudget;
    // The Monte Carlo budget is computed on first use (hover, JSON, plots), not per keystroke.
    Object.defineProperty(result, 'budget', BUDGET);
  } catch (err) {
    // A tolerance corner outside the physics' domain: say so; the other checks still run.
    sink.report('out-of-domain', c.file, c.nameSpan, `channel '${c.name}': the error budget cannot be computed: ${err instanceof Error ? err.message : String(err)}`);
  }
  if (kept.checked?.channel === c && kept.checked.withBudget === withBudget) {
    sink.items.push(...kept.checked.diagnostics);
    return result;
  }
  const local = new DiagnosticSink();
  const reported = new Set<string>();
  for (const check of channelChecks(c)) check({ channel: c, result, sink: local, reported });
  sink.items.push(...local.items);
  if (record) kept.checked = { channel: c, withBudget, diagnostics: local.items };
  return result;
}

/**
 * What each sweep table was derived with (its document state's entry, or one of its own), where
 * `budget` keeps the Monte Carlo budget once made. A fact attached to the table, gone with it; one
 * entry per new table (every result of the same content shares the table), not one per result,
 * which would give the collector a weak entry to trace per channel and keystroke.
 */
const HOLDER = new WeakMap<ChannelResult['table'], ChannelDerived>();

/**
 * `budget` of every channel result: one getter for all (a closure per result gives each its own
 * hidden class, which V8 keeps until a full collection, and the result with it; see analysis/sweep.ts).
 */
const BUDGET = {
  enumerable: true,
  configurable: true,
  get(this: ChannelResult): ChannelResult['budget'] {
    const h = HOLDER.get(this.table)!;
    h.budget ??= { value: tryBudget(this.channel) };
    return h.budget.value;
  },
};

function tryBudget(c: ChannelDef): ChannelResult['budget'] {
  try {
    return liveBudget(c);
  } catch {
    return undefined;
  }
}

/** One diagnostic on each `use` line whose file (or a file it uses) has errors. */
function reportUsedFileProblems(files: LoadedFile[], sink: DiagnosticSink): void {
  const errorsIn = new Map<string, number>();
  for (const d of sink.items) if (d.severity === 'error') errorsIn.set(d.file, (errorsIn.get(d.file) ?? 0) + 1);
  if (errorsIn.size === 0) return;
  const byPath = new Map(files.map((f) => [f.path, f]));
  // The accepted `use` edges form no cycle (loadWorkspace refuses a use of a file still being
  // read), so the files with errors at or below each file are the union of its children's: one
  // bit per file with errors, filled children first. A worklist, not recursion, so a long chain
  // cannot overflow the stack; each file is done once, so 4,000 files cost 4,000 unions.
  const errorFiles = [...errorsIn.keys()].filter((f) => byPath.has(f));
  const bit = new Map(errorFiles.map((f, i) => [f, i]));
  const words = Math.ceil(errorFiles.length / 32) || 1;
  const below = new Map<string, Uint32Array>();
  for (const start of files) {
    if (below.has(start.path)) continue;
    const stack: { file: LoadedFile; next: number }[] = [{ file: start, next: 0 }];
    while (stack.length > 0) {
      const top = stack[stack.length - 1]!;
      const u = top.file.uses[top.next++];
      if (u) {
        const child = u.target ? byPath.get(u.target) : undefined;
        if (child && !below.has(child.path)) stack.push({ file: child, next: 0 });
        continue;
      }
      stack.pop();
      const set = new Uint32Array(words);
      const own = bit.get(top.file.path);
      if (own !== undefined) set[own >> 5]! |= 1 << (own & 31);
      for (const x of top.file.uses) {
        const c = x.target ? below.get(x.target) : undefined;
        if (c) for (let w = 0; w < words; w++) set[w]! |= c[w]!;
      }
      below.set(top.file.path, set);
    }
  }
  const countBelow = (file: string): number => {
    const set = below.get(file);
    let n = 0;
    if (set) for (let i = 0; i < errorFiles.length; i++) if (set[i >> 5]! & (1 << (i & 31))) n += errorsIn.get(errorFiles[i]!)!;
    return n;
  };
  for (const f of files) {
    for (const u of f.uses) {
      if (!u.target || !byPath.has(u.target)) continue;
      const n = countBelow(u.target);
      if (n > 0) sink.report('import-problems', f.path, u.node.path.span, `'${shown(u.node.path.text)}' has ${n} error${n === 1 ? '' : 's'} of its own`);
    }
  }
}

// The rest of the façade: what the CLI and the language server use of the layers below, so that
// they import nothing but this file (.dependency-cruiser.cjs, "front-ends-through-facade").
export { channelBudgetAsync } from './budget/budget';
export { describeSetting, SHARES_EXPLAINED } from './budget/describe';
export { budgetJson, budgetSummaryJson } from './budget/json';
export { type PairedDifference } from './budget/paired';
export { type BudgetResult } from './analysis/budget-types';
export { fitMeasured, OUTLIER_RULE, residualRows } from './calibration/fit';
export { escapeControls, shown } from './diagnostics/shown';
export { headerPathFor, generatableResults, conversionInput, secondInputOf } from './codegen/channel-input';
export { boardTrims, trimsC, trimsCsv, trimsJson, type BoardReading, type TrimRun } from './codegen/board-trims';
export { parseBenchCsv } from './model/bench-data';
export { symbolClash } from './codegen/clash';
export { prefixProblem } from './codegen/generate';
export { orphanBlocks, scanGeneratedBlocks, spliceGenerated } from './codegen/markers';
export { generateForSpec, splitChannels, conversionBlock } from './codegen/spec';
export { staleDiagnostics, specChannelNames } from './codegen/stale';
export { type GenerateResult, type SpliceBlock } from './codegen/types';
export { COMPARE_EXPLAIN, COMPARE_HEADERS, compareCells } from './compare/cells';
export { compareGroups, type CompareGroup, type CompareRow } from './compare/compare';
export { channelLenses } from './features/code-lens';
export { completion, type CompletionKind } from './features/completion';
export { foldingRanges } from './features/folding';
export { formatEdits } from './features/format';
export { conversionFilePath, generatableChannels, generateForChannel } from './features/generate-code';
export { hover } from './features/hover';
export { inlayHints } from './features/inlay';
export { blockAt } from './features/locate';
export { definition, loadNames, prepareRename, rename, workspaceOccurrences, type FileSpan, type NamedSpec } from './features/navigation';
export { quickFixes, type FixEdit } from './features/quickfix';
export { semanticTokens, TOKEN_MODIFIERS, TOKEN_TYPES } from './features/semantic-tokens';
export { documentSymbols, type OutlineSymbol, type SymbolKind } from './features/symbols';
export { fixedNumber, formatSI, trimNumber } from './model/read-value';
export { isInside } from './model/workspace';
export { plotData, plotProblem, plotBlockers, CHART_KINDS, type ChartKind, type PlotData } from './plot/data';
export { renderSvg } from './plot/render';
export { channelDynamics, dynamicsLine, filterWords } from './analysis/dynamics';
export { plotSpec } from './plot/spec';
export { CAUTION, CAUTION_PARAGRAPH, cautionFor, cautionParagraphFor, kindCautions } from './report/caution';
export { describeBias, describeSensor } from './report/describe';
export { analysisJson, diagnosticJson, REPORT_VERSION } from './report/json';
export { sarifLog } from './report/sarif';
export { describeFaults, sensorFaults } from './analysis/sensor-faults';
export { type Span } from './syntax/ast';
