import { availableParallelism } from 'node:os';
import { defineConfig } from 'vitest/config';
import TOOLCHAIN_TESTS from './tests/toolchain-tests.json' with { type: 'json' };

// Two parts, both run by `npm test`: `fast` (unit, fixtures, protocol: `npm run test:fast`) and
// `toolchains` (tests/toolchain-tests.json: every test file that compiles generated C with gcc,
// avr-gcc or arm-none-eabi-gcc and runs it on the host or in simavr, and the panel layout in
// chromium: `npm run test:slow`, which then runs the editor suite). `npx vitest run` runs both
// projects. tests/unit/packaging/suite-split.test.ts checks that the list holds exactly the test
// files that start a toolchain or a browser.

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
    setupFiles: ['tests/unit/helpers/register-kinds.ts'],
    projects: [
      { extends: true, test: { name: 'fast', include: ['tests/unit/**/*.test.ts', 'tests/protocol/**/*.test.ts'], exclude: TOOLCHAIN_TESTS } },
      { extends: true, test: { name: 'toolchains', include: TOOLCHAIN_TESTS } },
    ],
  },
});
