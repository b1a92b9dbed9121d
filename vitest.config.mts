import { defineConfig } from 'vitest/config';

// Two parts, both run by `npm test`: `fast` (unit, fixtures, protocol: `npm run test:fast`) and
// `toolchains` (tests that compile generated C with gcc, avr-gcc or arm-none-eabi-gcc and run it on
// the host or in simavr, and the panel layout in chromium: `npm run test:slow`, which then runs the
// editor suite). `npx vitest run` runs both projects.
const TOOLCHAIN_TESTS = [
  'tests/unit/codegen/board-trims.test.ts',
  'tests/unit/codegen/faults-edges.test.ts',
  'tests/unit/codegen/filter-compile.test.ts',
  'tests/unit/codegen/host-compile.test.ts',
  'tests/unit/codegen/hostile-text.test.ts',
  'tests/unit/codegen/measured-oversampling.test.ts',
  'tests/unit/codegen/size-estimate.test.ts',
  'tests/unit/codegen/coarse-output.test.ts',
  'tests/unit/codegen/thermocouple.test.ts',
  'tests/unit/codegen/targets.test.ts',
  'tests/unit/sensors/codegen.test.ts',
  'tests/unit/sensors/codegen-targets.test.ts',
  // Lays out the comparison panel's page in chromium (a browser, like the editor suite).
  'tests/unit/client/compare-layout.test.ts',
];

export default defineConfig({
  test: {
    // No test depends on the machine's speed: the limits are generous, for a busy 2-core CI machine
    // (a beforeAll compiling with gcc once hit vitest's default 10 s hook limit there).
    testTimeout: 120_000,
    hookTimeout: 300_000,
    teardownTimeout: 60_000,
    pool: 'forks',
    setupFiles: ['tests/unit/helpers/register-kinds.ts'],
    projects: [
      { extends: true, test: { name: 'fast', include: ['tests/unit/**/*.test.ts', 'tests/protocol/**/*.test.ts'], exclude: TOOLCHAIN_TESTS } },
      { extends: true, test: { name: 'toolchains', include: TOOLCHAIN_TESTS } },
    ],
  },
});
