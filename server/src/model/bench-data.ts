// Bench data: a channel's measured points read from a CSV file logged on the bench (`bench_data`),
// one row per reading: the reference temperature and the ADC code, optionally the board and the time.
// The file is read through the same injected SourceHost as `use` (so the CLI and the language server
// both read it), confined to the workspace root the same way, and parsed with csv-parse. Bad rows
// are diagnostics naming their row and column and are left out; the file is never written.
// The rows join the channel's `measured` points, so the fit (calibration/fit.ts), the error budget
// and the generated code all see them through the one fitted model.
import * as path from 'node:path';
import { parse as parseCsv } from 'csv-parse/sync';
import type { ChannelDef, MeasuredPoint } from './types';
import { isInside, type SourceHost } from './workspace';
import { measuredCodeProblem } from './read-budget-spec';
import type { DiagnosticSink } from '../diagnostics/diagnostic';
import { shown } from '../diagnostics/shown';
import { ZERO_CELSIUS_K } from '../physics/constants';

/** At most this many rows are fitted (each point's leave-one-out refit makes the fit grow as n²). */
export const BENCH_MAX_POINTS = 200;
/** Files beyond this size are refused before parsing (a bench log of readings is far smaller). */
export const BENCH_MAX_BYTES = 2_000_000;

interface Problem {
  /** File-wide (the file cannot be used) or one row's. */
  fatal: boolean;
  message: string;
}

export interface Parsed {
  points: { row: number; kelvin: number; code: number; board?: string }[];
  problems: Problem[];
  rows: number;
  skipped: number;
  otherBoards: number;
}

type Column = 'temperature' | 'code' | 'board' | 'time';
/** Header names (case and surrounding space ignored) and the column each means; temperatures in °C unless the header says K. */
const HEADERS: Record<string, { column: Column; kelvin?: boolean }> = {
  temperature: { column: 'temperature' },
  temperature_c: { column: 'temperature' },
  temperature_k: { column: 'temperature', kelvin: true },
  code: { column: 'code' },
  board: { column: 'board' },
  time: { column: 'time' },
};
const HEADER_WORDS = Object.keys(HEADERS).join(', ');

/** A decimal number as a CSV cell holds it (no units, no thousands separators). */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * The rows of a bench CSV as points, and its problems; never throws. `bits`: the channel's converter;
 * `board`: keep that board's rows; `maxPoints`: more usable rows than this is a file problem.
 */
export function parseBenchCsv(text: string, bits: number, board?: string, maxPoints = BENCH_MAX_POINTS): Parsed {
  const out: Parsed = { points: [], problems: [], rows: 0, skipped: 0, otherBoards: 0 };
  const fatal = (message: string) => out.problems.push({ fatal: true, message });
  const rowProblem = (message: string) => {
    out.problems.push({ fatal: false, message });
    out.skipped++;
  };
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parseCsv(text, { bom: true, skip_empty_lines: true, relax_column_count: true, trim: true, comment: '#', info: true }) as unknown as typeof records;
  } catch (err) {
    const e = err as { lines?: number; message?: string };
    fatal(`the file is not readable as CSV${e.lines ? ` (at row ${e.lines})` : ''}: ${shown(String(e.message ?? err), 160)}`);
    return out;
  }
  // A record's row is the line it starts on (a quoted cell may hold line breaks).
  const rowOf = (r: { record: string[]; info: { lines: number } }) => r.info.lines - r.record.reduce((n, cell) => n + (cell.match(/\n/g)?.length ?? 0), 0);
  const head = records[0];
  if (!head) {
    fatal(`the file has no header row; the first row names the columns (${HEADER_WORDS})`);
    return out;
  }
  const columns = new Map<Column, { index: number; kelvin: boolean }>();
  head.record.forEach((name, index) => {
    const h = HEADERS[name.toLowerCase()];
    if (!h) {
      out.problems.push({ fatal: false, message: `row ${rowOf(head)}, column ${index + 1}: the column '${shown(name)}' is not one this reads (${HEADER_WORDS}); it is ignored` });
      return;
    }
    if (columns.has(h.column)) {
      fatal(`row ${rowOf(head)}, column ${index + 1}: a second ${h.column} column ('${shown(name)}')`);
      return;
    }
    columns.set(h.column, { index, kelvin: h.kelvin ?? false });
  });
  const temp = columns.get('temperature');
  const code = columns.get('code');
  if (!temp || !code) {
    fatal(`the header row names no ${!temp ? 'temperature' : 'code'} column; it must name the columns (${HEADER_WORDS}), e.g. \`temperature_c,code,board\``);
    return out;
  }
  const boardCol = columns.get('board');
  if (board !== undefined && !boardCol) {
    fatal(`the channel keeps the rows of board '${shown(board)}', but the file has no board column`);
    return out;
  }
  const full = 2 ** bits;
  for (const r of records.slice(1)) {
    out.rows++;
    const row = rowOf(r);
    const cell = (c: { index: number }) => r.record[c.index] ?? '';
    const where = (c: { index: number }, name: string) => `row ${row}, column ${c.index + 1} (${name})`;
    const b = boardCol ? cell(boardCol) : undefined;
    if (board !== undefined && b !== board) {
      out.otherBoards++;
      continue;
    }
    const tText = cell(temp);
    const cText = cell(code);
    if (tText === '') {
      rowProblem(`${where(temp, 'temperature')}: empty; the row is left out`);
      continue;
    }
    if (!NUMBER.test(tText)) {
      rowProblem(`${where(temp, 'temperature')}: '${shown(tText)}' is not a number (write ${temp.kelvin ? 'kelvin' : '°C'} as a plain number such as 25.0); the row is left out`);
      continue;
    }
    const kelvin = temp.kelvin ? Number(tText) : Number(tText) + ZERO_CELSIUS_K;
    if (!(kelvin > 0) || !Number.isFinite(kelvin)) {
      rowProblem(`${where(temp, 'temperature')}: ${shown(tText)} ${temp.kelvin ? 'K' : '°C'} is ${Number.isFinite(kelvin) ? 'not above absolute zero' : 'too large to be a temperature'}; the row is left out`);
      continue;
    }
    if (cText === '' || !NUMBER.test(cText)) {
      rowProblem(`${where(code, 'code')}: ${cText === '' ? 'empty' : `'${shown(cText)}' is not a number`} (a code is a whole number of counts, 1 to ${full - 2}); the row is left out`);
      continue;
    }
    const problem = measuredCodeProblem(Number(cText), cText, bits);
    if (problem) {
      rowProblem(`${where(code, 'code')}: ${problem}; the row is left out`);
      continue;
    }
    out.points.push({ row, kelvin, code: Number(cText), ...(b !== undefined && b !== '' ? { board: b } : {}) });
  }
  if (out.points.length === 0) {
    fatal(board !== undefined && out.otherBoards === out.rows ? `no row is of board '${shown(board)}'` : out.rows === 0 ? 'the file has a header but no readings' : 'no row could be used (see the other problems)');
  } else if (out.points.length > maxPoints) {
    fatal(`${out.points.length} readings; at most ${maxPoints} are fitted: keep one board's rows (\`board ID\` after the path) or thin the log`);
  }
  return out;
}

