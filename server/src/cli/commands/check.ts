// thermoscribe check FILE... [--format text|json|sarif] [--root DIR] [--code FILE.c]
// Also compares the generated conversion code with each spec: the `<stem>_conversion.c` beside it,
// or the file named with --code (generated-stale, generated-orphan).
// Exit status: the one rule of cli/verb.ts.
import * as path from 'node:path';
import { analyse, type Analysis } from '../../engine';
import { conversionFilePath } from '../../engine';
import { staleDiagnostics } from '../../engine';
import type { Diagnostic } from '../../engine';
import { analysisJson, diagnosticJson, REPORT_VERSION } from '../../engine';
import { sarifLog } from '../../engine';
import { DiskHost, type CliIO } from '../io';
import { defineVerb, ROOT_OPTION, shown, usageLine, type VerbArgs, type VerbSpec } from '../verb';
import { formatDiagnostic } from '../text';
import { VERSION } from '../version';

export const CHECK: VerbSpec = { name: 'check', files: 'many', options: { format: { kind: 'choice', values: ['text', 'json', 'sarif'] }, root: ROOT_OPTION, code: { kind: 'name', meta: 'FILE.c' } } };
export const CHECK_USAGE = usageLine(CHECK);

export function loadAnalyses(files: string[], rootOpt: string | undefined, io: CliIO, host: DiskHost): Analysis[] | string {
  const out: Analysis[] = [];
  for (const f of files) {
    const abs = path.resolve(io.cwd, f);
    const text = host.read(abs);
    if (text === undefined) return `cannot read ${shown(f)} (no such file, or not a readable file)`;
    const root = rootOpt !== undefined ? path.resolve(io.cwd, rootOpt) : path.dirname(abs);
    out.push(analyse({ path: abs, text, root, host }));
  }
  return out;
}

/** The one spec file a verb works on, analysed (with --root); or why it cannot be read. */
export function analyseOne(args: VerbArgs, io: CliIO, host: DiskHost): Analysis | string {
  const analyses = loadAnalyses(args.files, args.text('root'), io, host);
  return typeof analyses === 'string' ? analyses : analyses[0]!;
}

export const runCheck = defineVerb(CHECK, (args, io) => {
  const format = args.text('format');
  const host = new DiskHost();
  const analyses = loadAnalyses(args.files, args.text('root'), io, host);
  if (typeof analyses === 'string') return { unusable: analyses };
  const code = args.text('code');
  const codeFiles = (a: Analysis) => (code !== undefined ? [path.resolve(io.cwd, code)] : [conversionFilePath(a.path)]);
  // One --code file for several specs: a block of another spec is not an orphan, so orphans are
  // looked for only when each spec has its own file.
  const shared = code !== undefined && analyses.length > 1;
  const generated = analyses.flatMap((a) => staleDiagnostics(shared ? { path: a.path, channels: a.channels } : a, (f) => host.read(f), codeFiles(a)));
  const all = uniqueDiagnostics(analyses, generated);
  const indexOf = (file: string) => host.index(file);
  if (format === 'json') {
    io.out(JSON.stringify({ version: REPORT_VERSION, tool: { name: 'thermoscribe', version: VERSION }, analyses: analyses.map((a) => analysisJson(a, indexOf)), diagnostics: all.map((d) => diagnosticJson(d, indexOf(d.file))) }, null, 2) + '\n');
  } else if (format === 'sarif') {
    io.out(JSON.stringify(sarifLog(all, indexOf, VERSION), null, 2) + '\n');
  } else {
    for (const d of all) io.out(formatDiagnostic(d, indexOf(d.file), io.cwd) + '\n');
    const errors = all.filter((d) => d.severity === 'error').length;
    const warnings = all.filter((d) => d.severity === 'warning').length;
    const channels = analyses.reduce((n, a) => n + a.channels.length, 0);
    io.out(`${analyses.length} file${analyses.length === 1 ? '' : 's'}, ${channels} channel${channels === 1 ? '' : 's'} analysed: ${errors} error${errors === 1 ? '' : 's'}, ${warnings} warning${warnings === 1 ? '' : 's'}\n`);
  }
  return { diagnostics: all };
});

/** A used file checked from two entry files reports its problems once. */
function uniqueDiagnostics(analyses: Analysis[], extra: Diagnostic[] = []) {
  const seen = new Set<string>();
  return [...analyses.flatMap((a) => a.diagnostics), ...extra].filter((d) => {
    const key = `${d.file}:${d.span.start}:${d.span.end}:${d.code}:${d.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}
