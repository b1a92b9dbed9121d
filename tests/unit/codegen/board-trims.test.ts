// `thermoscribe trim-boards` (codegen/board-trims.ts, cli/commands/trim-boards.ts): boards invented by
// perturbing the design within its stated tolerances (the error budget's own board model,
// budget/frame.ts, seeded draws) give calibration readings; the verb computes their trims; the
// generated C, compiled with the host gcc and run with those trims through its `_set_trim()`,
// must read every board's calibration points within one count's worth of temperature of the
// reference. Outside reference: the reference temperatures the readings were taken at. A board
// whose code is far off (a wrong part, invented) must be listed as suspect, not trimmed.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyse, cautionFor } from '../../../server/src/engine';
import { ROOT } from '../../protocol/client';
import { DiskHost, type CliIO } from '../../../server/src/cli/io';
import { runTrimBoards } from '../../../server/src/cli/commands/trim-boards';
import { makeFrame, boardErrors } from '../../../server/src/budget/frame';
import { Xoshiro128 } from '../../../server/src/budget/prng';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import { generateC } from '../../../server/src/codegen';
import { ZERO_CELSIUS_K } from '../../../server/src/physics/constants';
import { WorkDir, hasTool, hostBuildRun } from '../../fixtures/codegen/toolchain';

const haveGcc = hasTool('gcc');

// An invented junction probe (as tests/fixtures/diagnostics/bench-data-*.tsense), calibrated on the line.
const SPEC = (calibration: string) => `# Invented probe for the production-trim test.
junction q {
  kind = npn
  IS   = 10 fA ± 40 %
  BF   = 200
}
adc a {
  bits      = 12
  reference = 1.2 V ± 0.5 %
  offset_error = ± 2 LSB
  gain_error   = ± 0.2 %
}
channel probe {
  sensor = q
  adc = a
  bias = current 20 uA ± 2 %
  range = -30 °C .. 10 °C
  calibration = ${calibration}
}
`;

interface Board { board: string; readings: { celsius: number; code: number }[] }

function capture(): CliIO & { stdout: string; stderr: string } {
  const io = { stdout: '', stderr: '', cwd: '', out(t: string) { io.stdout += t; }, err(t: string) { io.stderr += t; } };
  return io;
}

/** Boards of the design within its tolerances: the budget's board model with seeded draws in [-1, 1]. */
function inventBoards(specFile: string, text: string, count: number, seed: number): Board[] {
  const a = analyse({ path: specFile, text, root: path.dirname(specFile), host: new DiskHost() });
  const c = a.channels[0]!.channel;
  const f = makeFrame(c, 9);
  const rng = new Xoshiro128(seed);
  const cal = f.calIndex[0]!;
  const boards: Board[] = [];
  for (let b = 0; b < count; b++) {
    const u = f.board.map(() => (rng.nextUint32() / 2 ** 32) * 2 - 1);
    const codes = new Float64Array(f.evalK.length);
    boardErrors(f, u, undefined, codes);
    boards.push({ board: `B${String(b + 1).padStart(3, '0')}`, readings: cal.map((i) => ({ celsius: f.evalK[i]! - ZERO_CELSIUS_K, code: Math.min(f.full - 2, Math.max(1, Math.floor(codes[i]!))) })) });
  }
  return boards;
}

