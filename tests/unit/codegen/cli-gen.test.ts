// `thermoscribe gen`: writes the C file and header, splices into existing files keeping hand-written
// code, refuses damaged markers without writing anything, writes through a temp file and a
// rename, and exits 0/1/2 like `check`. The spec is invented (tests/fixtures/codegen/gen/pump.tsense).
// The generated C itself is checked against compilers in host-compile.test.ts and targets.test.ts.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { runGen } from '../../../server/src/cli/commands/gen';
import { runCheck } from '../../../server/src/cli/commands/check';
import { findGeneratedBlocks, scanGeneratedBlocks } from '../../../server/src/codegen';
import { FIXTURES } from '../helpers/fixtures';
import { hasTool, run } from '../../fixtures/codegen/toolchain';

const SPEC = path.join(FIXTURES, 'codegen', 'gen', 'pump.tsense');
let dir: string;

function runCli(args: string[]) {
  let out = '';
  let err = '';
  // `thermoscribe gen ...` as dispatched by cli/main.ts.
  expect(args[0]).toBe('gen');
  const code = runGen(args.slice(1), { out: (t) => (out += t), err: (t) => (err += t), cwd: dir });
  return { code, out, err };
}

const read = (name: string) => fs.readFileSync(path.join(dir, name), 'utf8');
const listing = () => fs.readdirSync(dir).sort();

