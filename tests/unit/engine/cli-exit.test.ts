// One meaning of the exit status for every verb (README, "Exit status"; the rule is cli/verb.ts):
// 0 done and no error diagnostic, 1 error diagnostics (printed) or the work could not be done, 2
// unusable input (bad or unknown options, missing file or folder, unknown channel). Specs are the
// invented fixtures of tests/fixtures/hostile-values/.
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCheck } from '../../../server/src/cli/commands/check';
import { runReport } from '../../../server/src/cli/commands/report';
import { runCompare } from '../../../server/src/cli/commands/compare';
import { runBudget } from '../../../server/src/cli/commands/budget';
import { runPlot } from '../../../server/src/cli/commands/plot';
import { runGen } from '../../../server/src/cli/commands/gen';
import { main } from '../../../server/src/cli/main';
import { FIXTURES } from '../helpers/fixtures';

let dir: string;
beforeAll(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-exit-'));
  for (const f of fs.readdirSync(path.join(FIXTURES, 'hostile-values'))) if (f.endsWith('.tsense')) fs.copyFileSync(path.join(FIXTURES, 'hostile-values', f), path.join(dir, f));
});
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

type Runner = (argv: string[], io: { out(t: string): void; err(t: string): void; cwd: string }) => number | Promise<number>;
const VERBS: Record<string, { run: Runner; extra: string[] }> = {
  check: { run: runCheck, extra: [] },
  report: { run: runReport, extra: [] },
  compare: { run: runCompare, extra: [] },
  budget: { run: runBudget, extra: ['--runs', '20'] },
  plot: { run: runPlot, extra: ['--channel', 'c', '--out', 'c.svg', '--runs', '20'] },
  gen: { run: runGen, extra: [] },
};

async function run(verb: string, args: string[]) {
  let out = '';
  let err = '';
  const code = await VERBS[verb]!.run(args, { out: (t) => (out += t), err: (t) => (err += t), cwd: dir });
  return { code, out, err };
}

describe('the exit status means the same for every verb (#17 item 6)', () => {
  for (const verb of Object.keys(VERBS)) {
    it(`${verb}: 0 on a clean spec, 1 with the error printed, 1 when no channel is left, no usage text`, async () => {
      const clean = await run(verb, ['clean.tsense', ...VERBS[verb]!.extra]);
      expect(clean.err.replace(/\r[^\n]*/g, '')).not.toMatch(/error/);
      expect(clean.code).toBe(0);
      const errors = await run(verb, ['errors.tsense', ...VERBS[verb]!.extra]);
      expect(errors.code).toBe(1);
      expect(errors.out + errors.err).toMatch(/errors\.tsense:14:3: error \[unknown-field\]/);
      expect(errors.err).not.toMatch(/usage:/);
      const none = await run(verb, ['no-channel.tsense', ...VERBS[verb]!.extra]);
      expect(none.code).toBe(1);
      expect(none.out + none.err).toMatch(/no-channel\.tsense:13:\d+: error \[out-of-domain\]/);
      expect(none.err).not.toMatch(/usage:/);
    });
  }
  it('plot and gen write nothing from a spec with errors', async () => {
    fs.rmSync(path.join(dir, 'c.svg'), { force: true });
    expect((await run('plot', ['errors.tsense', ...VERBS['plot']!.extra])).err).toContain('nothing was written');
    expect(fs.existsSync(path.join(dir, 'c.svg'))).toBe(false);
    expect(fs.existsSync(path.join(dir, 'errors_conversion.c'))).toBe(false);
  });
  it('an unknown channel is unusable input (2) where the spec has no error', async () => {
    for (const verb of ['report', 'budget', 'plot', 'gen']) {
      const args = verb === 'plot' ? ['clean.tsense', '--channel', 'nope', '--out', 'x.svg'] : ['clean.tsense', '--channel', 'nope'];
      const r = await run(verb, args);
      expect(r.code, verb).toBe(2);
      expect(r.err, verb).toMatch(/'nope'/);
    }
  });
});

