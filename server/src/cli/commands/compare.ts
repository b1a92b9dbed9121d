// thermoscribe compare FILE [--format text|json] [--group NAME] [--root DIR]: alternative channel
// designs of one measurement side by side (channels sharing a `compare_group`; all channels when
// the file names none).
import { DiskHost } from '../io';
import { defineVerb, ROOT_OPTION, shown, usageLine, type VerbSpec } from '../verb';
import { formatDiagnostic, table } from '../text';
import { analyseOne } from './check';
import { compareGroups, type CompareGroup } from '../../engine';
import { COMPARE_EXPLAIN, COMPARE_HEADERS, compareCells } from '../../engine';
import { cautionFor, cautionParagraphFor } from '../../engine';
import { VERSION } from '../version';

export const COMPARE: VerbSpec = { name: 'compare', files: 'one', options: { format: { kind: 'choice', values: ['text', 'json'] }, group: { kind: 'name', meta: 'NAME' }, root: ROOT_OPTION } };
export const COMPARE_USAGE = usageLine(COMPARE);

export const runCompare = defineVerb(COMPARE, (args, io) => {
  const format = args.text('format');
  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'string') return { unusable: a };
  let groups = compareGroups(a);
  const only = args.text('group');
  if (only !== undefined) {
    groups = groups.filter((g) => g.name === only);
    if (groups.length === 0) return { unusable: `no group named ${shown(only)}; groups: ${compareGroups(a).map((g) => g.name).join(', ') || '(none)'}` };
  }
  const unprinted = { index: (f: string) => host.index(f) };
  if (a.channels.length === 0) return { diagnostics: a.diagnostics, unprinted, failed: 'no channel could be analysed; run `thermoscribe check` for the reasons' };
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  if (format === 'json') {
    io.out(JSON.stringify({ version: 1, tool: { name: 'thermoscribe', version: VERSION }, path: a.path, units: 'K for errors and self-heating, °C per count for resolution, bytes for code', groups, caution: cautionParagraphFor(a.channels.map((r) => r.channel)) }, null, 2) + '\n');
    return { diagnostics: a.diagnostics, unprinted };
  }
  for (const g of groups) io.out(groupText(g) + '\n\n');
  io.out(COMPARE_EXPLAIN.join('\n') + '\n');
  if (errors.length) {
    io.out('\nErrors in the spec (channels with errors may be missing above):\n');
    for (const d of errors) io.out('  ' + formatDiagnostic(d, host.index(d.file), io.cwd) + '\n');
  }
  io.out('\n' + cautionFor(a.channels.map((r) => r.channel)) + '\n');
  return { diagnostics: a.diagnostics };
});

export function groupText(g: CompareGroup): string {
  const rows = g.rows.map(compareCells);
  const notes = g.rows.flatMap((r) => r.notes.map((n) => `  ${r.channel}: ${n}`));
  return [`Measurement '${g.name}': ${g.rows.length} candidate${g.rows.length === 1 ? '' : 's'}`, '',
    table([...COMPARE_HEADERS], rows), '', 'Notes:', ...notes].join('\n');
}
