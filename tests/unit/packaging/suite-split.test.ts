// The suite's two parts (issue #15 item 4): the fast part (unit, fixtures, protocol) runs no C
// toolchain and no browser; the slow part (tests/toolchain-tests.json, vitest project `toolchains`) holds every test file that does.
// A file "uses a toolchain" when it or a helper it imports under tests/ imports
// tests/fixtures/codegen/toolchain.ts, and "uses a browser" when it imports playwright-core
// (common practice, no source: a split by what a test starts, checked from the imports).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import TOOLCHAIN_TESTS from '../../toolchain-tests.json';
import LONG_TESTS from '../../long-tests.json';

const ROOT = path.resolve(__dirname, '../../..');
const TOOLCHAIN = path.join(ROOT, 'tests', 'fixtures', 'codegen', 'toolchain.ts');

function testFiles(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? testFiles(p) : e.name.endsWith('.test.ts') ? [p] : [];
  });
}

/** The import specifiers of a TypeScript file (static imports and re-exports). */
function specifiers(file: string): string[] {
  const text = fs.readFileSync(file, 'utf8');
  return [...text.matchAll(/^\s*(?:import|export)\s[^;]*?\sfrom\s+'([^']+)'|^\s*import\s+'([^']+)'/gm)].map((m) => (m[1] ?? m[2])!);
}

const memo = new Map<string, boolean>();
/** Whether the file, or a module it imports under tests/, starts a toolchain or a browser. */
function startsTool(file: string, seen = new Set<string>()): boolean {
  if (file === TOOLCHAIN) return true;
  const known = memo.get(file);
  if (known !== undefined) return known;
  if (seen.has(file)) return false;
  seen.add(file);
  let found = false;
  for (const s of specifiers(file)) {
    if (s === 'playwright-core') found = true;
    if (!s.startsWith('.')) continue;
    const target = path.resolve(path.dirname(file), s);
    const resolved = [`${target}.ts`, path.join(target, 'index.ts'), target].find((p) => fs.existsSync(p) && fs.statSync(p).isFile());
    if (resolved && resolved.startsWith(path.join(ROOT, 'tests') + path.sep) && startsTool(resolved, seen)) found = true;
  }
  memo.set(file, found);
  return found;
}

describe('the fast and slow parts of the suite', () => {
  const files = [...testFiles(path.join(ROOT, 'tests', 'unit')), ...testFiles(path.join(ROOT, 'tests', 'protocol'))];
  const rel = (p: string) => path.relative(ROOT, p).split(path.sep).join('/');

  it('every file of the slow list, and of the longest-first list (tests/long-tests.json, vitest.config.mts), exists', () => {
    for (const f of [...TOOLCHAIN_TESTS, ...LONG_TESTS]) expect(fs.existsSync(path.join(ROOT, f)), f).toBe(true);
  });

  it('a test file is in the slow list exactly when it starts a C toolchain or a browser', () => {
    const starting = files.filter((f) => startsTool(f)).map(rel).sort();
    expect(starting.length).toBeGreaterThan(5); // the detection finds the known compiling tests
    expect([...TOOLCHAIN_TESTS].sort()).toEqual(starting);
  });
});
