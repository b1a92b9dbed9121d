// thermoscribe trim-boards FILE --channel NAME --readings CSV [--format text|csv|json|c] [--root DIR] [--progress]
// Production trim: every board's constants for the channel's generated `<channel>_set_trim()`, from
// a CSV of calibration readings (columns `board`, `temperature_c` or `temperature_k`, `code`; one
// row per reading, one or two readings per board as the spec's calibration takes), with each board's
// check (its corrected reading at its calibration points, its remaining worst-case error from the
// budget); boards outside what the design's tolerances allow are listed as suspect and not trimmed
// (codegen/board-trims.ts). Output: a text report (default), CSV, JSON or a C initialiser.
// Exit status by the one rule of cli/verb.ts: 1 also when any board is suspect.
import * as path from 'node:path';
import { boardTrims, cautionFor, conversionInput, parseBenchCsv, secondInputOf, trimsC, trimsCsv, trimsJson, trimNumber, type BoardReading, type TrimRun } from '../../engine';
import { DiskHost } from '../io';
import { defineVerb, ROOT_OPTION, shown, usageLine, type Outcome, type VerbSpec } from '../verb';
import { table } from '../text';
import { analyseOne } from './check';

export const TRIM_BOARDS: VerbSpec = {
  name: 'trim-boards',
  files: 'one',
  options: {
    channel: { kind: 'name', meta: 'NAME', required: true },
    readings: { kind: 'input', meta: 'READINGS.csv', required: true },
    format: { kind: 'choice', values: ['text', 'csv', 'json', 'c'] },
    root: ROOT_OPTION,
    progress: { kind: 'flag' },
  },
};
export const TRIM_BOARDS_USAGE = usageLine(TRIM_BOARDS);

/** At most this many readings are read from one file. */
const MAX_READINGS = 1_000_000;

export const runTrimBoards = defineVerb(TRIM_BOARDS, (args, io): Outcome => {
  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'string') return { unusable: a };
  const name = args.text('channel')!;
  const r = a.channels.find((x) => x.channel.name === name);
  if (!r) return { unusable: `no analysed channel named ${shown(name)}; channels: ${a.channels.map((x) => x.channel.name).join(', ') || '(none)'}` };
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length) return { diagnostics: a.diagnostics, unprinted: host, failed: `the spec has ${errors.length} error${errors.length === 1 ? '' : 's'}; fix them before trimming boards` };
  const c = r.channel;
  const second = secondInputOf(c);
  if (second) return { unusable: `channel ${shown(name)}: ${second}; trim-boards trims channels converted from their ADC code alone` };
  if (!c.calibration || c.calibration.mode === 'none') return { unusable: `channel ${shown(name)} states no calibration, so its generated code has no trims to set; add e.g. \`calibration = one point at 25 °C\`` };
  const budget = r.worstCaseBudget;
  if (!budget) return { failed: `channel ${shown(name)}: the error budget could not be worked out (see the diagnostics)`, diagnostics: a.diagnostics };
  const file = path.resolve(io.cwd, args.text('readings')!);
  const text = host.read(file);
  if (text === undefined) return { unusable: `cannot read ${shown(args.text('readings')!)}` };
  const parsed = parseBenchCsv(text, c.adc.bits + (c.oversamplingBits ?? 0), undefined, MAX_READINGS);
  const rel = path.relative(io.cwd, file) || file;
  for (const p of parsed.problems.filter((x) => !x.fatal)) io.err(`${rel}: warning: ${p.message}\n`);
  const fatal = parsed.problems.find((x) => x.fatal);
  if (fatal) return { unusable: `${rel}: ${fatal.message}` };
  if (parsed.points.some((p) => p.board === undefined)) return { unusable: `${rel}: every reading needs its board: add a board column` };
  const readings: BoardReading[] = parsed.points.map((p) => ({ board: p.board!, row: p.row, kelvin: p.kelvin, code: p.code }));
  const progress = args.flag('progress')
    ? (done: number, total: number) => {
        if (done === total || done % 500 === 0) io.err(`trim-boards: ${done}/${total} boards\n`);
      }
    : undefined;
  let run: TrimRun;
  try {
    run = boardTrims(c, conversionInput(r, a.path), budget, readings, progress);
  } catch (err) {
    return { failed: `channel ${shown(name)}: ${err instanceof Error ? err.message : String(err)}`, diagnostics: a.diagnostics };
  }
  const format = args.text('format');
  // The general caution and the sensor kind's own, as report, budget, compare and plot carry them.
  const caution = cautionFor([c]);
  if (format === 'csv') io.out(trimsCsv(run, caution));
  else if (format === 'json') io.out(trimsJson(run, name, caution));
  else if (format === 'c') io.out(trimsC(run, caution));
  else io.out(trimsText(run, name) + '\n' + caution + '\n');
  const suspect = run.trims.filter((t) => t.status === 'suspect').length;
  return { diagnostics: a.diagnostics, ...(suspect ? { failed: `${suspect} of ${run.trims.length} boards are suspect and were not trimmed` } : {}) };
});

function trimsText(run: TrimRun, channel: string): string {
  const two = run.mode === 'two-point';
  const rows = run.trims.map((t) => [
    t.board,
    t.status,
    String(t.offsetUnits),
    ...(two ? [String(t.gainQ14)] : []),
    t.points.map((p) => `${trimNumber(p.celsius, 4)} °C: ${p.code} -> ${Number.isFinite(p.untrimmedC) ? trimNumber(p.untrimmedC, 5) : '-'}${p.correctedC === null ? '' : ` -> ${trimNumber(p.correctedC, 5)}`}`).join('; '),
    t.worstAtPointsK === null ? '-' : trimNumber(t.worstAtPointsK, 3),
    trimNumber(t.remainingWorstK, 3),
  ]);
  const suspects = run.trims.filter((t) => t.status === 'suspect');
  return [
    `Board trims for ${channel} (${run.mode}; ${run.ident}_set_trim(offset in 1/${run.scale} °C${two ? ', gain * 2^14' : ''})):`,
    table(['board', 'status', 'offset', ...(two ? ['gain Q14'] : []), 'reading: code -> untrimmed °C -> trimmed °C', 'error at points K', 'worst case K'], rows),
    'worst case: the error budget\'s worst case over the range after this calibration, plus the conversion code\'s own error.',
    ...(suspects.length ? ['', `Suspect boards (${suspects.length}), not trimmed:`, ...suspects.map((t) => `  ${t.board}: ${t.reasons.join('; ')}`)] : []),
  ].join('\n');
}
