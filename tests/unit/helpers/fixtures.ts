// Data-driven test helpers: analyse a fixture from disk, and compare output with an expected
// file beside it. UPDATE_EXPECT=1 rewrites expected files on purpose (review the diff).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { expect } from 'vitest';
import { analyse, type Analysis } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { LineIndex } from '../../../server/src/syntax/line-index';

export const FIXTURES = path.resolve(__dirname, '../../fixtures');

export function analyseFile(file: string, root = path.dirname(file)): Analysis {
  const host = new DiskHost();
  const text = host.read(file);
  if (text === undefined) throw new Error(`fixture ${file} missing`);
  return analyse({ path: file, text, root, host });
}

/** Diagnostics as compact rows: `code severity line:col-line:col message` (1-based), file-relative. */
export function diagnosticRows(a: Analysis, root: string): string[] {
  const host = new DiskHost();
  return a.diagnostics.map((d) => {
    const idx = new LineIndex(host.read(d.file) ?? '');
    const s = idx.position(d.span.start);
    const e = idx.position(d.span.end);
    return `${path.relative(root, d.file)} ${d.code} ${d.severity} ${s.line + 1}:${s.character + 1}-${e.line + 1}:${e.character + 1} ${d.message}`;
  });
}

export function expectMatchesFile(actual: string, expectedPath: string): void {
  if (process.env.UPDATE_EXPECT === '1' || !fs.existsSync(expectedPath)) {
    fs.writeFileSync(expectedPath, actual);
    if (process.env.UPDATE_EXPECT !== '1') throw new Error(`wrote missing expectation ${expectedPath}; review it and re-run`);
    return;
  }
  expect(actual).toBe(fs.readFileSync(expectedPath, 'utf8'));
}
