// Hostile text reaching generated C (issue #17 item 1): channel names, notes and file stems built
// from fragments that try to close a comment, splice a line, form a trigraph or start a directive,
// in every order. The output must compile under strict C99 (ISO/IEC 9899:1999: 5.1.1.2 translation
// phases, 5.2.1.1 trigraphs, 6.4.9 comments) and the injected code must not survive preprocessing.

import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateC } from '../../../server/src/codegen';
import { planChannels } from '../../../server/src/codegen/generate';
import { syntheticDiodeChannel } from '../../fixtures/codegen/channels';
import { HOST_FLAGS, WorkDir, hasTool, run } from '../../fixtures/codegen/toolchain';

const haveGcc = hasTool('gcc');

const FRAGMENTS = [
  '*', '/', '\\', '*/', '/*', '//', '?', '??/', '??=', '"', "'", '#', '\n', '\r', '\r\n', '\u2028', '\t', ' ',
  '\n#define THSC_IN_RANGE 7u\n', '\n#error injected\n', 'int backdoor(void){return 1337;}', '\\\n', 'é', '\u0000', '\u001b[31m',
];
const hostile = fc.array(fc.constantFrom(...FRAGMENTS), { minLength: 1, maxLength: 14 }).map((a) => a.join(''));

// The exact name from the issue report, then a generated corpus (fixed seed: reproducible).
const CASES: { stem: string; names: string[]; note: string }[] = [
  { stem: 'probe*\\ int backdoor(void){return 1337;} \\*', names: ['probe*\\ int backdoor(void){return 1337;} \\*'], note: '*\\ int backdoor(void){return 1337;} \\*' },
  ...fc.sample(fc.record({ stem: hostile, names: fc.uniqueArray(hostile, { minLength: 1, maxLength: 2 }), note: hostile }), { numRuns: 16, seed: 1717 }),
];

describe.skipIf(!haveGcc)('hostile text in generated C compiles as plain comments', () => {
  let dir: WorkDir;
  beforeAll(() => {
    dir = new WorkDir();
  });
  afterAll(() => dir?.dispose());

  it('no name, note or file stem closes a comment or starts a directive (gcc, every case)', { timeout: 300_000 }, () => {
    CASES.forEach((c, k) => {
      const channels = c.names.map((n) => syntheticDiodeChannel({ channelName: n, note: c.note, errorTarget: 0.3 }, 8));
      const src = generateC(channels, { fileStem: c.stem });
      const hdr = generateC(channels, { fileStem: c.stem, header: true });
      const ids = planChannels(channels).plans.map((p) => p.ident);
      dir.write(`c${k}.h`, hdr.text);
      dir.write(`c${k}.c`, src.text);
      // A plain stem is named in the source's #include (any other stem gives self-contained blocks).
      const included = /#include "([^"]*)"/.exec(src.text)?.[1];
      if (included !== undefined) {
        expect(included, JSON.stringify(c)).toMatch(/^[A-Za-z0-9_+-][A-Za-z0-9_.+-]*\.h$/);
        dir.write(included, hdr.text);
      }
      dir.write(`m${k}.c`, `#include "c${k}.h"\nint main(void)\n{\n    return 0;\n}\n`);
      const where = JSON.stringify(c);
      // Preprocessed text without comments: nothing of the injected code may remain.
      for (const f of [`c${k}.c`, `m${k}.c`]) {
        const pre = run('gcc', ['-std=c99', '-E', '-P', f], dir.path).stdout;
        expect(pre, where).not.toMatch(/return\s*1337|\bbackdoor\s*\(/);
      }
      run('gcc', [...HOST_FLAGS, '-c', `c${k}.c`, '-o', `c${k}.o`], dir.path);
      run('gcc', [...HOST_FLAGS, '-c', `m${k}.c`, '-o', `m${k}.o`], dir.path);
      // Every global symbol defined is one the generator named from a channel's identifier.
      const syms = run('nm', ['-g', '--defined-only', `c${k}.o`], dir.path).stdout.split('\n').filter(Boolean).map((l) => l.split(' ').pop()!);
      for (const s of syms) expect(ids.some((id) => s.startsWith(id)), `${s} in ${where}`).toBe(true);
    });
  });
});
