import { availableParallelism } from 'node:os';
import * as path from 'node:path';
import { defineConfig } from 'vitest/config';
import { BaseSequencer, type TestSpecification } from 'vitest/node';
import TOOLCHAIN_TESTS from './tests/toolchain-tests.json' with { type: 'json' };
import LONG_TESTS from './tests/long-tests.json' with { type: 'json' };

// Two parts, both run by `npm test`: `fast` (unit, fixtures, protocol: `npm run test:fast`) and
// `toolchains` (tests/toolchain-tests.json: every test file that compiles generated C with gcc,
// avr-gcc or arm-none-eabi-gcc and runs it on the host or in simavr, and the panel layout in
// chromium: `npm run test:slow`, which then runs the editor suite). `npx vitest run` runs both
// projects. tests/unit/packaging/suite-split.test.ts checks that the list holds exactly the test
// files that start a toolchain or a browser.

// vitest's file order with the longest test files first (tests/long-tests.json, measured, longest
// first), so that on a fresh clone, with no timings cached, no long file starts last and runs alone
// while the other worker idles. The rest keep vitest's own order; projects stay apart.
class LongestFirst extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const base = await super.sort(files);
    const root = this.ctx.config.root;
    const rank = (f: TestSpecification) => {
      const i = LONG_TESTS.indexOf(path.relative(root, f.moduleId).split(path.sep).join('/'));
      return i < 0 ? LONG_TESTS.length : i;
    };
    const project = new Map<string, number>();
    for (const f of base) if (!project.has(f.project.name)) project.set(f.project.name, project.size);
    return base
      .map((f, i) => ({ f, i }))
      .sort((a, b) => project.get(a.f.project.name)! - project.get(b.f.project.name)! || rank(a.f) - rank(b.f) || a.i - b.i)
      .map((x) => x.f);
  }
}

export default defineConfig({
  test: {
    // No test depends on the machine's speed: the limits are generous, for a busy 2-core CI machine
    // (a beforeAll compiling with gcc once hit vitest's default 10 s hook limit there). They only stop
    // a test that hangs; the slowest test takes well under a tenth of its limit on an idle machine.
    testTimeout: 300_000,
    hookTimeout: 600_000,
    teardownTimeout: 120_000,
    pool: 'forks',
    // vitest's own default is one worker fewer than the cores: a single worker on a 2-core machine.
    // Many tests wait on a child process (the language server, gcc, simavr), so one worker per core
    // keeps both busy; on a 2-core machine this halves the fast part's wall time.
    maxWorkers: Math.max(2, availableParallelism()),
    // The longest files first (tests/long-tests.json), so neither worker is left with one at the end.
    sequence: { sequencer: LongestFirst },
    setupFiles: ['tests/unit/helpers/register-kinds.ts'],
    projects: [
      { extends: true, test: { name: 'fast', include: ['tests/unit/**/*.test.ts', 'tests/protocol/**/*.test.ts'], exclude: TOOLCHAIN_TESTS } },
      { extends: true, test: { name: 'toolchains', include: TOOLCHAIN_TESTS } },
    ],
  },
});