describe('options are checked against each verb\'s table (#17 item 7)', () => {
  it('refuses an unknown option with exit 2, naming it and the options the verb takes', async () => {
    const r = await run('check', ['clean.tsense', '--frobnicate']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("unknown option '--frobnicate'; check takes --format, --root");
    expect(r.err).toContain('usage: thermoscribe check FILE...');
    for (const verb of Object.keys(VERBS)) expect((await run(verb, ['clean.tsense', ...VERBS[verb]!.extra, '-x'])).code, verb).toBe(2);
  });
  it('refuses empty, fractional, signed or out-of-range numbers with the accepted range', async () => {
    for (const [opt, value] of [['--runs', ''], ['--seed', ''], ['--runs', '1e3'], ['--runs', '2.5'], ['--seed', '-1'], ['--runs', '1000001'], ['--seed', '4294967296'], ['--runs', ' 5']] as const) {
      const r = await run('budget', ['clean.tsense', `${opt}=${value}`]);
      expect(r.code, `${opt}=${value}`).toBe(2);
      expect(r.err).toContain(`${opt} takes a whole number from 0 to ${opt === '--runs' ? 1000000 : 4294967295}, in digits (got '${value}')`);
    }
    const missing = await run('budget', ['clean.tsense', '--runs']);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain('option --runs needs a value: a whole number from 0 to 1000000');
  });
  it('refuses a --root that is not an existing folder, and empty names', async () => {
    for (const verb of ['check', 'report', 'compare', 'budget', 'gen']) {
      const r = await run(verb, ['clean.tsense', '--root', 'no-such-folder']);
      expect(r.code, verb).toBe(2);
      expect(r.err).toContain("--root takes an existing folder: no such folder (got 'no-such-folder')");
    }
    expect((await run('check', ['clean.tsense', '--root', 'clean.tsense'])).err).toContain('that is not a folder');
    expect((await run('report', ['clean.tsense', '--channel', ''])).code).toBe(2);
    expect((await run('compare', ['clean.tsense', '--group='])).code).toBe(2);
  });
  it('refuses an output in a missing folder before any work, and escapes echoed control characters', async () => {
    const r = await run('plot', ['clean.tsense', '--channel', 'c', '--out', 'nowhere/c.svg']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--out takes a file in an existing folder: the folder .*nowhere does not exist/);
    const esc = await run('check', ['clean.tsense', '--format', 'te\u001b[31mxt']);
    expect(esc.err).toContain("(got 'te\\x1b[31mxt')");
    expect(esc.err).not.toContain('\u001b');
  });
  it('a write failure is exit 1 in every verb that writes (the input was usable)', async () => {
    // A folder where the output file should go: the rename onto it fails.
    fs.mkdirSync(path.join(dir, 'taken.svg'), { recursive: true });
    const p = await run('plot', ['clean.tsense', '--channel', 'c', '--out', 'taken.svg', '--chart', 'transfer']);
    expect(p.code).toBe(1);
    expect(p.err).toContain('cannot write taken.svg');
    fs.mkdirSync(path.join(dir, 'taken.c'), { recursive: true });
    const g = await run('gen', ['clean.tsense', '--out', 'taken.c']);
    expect(g.code).toBe(1);
    expect(g.err).toMatch(/cannot (write|read)/);
  });
  it('plot with an RTD gain of 1e-320: a domain error naming the range, exit 1, no file (#17 item 9)', async () => {
    fs.rmSync(path.join(dir, 'c.svg'), { force: true });
    const r = await run('plot', ['rtd-tiny-gain.tsense', '--channel', 'c', '--out', 'c.svg', '--runs', '20']);
    expect(r.code).toBe(1);
    expect(r.err).toContain('rtd-tiny-gain.tsense:13:12: error [out-of-domain] gain must be from 0.001 to 10000 (found 1e-320)');
    expect(r.err).not.toMatch(/\n\s+at /);
    expect(fs.existsSync(path.join(dir, 'c.svg'))).toBe(false);
  });
  it('gen on a clean 2-bit spec says what in the spec to change, naming no function (#17 item 10)', async () => {
    const r = await run('gen', ['two-bit.tsense']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/channel 'c': conversion: ADC code \d+ maps to no temperature the sensor gives .*use more bits/);
    expect(r.err).not.toMatch(/celsiusAtCode|NaN|[a-z][A-Z]\w*:/);
  });
  it('main keeps 2 for an unknown verb and prints usage lines made from the option tables', () => {
    let err = '';
    expect(main(['frobnicate'], { out: () => undefined, err: (t) => (err += t), cwd: dir })).toBe(2);
    expect(err).toContain('thermoscribe plot FILE --channel NAME --out FILE.svg [--chart both|transfer|error|dynamics|residuals] [--runs N] [--seed S] [--root DIR]');
  });
});

describe('the CLI process itself (issue #17 items 6 and 7, through the dispatcher)', () => {
  // The verbs that run asynchronously (budget, plot) answer bad options synchronously: the
  // dispatcher must take both, never an internal error.
  it('budget and plot exit 2 with their usage on a bad option, without an internal error', () => {
    const cli = path.resolve(__dirname, '../../../dist/cli.js');
    const spec = path.resolve(__dirname, '../../../samples/greenhouse.tsense');
    for (const args of [['budget', spec, '--runs', ''], ['plot', spec, '--channel', 'soil', '--out', '/tmp/x.svg', '--seed', 'x']]) {
      const r = spawnSync(process.execPath, [cli, ...args], { encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(2);
      expect(r.stderr).toMatch(/usage: thermoscribe (budget|plot)/);
      expect(r.stderr).not.toMatch(/internal error/);
    }
  });
});

describe('plot on a channel with errors, through the CLI process (issue #14 item 9)', () => {
  // The greenhouse sample with its converter's bits set to 0 (outside 1..24): channel bench_air
  // (and every other) is then not analysable. The CLI names the errors and exits 1, not 2.
  it('prints the errors, says they block the drawing, exits 1 without a usage line and writes nothing', () => {
    const cli = path.resolve(__dirname, '../../../dist/cli.js');
    const samples = path.resolve(__dirname, '../../../samples');
    const work = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-plot-err-'));
    try {
      fs.cpSync(samples, work, { recursive: true });
      const spec = path.join(work, 'greenhouse.tsense');
      const text = fs.readFileSync(spec, 'utf8');
      expect(text).toContain('bits       = 12');
      fs.writeFileSync(spec, text.replace('bits       = 12', 'bits       = 0'));
      // An error inside the channel's own block as well: an unknown field.
      fs.writeFileSync(spec, fs.readFileSync(spec, 'utf8').replace(/(channel bench_air \{\n)/, '$1  colour = 3\n'));
      const out = path.join(work, 'bench_air.svg');
      const r = spawnSync(process.execPath, [cli, 'plot', spec, '--channel', 'bench_air', '--out', out, '--runs', '20'], { encoding: 'utf8', cwd: work });
      expect(r.status, r.stderr).toBe(1);
      expect(r.stderr).toMatch(/greenhouse\.tsense:\d+:\d+: error \[out-of-domain\] bits/);
      expect(r.stderr).toMatch(/error \[unknown-field\]/);
      expect(r.stderr).toMatch(/thermoscribe plot: channel 'bench_air' has 1 of the spec's 2 errors \(listed above\); fix them first \(nothing was written\)/);
      expect(r.stderr).not.toMatch(/usage:|no channel named|internal error/);
      expect(fs.existsSync(out)).toBe(false);
    } finally {
      fs.rmSync(work, { recursive: true, force: true });
    }
  });
});