for (const calibration of ['one point at -10 °C', 'two points at -20 °C and 0 °C']) {
  describe.skipIf(!haveGcc)(`trim-boards, ${calibration}: the host-compiled C with each board's trims`, () => {
    const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'trim-boards-'));
    const specFile = path.join(tmp, 'probe.tsense');
    const text = SPEC(calibration);
    let boards: Board[] = [];
    let json: { mode: string; outputUnitsPerC: number; boards: { board: string; status: string; offsetUnits: number; gainQ14?: number; reasons: string[] }[] };
    let exit = -1;
    const printed: Record<string, number[]> = {};
    let countK: number[] = [];
    let dir: WorkDir;

    beforeAll(() => {
      fs.writeFileSync(specFile, text);
      boards = inventBoards(specFile, text, 40, 2026);
      // One invented bad board: its first reading 300 counts off (a wrong part or a bad joint).
      const bad: Board = { board: 'WRONG-PART', readings: boards[0]!.readings.map((r, i) => ({ ...r, code: i === 0 ? r.code - 100 : r.code })) };
      const rows = [...boards, bad].flatMap((b) => b.readings.map((r) => `${b.board},${r.celsius.toFixed(4)},${r.code}`));
      fs.writeFileSync(path.join(tmp, 'line.csv'), `# Invented readings of invented boards.\nboard,temperature_c,code\n${rows.join('\n')}\n`);
      const run = (format: string) => {
        const io = capture();
        io.cwd = tmp;
        const code = runTrimBoards([specFile, '--channel', 'probe', '--readings', 'line.csv', '--format', format, '--progress'], io) as number;
        return { code, io };
      };
      const j = run('json');
      exit = j.code;
      json = JSON.parse(j.io.stdout);
      expect(j.io.stderr).toMatch(/trim-boards: 41\/41 boards/);
      const cInit = run('c').io.stdout;
      // The generated conversion of the same channel, compiled with the initialiser and a main that
      // sets each board's trims and converts its calibration codes.
      const a = analyse({ path: specFile, text, root: tmp, host: new DiskHost() });
      const input = conversionInput(a.channels[0]!, specFile);
      const src = generateC([input], { fileStem: 'conv' });
      const hdr = generateC([input], { fileStem: 'conv', header: true });
      const two = calibration.startsWith('two');
      let main = '#include <stdio.h>\n#include <stdint.h>\n#include "conv.h"\n#include "trims.c"\nint main(void)\n{\n    unsigned i;\n';
      const codesOf = boards.map((b) => b.readings.map((r) => r.code));
      main += `    static const uint16_t codes[${boards.length}][${codesOf[0]!.length}] = {${codesOf.map((cs) => `{${cs.join(', ')}}`).join(', ')}};\n`;
      main += `    for (i = 0; i < probe_board_trim_count; i++) {\n        unsigned k;\n        probe_set_trim(probe_board_trims[i].offset_units${two ? ', probe_board_trims[i].gain_q14' : ''});\n`;
      main += `        for (k = 0; k < ${codesOf[0]!.length}u; k++) {\n            probe_temp_t v;\n            (void)probe_code_to_temp(codes[i][k], &v);\n            printf("%s %u %ld\\n", probe_board_trims[i].board, k, (long)v);\n        }\n    }\n    return 0;\n}\n`;
      dir = new WorkDir();
      dir.write('conv.c', src.text);
      dir.write('conv.h', hdr.text);
      dir.write('trims.c', cInit);
      dir.write('main.c', main);
      const out = hostBuildRun(dir, ['main.c', 'conv.c'], 'trims');
      for (const line of out.trim().split('\n')) {
        const [board, k, v] = line.split(' ');
        (printed[board!] ??= [])[Number(k)] = Number(v);
      }
      // One count's worth of temperature at each calibration point: the conversion's step there.
      const r = a.channels[0]!;
      countK = boards[0]!.readings.map((p) => {
        const code = r.sweep.reduce((best, s) => (Math.abs(s.celsius - p.celsius) < Math.abs(best.celsius - p.celsius) ? s : best)).code;
        return Math.abs(input.celsiusAtCode(code + 1) - input.celsiusAtCode(code));
      });
    }, 300_000); // compiles with gcc: generous on a shared machine
    afterAll(() => {
      dir?.dispose();
      fs.rmSync(tmp, { recursive: true, force: true });
    });

    it('trims every invented in-tolerance board and names the bad one suspect (exit 1)', () => {
      expect(json.mode).toBe(calibration.startsWith('two') ? 'two-point' : 'one-point');
      const suspect = json.boards.filter((b) => b.status === 'suspect');
      expect(suspect.map((b) => b.board)).toEqual(['WRONG-PART']);
      expect(suspect[0]!.reasons.join(' ')).toMatch(/row \d+: at -?[0-9.]+ °C the code reads .* K off, outside the .* K that a board within the design's tolerances can be/);
      expect(json.boards.filter((b) => b.status === 'trimmed')).toHaveLength(40);
      expect(exit).toBe(1);
    });

    it('the compiled C with its trims reads each board within one count of the reference at its calibration points', () => {
      const scale = json.outputUnitsPerC;
      const worst: number[] = [];
      for (const b of boards) {
        const got = printed[b.board]!;
        expect(got).toHaveLength(b.readings.length);
        b.readings.forEach((r, k) => {
          const err = Math.abs(got[k]! / scale - r.celsius);
          worst.push(err);
          expect(err).toBeLessThanOrEqual(countK[k]!);
        });
      }
      expect(Math.max(...worst)).toBeGreaterThanOrEqual(0);
      // Not the nominal board: the trims differ from board to board.
      expect(new Set(json.boards.map((b) => b.offsetUnits)).size).toBeGreaterThan(5);
    });
  });
}

