// thermoscribe compare FILE [--format text|json] [--group NAME] [--root DIR]: alternative channel
// designs of one measurement side by side (channels sharing a `compare_group`; all channels when
// the file names none).
import { parseArgs } from '../args';
import { DiskHost, EXIT, type CliIO } from '../io';
import { formatDiagnostic, table } from '../text';
import { analyseOne } from './check';
import { compareGroups, type CompareGroup } from '../../compare/compare';
import { COMPARE_EXPLAIN, COMPARE_HEADERS, compareCells } from '../../compare/cells';
import { CAUTION } from '../../report/caution';
import { VERSION } from '../version';

export const COMPARE_USAGE = 'thermoscribe compare FILE [--format text|json] [--group NAME] [--root DIR]';

export function runCompare(argv: string[], io: CliIO): number {
  const args = parseArgs(argv, ['format', 'group', 'root']);
  if (typeof args === 'string' || args.positional.length !== 1) {
    io.err(`thermoscribe compare: ${typeof args === 'string' ? args : 'name exactly one .tsense file'}\nusage: ${COMPARE_USAGE}\n`);
    return EXIT.unusable;
  }
  const format = (args.options.get('format') ?? 'text') as string;
  if (format !== 'text' && format !== 'json') {
    io.err(`thermoscribe compare: --format takes text or json (got '${format}')\nusage: ${COMPARE_USAGE}\n`);
    return EXIT.unusable;
  }
  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'number') return a;
  let groups = compareGroups(a);
  const only = args.options.get('group');
  if (typeof only === 'string') {
    groups = groups.filter((g) => g.name === only);
    if (groups.length === 0) {
      io.err(`thermoscribe compare: no group named '${only}'; groups: ${compareGroups(a).map((g) => g.name).join(', ') || '(none)'}\n`);
      return EXIT.unusable;
    }
  }
  if (a.channels.length === 0) {
    io.err('thermoscribe compare: no channel could be analysed; run `thermoscribe check` for the reasons\n');
    return EXIT.errors;
  }
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  if (format === 'json') {
    io.out(JSON.stringify({ version: 1, tool: { name: 'thermoscribe', version: VERSION }, path: a.path, units: 'K for errors and self-heating, °C per count for resolution, bytes for code', groups, caution: CAUTION }, null, 2) + '\n');
  } else {
    for (const g of groups) io.out(groupText(g) + '\n\n');
    io.out(COMPARE_EXPLAIN.join('\n') + '\n');
    if (errors.length) {
      io.out('\nErrors in the spec (channels with errors may be missing above):\n');
      for (const d of errors) io.out('  ' + formatDiagnostic(d, host.index(d.file), io.cwd) + '\n');
    }
    io.out('\n' + CAUTION + '\n');
  }
  return errors.length ? EXIT.errors : EXIT.clean;
}

export function groupText(g: CompareGroup): string {
  const rows = g.rows.map(compareCells);
  const notes = g.rows.flatMap((r) => r.notes.map((n) => `  ${r.channel}: ${n}`));
  return [`Measurement '${g.name}': ${g.rows.length} candidate${g.rows.length === 1 ? '' : 's'}`, '',
    table([...COMPARE_HEADERS], rows), '', 'Notes:', ...notes].join('\n');
}
