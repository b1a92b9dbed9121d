// Issue #17, generated files under hostile conditions (items 1, 12, 13, 14, 15): a spec's file name
// that tries to inject C, links, read-only and widened modes, a failing rename between the .c and
// the .h, a blank line after the header's #endif, and two channels whose C names collide.
// The spec is invented (tests/fixtures/codegen/gen/pump.tsense).
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { runGen } from '../../../server/src/cli/commands/gen';
import { writeFilesTogether } from '../../../server/src/cli/write-files';
import { findGeneratedBlocks } from '../../../server/src/codegen';
import { FIXTURES } from '../helpers/fixtures';

const PUMP = fs.readFileSync(path.join(FIXTURES, 'codegen', 'gen', 'pump.tsense'), 'utf8');
let dir: string;
beforeEach(() => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-hostile-gen-'));
  fs.writeFileSync(path.join(dir, 'pump.tsense'), PUMP);
});
afterEach(() => fs.rmSync(dir, { recursive: true, force: true }));

function gen(...args: string[]) {
  let out = '';
  let err = '';
  const code = runGen(args, { out: (t) => (out += t), err: (t) => (err += t), cwd: dir });
  return { code, out, err };
}
const at = (name: string) => path.join(dir, name);
const read = (name: string) => fs.readFileSync(at(name), 'utf8');
const temps = () => fs.readdirSync(dir).filter((f) => f.endsWith('.tmp'));
/** C text without its comments (ISO C 6.4.9: a block comment ends at the first `*` `/`). */
const code = (text: string) => text.replace(/\/\*[\s\S]*?\*\//g, ' ');

describe('issue #17 item 1: a file name cannot inject C', () => {
  it('the name from the report stays inside comments in both files', () => {
    const name = 'probe*\\ int backdoor(void){return 1337;} \\*.tsense';
    fs.writeFileSync(at(name), PUMP);
    const r = gen(name);
    expect(r.code).toBe(0);
    const stem = name.replace(/\.tsense$/, '_conversion');
    for (const f of [`${stem}.c`, `${stem}.h`]) {
      expect(read(f)).toContain('backdoor');
      expect(code(read(f))).not.toContain('backdoor');
    }
  });
});

describe('issue #17 item 12: links, read-only files and modes', () => {
  it('a generated file that is a symbolic link is written through the link (the link stays)', () => {
    expect(gen('pump.tsense').code).toBe(0);
    fs.mkdirSync(at('real'));
    fs.renameSync(at('pump_conversion.c'), at('real/conv.c'));
    fs.writeFileSync(at('real/conv.c'), read('real/conv.c').replace('Channel coolant: 10-bit', 'Channel coolant: 99-bit'));
    fs.symlinkSync('real/conv.c', at('pump_conversion.c'));
    const r = gen('pump.tsense');
    expect(r.code).toBe(0);
    expect(fs.lstatSync(at('pump_conversion.c')).isSymbolicLink()).toBe(true);
    expect(read('real/conv.c')).toContain('Channel coolant: 10-bit');
    expect(temps()).toEqual([]);
  });

  it('a read-only file is refused, and neither file changes', () => {
    expect(gen('pump.tsense', '--channel', 'coolant').code).toBe(0);
    fs.chmodSync(at('pump_conversion.h'), 0o444);
    const c = read('pump_conversion.c');
    const h = read('pump_conversion.h');
    const r = gen('pump.tsense');
    expect(r.err).toContain('read-only');
    expect(r.code).not.toBe(0);
    expect(read('pump_conversion.c')).toBe(c);
    expect(read('pump_conversion.h')).toBe(h);
    expect(temps()).toEqual([]);
  });

  it('an existing file keeps its permission bits (0666 stays 0666 whatever the umask)', () => {
    expect(gen('pump.tsense').code).toBe(0);
    fs.chmodSync(at('pump_conversion.c'), 0o666);
    fs.chmodSync(at('pump_conversion.h'), 0o640);
    fs.writeFileSync(at('pump.tsense'), PUMP.replace('output', '# changed\n  output'));
    expect(gen('pump.tsense').code).toBe(0);
    expect(fs.statSync(at('pump_conversion.c')).mode & 0o777).toBe(0o666);
    expect(fs.statSync(at('pump_conversion.h')).mode & 0o777).toBe(0o640);
  });
});

describe('issue #17 item 13: both files or neither', () => {
  it('a rename failing after the first leaves the old pair byte-identical and no temporary file', () => {
    fs.writeFileSync(at('a.c'), 'old c\n');
    fs.writeFileSync(at('a.h'), 'old h\n');
    let n = 0;
    const failed = writeFilesTogether([{ file: at('a.c'), text: 'new c\n' }, { file: at('a.h'), text: 'new h\n' }], {
      rename: (from, to) => {
        if (++n === 2) throw new Error('disk full (simulated)');
        fs.renameSync(from, to);
      },
    });
    expect(failed).toMatch(/cannot replace .*a\.h: disk full/);
    expect(read('a.c')).toBe('old c\n');
    expect(read('a.h')).toBe('old h\n');
    expect(temps()).toEqual([]);
    expect(fs.readdirSync(dir).filter((f) => f.startsWith('.'))).toEqual([]);
  });

  it('a new file is removed again when its partner cannot be renamed', () => {
    let n = 0;
    const failed = writeFilesTogether([{ file: at('b.c'), text: 'c\n' }, { file: at('b.h'), text: 'h\n' }], {
      rename: (from, to) => {
        if (++n === 2) throw new Error('simulated');
        fs.renameSync(from, to);
      },
    });
    expect(failed).toBeDefined();
    expect(fs.readdirSync(dir).sort()).toEqual(['pump.tsense']);
  });

  it('gen refuses before writing either file when the header cannot be written', () => {
    fs.mkdirSync(at('pump_conversion.h'));
    const r = gen('pump.tsense');
    expect(r.code).not.toBe(0);
    expect(fs.existsSync(at('pump_conversion.c'))).toBe(false);
    expect(temps()).toEqual([]);
  });
});

describe('issue #17 item 14: a new channel lands inside the include guard and extern "C"', () => {
  for (const tail of ['\n', '\n\n', '\n\n\n  \n', '\r\n\r\n']) {
    it(`with ${JSON.stringify(tail)} after the header's #endif`, () => {
      expect(gen('pump.tsense', '--channel', 'coolant').code).toBe(0);
      const h0 = read('pump_conversion.h').replace(/\n$/, '');
      fs.writeFileSync(at('pump_conversion.h'), tail.startsWith('\r') ? h0.replace(/\n/g, '\r\n') + tail : h0 + tail);
      expect(gen('pump.tsense').code).toBe(0);
      const h = read('pump_conversion.h');
      const housing = findGeneratedBlocks(h).find((b) => b.channel === 'housing')!;
      expect(housing).toBeDefined();
      expect(housing.end).toBeLessThanOrEqual(h.search(/#ifdef __cplusplus\r?\n\}/));
      expect(h.endsWith(tail)).toBe(true);
    });
  }
});

describe('issue #17 item 15: channels whose C names collide across specs', () => {
  it('gen of a spec with channel Coolant into a file holding coolant is refused (exit 1), nothing written', () => {
    expect(gen('pump.tsense', '--channel', 'coolant', '--out', 'shared.c').code).toBe(0);
    fs.writeFileSync(at('other.tsense'), PUMP.replace('channel coolant {', 'channel Coolant {'));
    const c = read('shared.c');
    const h = read('shared.h');
    const r = gen('other.tsense', '--channel', 'Coolant', '--out', 'shared.c');
    expect(r.code).toBe(1);
    expect(r.err).toContain("channel 'Coolant' would define the same C names (coolant_...) as channel 'coolant'");
    expect(read('shared.c')).toBe(c);
    expect(read('shared.h')).toBe(h);
  });
});