describe('trim-boards refuses what it cannot use', () => {
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'trim-boards-u-'));
  afterAll(() => fs.rmSync(tmp, { recursive: true, force: true }));
  const go = (spec: string, csv: string, extra: string[] = []) => {
    fs.writeFileSync(path.join(tmp, 'p.tsense'), spec);
    fs.writeFileSync(path.join(tmp, 'r.csv'), csv);
    const io = capture();
    io.cwd = tmp;
    const code = runTrimBoards(['p.tsense', '--channel', 'probe', '--readings', 'r.csv', ...extra], io) as number;
    return { code, io };
  };
  it('a channel without calibration: exit 2 with the reason', () => {
    const r = go(SPEC('none'), 'board,temperature_c,code\nA,-10,2140\n');
    expect(r.code).toBe(2);
    expect(r.io.stderr).toMatch(/states no calibration/);
  });
  it('readings without a board column, and a missing readings file: exit 2', () => {
    expect(go(SPEC('one point at -10 °C'), 'temperature_c,code\n-10,2140\n').io.stderr).toMatch(/add a board column/);
    const r = go(SPEC('one point at -10 °C'), '', ['--readings', 'nope.csv']);
    expect(r.code).toBe(2);
    expect(r.io.stderr).toMatch(/--readings takes an existing file: no such file/);
  });
  it('a board with the wrong number of readings is suspect; bad rows are warnings with row and column', () => {
    const r = go(SPEC('one point at -10 °C'), 'board,temperature_c,code\nA,-10,2140\nA,0,2069\nB,-10,x\nC,-10,2141\n', ['--format', 'csv']);
    expect(r.io.stderr).toMatch(/row 4, column 3 \(code\): 'x' is not a number/);
    expect(r.io.stdout).toMatch(/^# /);
    expect(r.io.stdout).toMatch(/\nA,suspect,0,,[0-9.]+,"2 readings \(rows 2, 3\); the channel's one-point calibration takes 1"\n/);
    expect(r.io.stdout).toMatch(/\nC,trimmed,-?\d+,[0-9.]+,[0-9.]+,\n/);
    expect(r.code).toBe(1);
  });
  it('the text report carries the caution', () => {
    const r = go(SPEC('one point at -10 °C'), 'board,temperature_c,code\nC,-10,2141\n');
    expect(r.code).toBe(0);
    expect(r.io.stdout).toMatch(/Board trims for probe \(one-point; probe_set_trim/);
    expect(r.io.stdout).toMatch(/safety|licensed|standards/i);
  });
  it('every format carries the caution of the channel (the general one and its kind\'s, report/caution.ts cautionFor)', () => {
    const spec = SPEC('one point at -10 °C');
    fs.writeFileSync(path.join(tmp, 'p.tsense'), spec);
    const a = analyse({ path: path.join(tmp, 'p.tsense'), text: spec, root: tmp, host: new DiskHost() });
    const caution = cautionFor([a.channels[0]!.channel]);
    const csv = 'board,temperature_c,code\nC,-10,2141\n';
    expect(go(spec, csv).io.stdout.trimEnd().endsWith(caution)).toBe(true);
    expect(JSON.parse(go(spec, csv, ['--format', 'json']).io.stdout).caution).toBe(caution);
    expect(go(spec, csv, ['--format', 'csv']).io.stdout.split('\n')[0]).toBe(`# ${caution.replace(/\s*\n\s*/g, ' ')}`);
    const c = go(spec, csv, ['--format', 'c']).io.stdout;
    for (const line of caution.split('\n')) expect(c).toContain(` * ${line}`);
  });
  it('a channel converted with a second input (a thermocouple: its cold junction) is refused with exit 2 and the reason', () => {
    // The invented kiln sample (checks clean); refused before its calibration is looked at.
    fs.copyFileSync(path.join(ROOT, 'samples', 'kiln.tsense'), path.join(tmp, 'kiln.tsense'));
    fs.writeFileSync(path.join(tmp, 'k.csv'), 'board,temperature_c,code\nK1,500,2000\n');
    const io = capture();
    io.cwd = tmp;
    const code = runTrimBoards(['kiln.tsense', '--channel', 'chamber_tc_k', '--readings', 'k.csv'], io) as number;
    expect(code).toBe(2);
    expect(io.stderr).toContain("channel 'chamber_tc_k': a thermocouple channel converts the ADC code with a second input (another channel's reading); trim-boards trims channels converted from their ADC code alone");
    expect(io.stdout).toBe('');
  });
});
