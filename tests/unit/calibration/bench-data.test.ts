// Bench data (`bench_data`, server/src/model/bench-data.ts): a channel's measured points from a CSV
// file. The fixtures are the invented probe of tests/fixtures/diagnostics/bench-data-*.tsense and
// their invented CSV files (bench/good.csv: made from the model with IS = 12 fA, one count of noise
// in a row and one unsettled reading at 5 °C, 7 counts low; bench/bad-rows.csv: rows with bad cells).
// Outside references: the CSV rows themselves (a code read at a known temperature must read back as
// that temperature through the fitted model), and that a junction's voltage falls as it warms (its
// temperature coefficient is negative, about -2 mV/K; Shockley's diode law, common practice), so a
// code below the others' trend is a warmer reading.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse, DocumentState, type Analysis } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { fitMeasured, fittedChannel, OUTLIER_RULE } from '../../../server/src/calibration/fit';
import { runBudget } from '../../../server/src/cli/commands/budget';
import { makeFrame } from '../../../server/src/budget/frame';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import { hover } from '../../../server/src/features/hover';
import { channelReport } from '../../../server/src/cli/commands/report';
import { parseBenchCsv } from '../../../server/src/model/bench-data';
import type { SourceHost } from '../../../server/src/model/workspace';
import type { JunctionDef } from '../../../server/src/sensors/junction/types';
import { ZERO_CELSIUS_K } from '../../../server/src/physics/constants';

const DIR = path.resolve(__dirname, '../../fixtures/diagnostics');
const SPEC = path.join(DIR, 'bench-data-file.quiet.tsense');
const specText = fs.readFileSync(SPEC, 'utf8');

function run(text = specText, host: SourceHost = new DiskHost(), root = DIR, state?: DocumentState): Analysis {
  return analyse({ path: SPEC, text, root, host, ...(state ? { state } : {}) });
}
const benchRows = (a: Analysis) => a.diagnostics.filter((d) => d.code.startsWith('bench-data')).map((d) => `${d.code}: ${d.message}`);