beforeEach(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-gen-'));
  fs.copyFileSync(SPEC, path.join(dir, 'pump.tsense'));
});
afterEach(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('thermoscribe gen', () => {
  it('writes <stem>_conversion.c and .h beside the spec with one block per channel, and no temp file', () => {
    const r = runCli(['gen', 'pump.tsense']);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(listing()).toEqual(['pump.tsense', 'pump_conversion.c', 'pump_conversion.h']);
    expect(findGeneratedBlocks(read('pump_conversion.c')).map((b) => b.channel)).toEqual(['coolant', 'housing']);
    expect(findGeneratedBlocks(read('pump_conversion.h')).map((b) => b.channel)).toEqual(['coolant', 'housing']);
    // Channel options from the spec: output = 0.1 °C is tenths, float_variant = yes adds the float function.
    expect(read('pump_conversion.h')).toContain('#define COOLANT_SCALE 10 ');
    // The source includes its own header and does not repeat its typedefs (#13 item 9).
    expect(read('pump_conversion.c')).toContain('#include "pump_conversion.h"');
    expect(read('pump_conversion.c')).not.toContain('typedef');
    expect(read('pump_conversion.c')).toContain('housing_code_to_celsius_f(');
    expect(read('pump_conversion.h')).toContain('#ifndef THSC_PUMP_CONVERSION_H');
    expect(r.out).toMatch(/^coolant: table, \d+ points, max error 0\.\d{4} °C over codes \d+\.\.\d+ \(target 0\.2 °C\)/m);
    expect(r.out).toContain('created pump_conversion.c');
    expect(r.out).toMatch(/Caution/);
  });

  it('generates one channel into --out, and splices later runs keeping hand-written code', () => {
    expect(runCli(['gen', 'pump.tsense', '--channel', 'housing', '--out', 'fw/temps.c']).code).toBe(2);
    fs.mkdirSync(path.join(dir, 'fw'));
    expect(runCli(['gen', 'pump.tsense', '--channel', 'housing', '--out', 'fw/temps.c']).code).toBe(0);
    const c = path.join(dir, 'fw', 'temps.c');
    expect(findGeneratedBlocks(fs.readFileSync(c, 'utf8')).map((b) => b.channel)).toEqual(['housing']);
    // Hand-written code before and after the block, and an edit inside it that gen must replace.
    const mine = '/* my includes */\n' + fs.readFileSync(c, 'utf8').replace('#define HOUSING_SCALE', '#define HOUSING_EDITED 1\n#define HOUSING_SCALE') + 'int my_helper(void) { return 1; }\n';
    fs.writeFileSync(c, mine);
    const r = runCli(['gen', 'pump.tsense', '--out', 'fw/temps.c']);
    expect(r.code).toBe(0);
    expect(r.out).toContain('updated fw/temps.c');
    const after = fs.readFileSync(c, 'utf8');
    expect(after.startsWith('/* my includes */\n')).toBe(true);
    expect(after).toContain('int my_helper(void) { return 1; }\n');
    expect(after).not.toContain('HOUSING_EDITED');
    expect(findGeneratedBlocks(after).map((b) => b.channel)).toEqual(['housing', 'coolant']);
    // The header gets the new channel inside its include guard.
    const h = fs.readFileSync(path.join(dir, 'fw', 'temps.h'), 'utf8');
    expect(h.indexOf('channel=coolant')).toBeLessThan(h.indexOf('#ifdef __cplusplus\n}'));
    expect(scanGeneratedBlocks(h).problems).toEqual([]);
    // A second run changes nothing.
    expect(runCli(['gen', 'pump.tsense', '--out', 'fw/temps.c']).out).toContain('unchanged fw/temps.c');
    expect(fs.readdirSync(path.join(dir, 'fw')).sort()).toEqual(['temps.c', 'temps.h']);
  });

  it('refuses damaged or duplicated markers with exit 2 and writes nothing', () => {
    expect(runCli(['gen', 'pump.tsense']).code).toBe(0);
    const c = read('pump_conversion.c');
    const h = read('pump_conversion.h');
    for (const damaged of [
      c.replace(/\/\* thermoscribe:end channel=coolant \*\/\n/, ''),
      c.replace('/* thermoscribe:begin channel=coolant spec=', '/* thermoscribe:begin chanel=coolant spec='),
      c + c.slice(c.indexOf('/* thermoscribe:begin channel=housing'), c.indexOf('/* thermoscribe:end channel=housing */')) + '/* thermoscribe:end channel=housing */\n',
    ]) {
      fs.writeFileSync(path.join(dir, 'pump_conversion.c'), damaged);
      const r = runCli(['gen', 'pump.tsense']);
      expect(r.code).toBe(2);
      expect(r.err).toMatch(/pump_conversion\.c: .*(no end marker|damaged marker|second generated block|nested).*\(nothing was written\)/);
      expect(read('pump_conversion.c')).toBe(damaged);
      expect(read('pump_conversion.h')).toBe(h);
      expect(listing()).toEqual(['pump.tsense', 'pump_conversion.c', 'pump_conversion.h']);
    }
  });

  it('exits 1 with the errors printed when the spec has errors, writing nothing', () => {
    fs.writeFileSync(path.join(dir, 'pump.tsense'), read('pump.tsense').replace('bits       = 10', 'bits       = 0'));
    const r = runCli(['gen', 'pump.tsense']);
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/^pump\.tsense:\d+:\d+: error \[/m);
    expect(r.err).toContain('nothing was written');
    expect(listing()).toEqual(['pump.tsense']);
  });

  it('generates the clean channels and names the one left out, exit 1 (#13 item 11); --channel of a clean one exits 0', () => {
    // Half an output unit of 1 °C is 0.5 °C: a 0.2 °C target is refused by the resolver.
    fs.writeFileSync(path.join(dir, 'pump.tsense'), read('pump.tsense').replace('output     = 0.1 °C', 'output     = 1 °C'));
    const r = runCli(['gen', 'pump.tsense']);
    expect(r.code).toBe(1);
    expect(r.err).toContain('code_error must be from half an output unit (0.5 °C) to 100 °C; got 0.2 °C');
    expect(r.err).toMatch(/left out 'coolant': out-of-domain: code_error must be/);
    expect(r.out).toContain('left out 1 channel: coolant');
    expect(findGeneratedBlocks(read('pump_conversion.c')).map((b) => b.channel)).toEqual(['housing']);
    const one = runCli(['gen', 'pump.tsense', '--channel', 'housing']);
    expect(one.code).toBe(0);
    expect(one.err).toContain('note: the spec has 1 error outside the channels generated');
    fs.writeFileSync(path.join(dir, 'pump.tsense'), fs.readFileSync(SPEC, 'utf8').replace('output     = 0.1 °C', 'output     = 0.3 °C'));
    expect(runCli(['gen', 'pump.tsense']).err).toContain('output must divide 1 °C into a whole number of units');
  });

  it('names orphan blocks of removed or renamed channels, and removes them only with --prune (#13 item 10)', () => {
    expect(runCli(['gen', 'pump.tsense']).code).toBe(0);
    fs.writeFileSync(path.join(dir, 'pump.tsense'), read('pump.tsense').replace('channel housing {', 'channel casing {'));
    const r = runCli(['gen', 'pump.tsense']);
    expect(r.code).toBe(0);
    expect(r.out).toContain("orphan block 'housing' in pump_conversion.c: no channel of this name in the spec; remove it with --prune");
    expect(r.out).toContain("orphan block 'housing' in pump_conversion.h");
    expect(findGeneratedBlocks(read('pump_conversion.c')).map((b) => b.channel)).toEqual(['coolant', 'housing', 'casing']);
    const p = runCli(['gen', 'pump.tsense', '--prune']);
    expect(p.code).toBe(0);
    expect(p.out).toContain("removed block 'housing' in pump_conversion.c");
    for (const f of ['pump_conversion.c', 'pump_conversion.h']) expect(findGeneratedBlocks(read(f)).map((b) => b.channel)).toEqual(['coolant', 'casing']);
    expect(read('pump_conversion.h')).toMatch(/#endif \/\* THSC_PUMP_CONVERSION_H \*\/\n$/);
  });

  it('check reports generated code out of date with its spec, beside it or named with --code (#13 item 13)', () => {
    const check = (args: string[]) => {
      let out = '';
      const code = runCheck(args, { out: (t) => (out += t), err: (t) => (out += t), cwd: dir });
      return { code, out };
    };
    expect(runCli(['gen', 'pump.tsense']).code).toBe(0);
    expect(check(['pump.tsense']).out).not.toContain('generated-stale');
    fs.writeFileSync(path.join(dir, 'pump.tsense'), read('pump.tsense').replace('range      = 0 °C .. 100 °C', 'range      = 0 °C .. 90 °C'));
    const r = check(['pump.tsense']);
    expect(r.out).toMatch(/pump\.tsense:11:9: warning \[generated-stale\] the generated code for 'coolant' in pump_conversion\.c was made from an earlier version/);
    // A conversion file elsewhere, named with --code.
    fs.mkdirSync(path.join(dir, 'fw'));
    fs.renameSync(path.join(dir, 'pump_conversion.c'), path.join(dir, 'fw', 'temps.c'));
    expect(check(['pump.tsense']).out).not.toContain('generated-stale');
    expect(check(['pump.tsense', '--code', 'fw/temps.c']).out).toContain("[generated-stale] the generated code for 'coolant' in temps.c");
    const sarif = check(['pump.tsense', '--code', 'fw/temps.c', '--format', 'sarif']).out;
    expect(sarif).toContain('"ruleId": "generated-stale"');
  });

  it.skipIf(!hasTool('gcc'))('--prefix: two specs with a same-named channel link into one program (#13 item 12)', () => {
    fs.copyFileSync(SPEC, path.join(dir, 'other.tsense'));
    const main = '#include "pump_conversion.h"\n#include "other_conversion.h"\nint main(void)\n{\n    pa_coolant_temp_t a;\n    pb_coolant_temp_t b;\n    return (int)(pa_coolant_code_to_temp(500u, &a) + pb_coolant_code_to_temp(500u, &b)) + (int)(a - b);\n}\n';
    fs.writeFileSync(path.join(dir, 'main.c'), main);
    const flags = ['-std=c99', '-pedantic', '-Wall', '-Wextra', '-Wconversion', '-Wsign-conversion', '-Werror'];
    // Without a prefix both files define coolant_code_to_temp: the link fails.
    expect(runCli(['gen', 'pump.tsense']).code).toBe(0);
    expect(runCli(['gen', 'other.tsense']).code).toBe(0);
    expect(() => run('gcc', [...flags, '-c', 'pump_conversion.c', 'other_conversion.c'], dir)).not.toThrow();
    expect(() => run('gcc', [...flags, 'pump_conversion.o', 'other_conversion.o', '-o', 'clash'], dir)).toThrow(/multiple definition/);
    for (const f of fs.readdirSync(dir).filter((x) => /_conversion\.[cho]$/.test(x))) fs.rmSync(path.join(dir, f));
    const a = runCli(['gen', 'pump.tsense', '--prefix', 'pa_']);
    expect(a.code).toBe(0);
    expect(runCli(['gen', 'other.tsense', '--prefix', 'pb_']).code).toBe(0);
    expect(read('pump_conversion.h')).toContain('#define PA_COOLANT_SCALE 10 ');
    run('gcc', [...flags, 'main.c', 'pump_conversion.c', 'other_conversion.c', '-o', 'linked'], dir);
    expect(runCli(['gen', 'pump.tsense', '--prefix', '9x']).err).toContain('--prefix must be a C identifier of 1 to 32 letters');
  });

  it('exits 2 on unusable arguments', () => {
    expect(runCli(['gen']).code).toBe(2);
    expect(runCli(['gen', 'missing.tsense']).err).toContain("cannot read 'missing.tsense'");
    expect(runCli(['gen', 'pump.tsense', '--out', 'x.txt']).err).toContain("--out takes a file in an existing folder, ending in .c (got 'x.txt')");
    const r = runCli(['gen', 'pump.tsense', '--channel', 'nope']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("no channel 'nope' in pump.tsense; channels: coolant, housing");
    expect(listing()).toEqual(['pump.tsense']);
  });
});