/** A parsed file kept by its text, so an unchanged file is parsed once however often it is read. */
const parsedByText = new Map<string, Parsed>();
const PARSED_KEEP = 16;

function parsedOf(text: string, bits: number, board: string | undefined): Parsed {
  const key = `${bits}\u0000${board ?? ''}\u0000${text}`;
  let p = parsedByText.get(key);
  if (!p) {
    p = parseBenchCsv(text, bits, board);
    if (parsedByText.size >= PARSED_KEEP) parsedByText.delete(parsedByText.keys().next().value!);
    parsedByText.set(key, p);
  }
  return p;
}

/** The absolute path a channel's `bench_data` names (relative to its spec file), or null when it names none. */
export function benchDataPath(c: ChannelDef): string | null {
  return c.benchData ? path.resolve(path.dirname(c.file), c.benchData.path) : null;
}

/** The last channel made from a definition and a file text: the same object again while neither changes. */
const attached = new WeakMap<ChannelDef, { text: string; channel: ChannelDef }>();

/**
 * The channel with its bench data's readings added to `measured` (after the spec's own points), and
 * `benchInfo` set; the channel itself when it names no file or the file cannot be used. Problems go
 * to `sink` against the path in the spec, each naming its row and column.
 */
export function attachBenchData(c: ChannelDef, root: string, host: SourceHost, sink: DiagnosticSink): ChannelDef {
  const ref = c.benchData;
  const target = benchDataPath(c);
  if (!ref || target === null) return c;
  const fileErr = (message: string) => sink.report('bench-data-file', c.file, ref.span, `bench_data '${shown(ref.path)}': ${message}`);
  const rootAbs = path.resolve(root);
  const rootName = shown(path.basename(rootAbs));
  if (!isInside(rootAbs, target)) {
    fileErr(`leaves the workspace root (the folder '${rootName}'); keep bench data inside it`);
    return c;
  }
  const real = (p: string) => host.realPath?.(p) ?? p;
  if (!isInside(real(rootAbs), real(target))) {
    fileErr(`leads through a symbolic link out of the workspace root (the folder '${rootName}'); keep bench data inside it`);
    return c;
  }
  const text = host.read(target);
  if (text === undefined) {
    fileErr(`cannot read it (looked for '${shown(path.relative(rootAbs, target) || target)}' in the folder '${rootName}')`);
    return c;
  }
  if (text.length > BENCH_MAX_BYTES) {
    fileErr(`the file has ${text.length} characters; at most ${BENCH_MAX_BYTES} are read`);
    return c;
  }
  const parsed = parsedOf(text, c.adc.bits, ref.board);
  for (const p of parsed.problems) {
    if (p.fatal) fileErr(p.message);
    else sink.report('bench-data-row', c.file, ref.span, `bench_data '${shown(ref.path)}': ${p.message}`);
  }
  if (parsed.problems.some((p) => p.fatal)) return c;
  const kept = attached.get(c);
  if (kept && kept.text === text) return kept.channel;
  const points: MeasuredPoint[] = parsed.points.map((p) => ({ kelvin: p.kelvin, code: p.code, span: ref.span, row: p.row, ...(p.board !== undefined ? { board: p.board } : {}) }));
  const boards = [...new Set(parsed.points.map((p) => p.board).filter((b): b is string => b !== undefined))];
  const channel: ChannelDef = {
    ...c,
    measured: [...(c.measured ?? []), ...points],
    benchInfo: { file: target, rows: parsed.rows, skipped: parsed.skipped, otherBoards: parsed.otherBoards, boards },
  };
  attached.set(c, { text, channel });
  return channel;
}