describe('bench data: the rows are the channel\'s measured points', () => {
  const a = run();
  const r = a.channels.find((c) => c.channel.name === 'probe')!;
  const c = r.channel;

  it('reads every row, with its row number and board', () => {
    expect(benchRows(a)).toEqual([]);
    expect(c.measured!.map((m) => [m.row, +(m.kelvin - ZERO_CELSIUS_K).toFixed(6), m.code, m.board])).toEqual([
      [3, -30, 2282, 'P1'], [4, -25, 2247, 'P1'], [5, -20, 2213, 'P1'], [6, -15, 2176, 'P1'], [7, -10, 2140, 'P1'],
      [8, -5, 2104, 'P1'], [9, 0, 2069, 'P1'], [10, 5, 2026, 'P1'], [11, 10, 1997, 'P1'],
    ]);
    expect(c.benchInfo).toMatchObject({ rows: 9, skipped: 0, otherBoards: 0, boards: ['P1'] });
  });

  it('flags the unsettled reading by the stated rule, with the right sign (before: the model temperature was mirrored)', () => {
    const fit = fitMeasured(c)!;
    expect(fit.outlier).toBe(7); // row 10
    const out = fit.points[7]!;
    // Code 2026 lies 7 counts below the others' trend: a junction reads lower codes when warmer, so
    // the model fitted to the other points puts it above 5 °C (about 1 K: 7 counts at 7.1 counts/K).
    expect(out.leaveOneOutK!).toBeGreaterThan(0.5);
    expect(out.leaveOneOutK!).toBeLessThan(1.5);
    // ... and that temperature is what the generated conversion (fitted without the outlier) reads for the code.
    const input = conversionInput(r, SPEC);
    expect(input.celsiusAtCode(2026)).toBeCloseTo(5 + out.leaveOneOutK!, 1);
    const msg = a.diagnostics.find((d) => d.code === 'calibration-outlier')!.message;
    expect(msg).toMatch(/bench data row 10, board P1/);
    expect(msg).toMatch(/reports 5\.9\d* °C for it \(0\.9\d* K off/);
  });

  it('every kept row reads back within the fit tolerance through the generated conversion', () => {
    const fit = fitMeasured(c)!;
    const input = conversionInput(r, SPEC);
    c.measured!.forEach((m, i) => {
      if (i === fit.outlier) return;
      expect(Math.abs(input.celsiusAtCode(m.code) - (m.kelvin - ZERO_CELSIUS_K))).toBeLessThan(fit.toleranceK);
    });
  });

  it('the error budget and the generated code use the one fitted model', () => {
    const used = fittedChannel(c).sensor as JunctionDef;
    const inBudget = makeFrame(c, 9).channel.sensor as JunctionDef;
    expect(inBudget.params.IS).toBe(used.params.IS);
    expect(inBudget.params.N).toBe(used.params.N);
    expect(used.params.IS).not.toBe((c.sensor as JunctionDef).params.IS);
    expect(conversionInput(r, SPEC).note).toMatch(/fitted to the 8 measured point/);
  });

  it('hover on the path shows each row\'s residual and the outlier rule', () => {
    const h = hover(a, specText.lastIndexOf('bench/good.csv') + 3)!;
    expect(h.markdown).toMatch(/\*\*bench\/good\.csv\*\*: 9 readings used of 9 rows; board P1/);
    expect(h.markdown).toMatch(/\| row 10, board P1 \| 5\.00 \| 2026 \| [0-9.]+ K \| 0\.956 K \| \*\*outlier\*\* \|/);
    expect(h.markdown).toMatch(/Outliers: a point is flagged when/);
  });

  it('report lists the residual table', () => {
    const text = channelReport(r);
    expect(text).toMatch(/Measured points \(bench data 'bench\/good\.csv': 9 rows, 0 left out\)/);
    expect(text).toMatch(/row 10, board P1 +5\.00 +2026 +[0-9.]+ +0\.956 +0\.500 +outlier/);
    expect(text.match(/^row \d+, board P1/gm)!.length).toBe(9);
    // The outlier rule is stated beside the table (issue 16: "flags outliers by a stated rule").
    expect(text).toContain(`  outliers: ${OUTLIER_RULE}.`);
  });

  it('budget lists the same residual table with the rule', async () => {
    let printed = '';
    let errors = '';
    const io = { out: (t: string) => void (printed += t), err: (t: string) => void (errors += t), cwd: DIR };
    const code = await runBudget([SPEC, '--channel', 'probe', '--runs', '200', '--root', DIR], io);
    expect(errors).not.toMatch(/error/);
    expect(code).toBe(0);
    expect(printed).toMatch(/row 10, board P1 +5\.00 +2026 +[0-9.]+ +0\.956 +0\.500 +outlier/);
    expect(printed).toContain(`  outliers: ${OUTLIER_RULE}.`);
  });

  it('never writes the file', () => {
    const file = path.join(DIR, 'bench/good.csv');
    const before = fs.statSync(file);
    const text = fs.readFileSync(file, 'utf8');
    run();
    expect(fs.readFileSync(file, 'utf8')).toBe(text);
    expect(fs.statSync(file).mtimeMs).toBe(before.mtimeMs);
  });
});

describe('bench data problems are diagnostics with their row and column, never a crash', () => {
  it('bad rows are left out, each named by row and column; the others are fitted', () => {
    const a = run(specText.replace('"bench/good.csv"', '"bench/bad-rows.csv"'));
    const where = benchRows(a).map((m) => m.match(/row (\d+), column (\d+)/)!.slice(1).join(':'));
    expect(where).toEqual(['2:3', '4:2', '5:1', '6:2', '7:2', '9:1']);
    const c = a.channels[0]!.channel;
    expect(c.measured!.map((m) => m.row)).toEqual([3, 8, 10, 11]);
    expect(c.benchInfo).toMatchObject({ rows: 9, skipped: 5 });
  });

  const mem = (files: Record<string, string>): SourceHost => ({ read: (p) => files[p] });
  const csv = (body: string) => mem({ [path.join(DIR, 'x.csv')]: body });
  const withX = specText.replace('"bench/good.csv"', '"x.csv"');
  const fileProblems = (host: SourceHost, text = withX) => run(text, host).diagnostics.filter((d) => d.code === 'bench-data-file').map((d) => d.message);

  it('a file that is not CSV, has no code column, no rows, or only other boards', () => {
    expect(fileProblems(csv('temperature_c,code\n25,"2000\n'))).toEqual([expect.stringMatching(/not readable as CSV \(at row 2\)/)]);
    expect(fileProblems(csv('temperature_c,counts\n25,2000\n'))).toEqual([expect.stringMatching(/names no code column/)]);
    expect(fileProblems(csv('temperature_c,code\n'))).toEqual([expect.stringMatching(/a header but no readings/)]);
    expect(fileProblems(csv(''))).toEqual([expect.stringMatching(/no header row/)]);
    expect(fileProblems(csv('temperature_c,code,board\n-10,2140,P1\n'), withX.replace('"x.csv"', '"x.csv" board P2'))).toEqual([expect.stringMatching(/no row is of board 'P2'/)]);
    expect(fileProblems(csv('temperature_c,code\n-10,2140\n'), withX.replace('"x.csv"', '"x.csv" board P2'))).toEqual([expect.stringMatching(/no board column/)]);
  });

  it('more readings than are fitted is an error, not a silent cut', () => {
    const rows = Array.from({ length: 201 }, (_, i) => `${-30 + i * 0.2},${2282 - Math.round(i * 1.4)}`).join('\n');
    expect(fileProblems(csv(`temperature_c,code\n${rows}\n`))).toEqual([expect.stringMatching(/201 readings; at most 200 are fitted/)]);
  });

  it('a board filter keeps that board\'s rows; kelvin columns are read as kelvin', () => {
    const host = csv('temperature_k,code,board\n243.15,2282,A\n263.15,2140,B\n283.15,1997,A\n');
    const a = run(withX.replace('"x.csv"', '"x.csv" board A'), host);
    const c = a.channels[0]!.channel;
    expect(c.measured!.map((m) => [m.row, m.kelvin, m.board])).toEqual([[2, 243.15, 'A'], [4, 283.15, 'A']]);
    expect(c.benchInfo).toMatchObject({ otherBoards: 1 });
  });

  it('a path out of the workspace root, or through a link out of it, is refused like `use`', () => {
    expect(fileProblems(new DiskHost(), specText.replace('"bench/good.csv"', '"../outside.csv"'))).toEqual([expect.stringMatching(/leaves the workspace root \(the folder 'diagnostics'\)/)]);
    const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'bench-'));
    try {
      const ws = path.join(tmp, 'ws');
      fs.mkdirSync(ws);
      fs.writeFileSync(path.join(tmp, 'secret.csv'), 'temperature_c,code\n-10,2140\n');
      fs.symlinkSync(path.join(tmp, 'secret.csv'), path.join(ws, 'link.csv'));
      const spec = path.join(ws, 'probe.tsense');
      const a = analyse({ path: spec, text: specText.replace('"bench/good.csv"', '"link.csv"'), root: ws, host: new DiskHost() });
      expect(a.diagnostics.filter((d) => d.code === 'bench-data-file').map((d) => d.message)).toEqual([expect.stringMatching(/through a symbolic link out of the workspace root/)]);
      expect(a.channels[0]!.channel.measured).toBeUndefined();
    } finally {
      fs.rmSync(tmp, { recursive: true, force: true });
    }
  });

  it('a field that is not a path is a bad value', () => {
    const a = run(specText.replace('"bench/good.csv"', '25 °C'));
    expect(a.diagnostics.filter((d) => d.code === 'bad-value').map((d) => d.message)).toEqual([expect.stringMatching(/^bench_data: takes a CSV file path/)]);
  });

  it('hostile cells: control characters are escaped in messages; huge numbers and odd quoting do not crash', () => {
    const p = parseBenchCsv('temperature_c,code\n\u001b[31m,2000\n1e400,2000\n-10,1e400\n"-10",2140\n', 12);
    expect(p.problems.map((x) => x.message).join('\n')).not.toMatch(/\u001b/);
    expect(p.points.map((x) => x.row)).toEqual([5]);
    expect(p.problems.filter((x) => !x.fatal)).toHaveLength(3);
  });
});

describe('bench data is read again when the file changes and the spec does not', () => {
  it('a new file text gives new points through the same document state', () => {
    const file = path.join(DIR, 'x.csv');
    const files: Record<string, string> = { [file]: 'temperature_c,code\n-20,2213\n0,2069\n' };
    const host: SourceHost = { read: (p) => files[p] };
    const state = new DocumentState();
    const text = specText.replace('"bench/good.csv"', '"x.csv"');
    const first = run(text, host, DIR, state).channels[0]!.channel;
    expect(first.measured!.map((m) => m.code)).toEqual([2213, 2069]);
    expect(run(text, host, DIR, state).channels[0]!.channel).toBe(first); // unchanged: the same object
    files[file] = 'temperature_c,code\n-20,2213\n0,2069\n10,1997\n';
    const second = run(text, host, DIR, state).channels[0]!.channel;
    expect(second.measured!.map((m) => m.code)).toEqual([2213, 2069, 1997]);
  });
});
