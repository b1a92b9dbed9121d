import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['tests/unit/**/*.test.ts', 'tests/protocol/**/*.test.ts'],
    testTimeout: 60_000,
    // Hooks compile C and analyse whole samples on a shared machine: no tight limit.
    hookTimeout: 180_000,
    pool: 'forks',
  },
});
