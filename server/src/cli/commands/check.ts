// thermoscribe check FILE... [--format text|json|sarif] [--root DIR] [--code FILE.c]
// Also compares the generated conversion code with each spec: the `<stem>_conversion.c` beside it,
// or the file named with --code (generated-stale, generated-orphan).
// Exit 0 when clean, 1 when any error-severity diagnostic, 2 when an input is unusable.
import * as path from 'node:path';
import { analyse, type Analysis } from '../../engine';
import { conversionFilePath } from '../../codegen/channel-input';
import { staleDiagnostics } from '../../codegen/stale';
import type { Diagnostic } from '../../checks/diagnostic';
import { analysisJson, diagnosticJson, REPORT_VERSION } from '../../report/json';
import { sarifLog } from '../../report/sarif';
import { parseArgs, type ParsedArgs } from '../args';
import { DiskHost, EXIT, type CliIO } from '../io';
import { formatDiagnostic } from '../text';
import { VERSION } from '../version';

export const CHECK_USAGE = 'thermoscribe check FILE... [--format text|json|sarif] [--root DIR] [--code FILE.c]';

export function loadAnalyses(files: string[], rootOpt: string | undefined, io: CliIO, host: DiskHost): Analysis[] | string {
  const out: Analysis[] = [];
  for (const f of files) {
    const abs = path.resolve(io.cwd, f);
    const text = host.read(abs);
    if (text === undefined) return `cannot read '${f}' (no such file, or not a readable file)`;
    const root = rootOpt !== undefined ? path.resolve(io.cwd, rootOpt) : path.dirname(abs);
    out.push(analyse({ path: abs, text, root, host }));
  }
  return out;
}

/**
 * The one spec file a verb works on, analysed; or the exit status after saying why it cannot be
 * (unreadable file). Reads --root.
 */
export function analyseOne(args: ParsedArgs, io: CliIO, host: DiskHost): Analysis | number {
  const root = args.options.get('root');
  const analyses = loadAnalyses(args.positional, typeof root === 'string' ? root : undefined, io, host);
  if (typeof analyses === 'string') {
    io.err(`thermoscribe: ${analyses}\n`);
    return EXIT.unusable;
  }
  return analyses[0]!;
}

export function runCheck(argv: string[], io: CliIO): number {
  const args = parseArgs(argv, ['format', 'root', 'code']);
  if (typeof args === 'string') return usage(io, args);
  const format = (args.options.get('format') ?? 'text') as string;
  if (!['text', 'json', 'sarif'].includes(format)) return usage(io, `--format takes text, json or sarif (got '${format}')`);
  if (args.positional.length === 0) return usage(io, 'name at least one .tsense file');
  const host = new DiskHost();
  const root = args.options.get('root');
  const analyses = loadAnalyses(args.positional, typeof root === 'string' ? root : undefined, io, host);
  if (typeof analyses === 'string') {
    io.err(`thermoscribe: ${analyses}\n`);
    return EXIT.unusable;
  }
  const code = args.options.get('code');
  if (code === true) return usage(io, 'option --code needs a value');
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
  return all.some((d) => d.severity === 'error') ? EXIT.errors : EXIT.clean;
}

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

function usage(io: CliIO, problem: string): number {
  io.err(`thermoscribe check: ${problem}\nusage: ${CHECK_USAGE}\n`);
  return EXIT.unusable;
}
