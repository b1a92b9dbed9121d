// The syntax step of the language server (lsp/diagnostics.ts: a large spec's syntax diagnostics
// are published before its analysis) publishes engine.ts `syntaxDiagnostics` of the document's
// text, from a parse that keeps no field: the same diagnostics, in the same order, as the analysis
// reports for that file, so the second publication only adds to the first. A fact of this design
// (common practice, no source).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse, DocumentState, syntaxDiagnostics } from '../../../server/src/engine';
import { parse, syntaxProblems } from '../../../server/src/syntax/parse';
import { generateSpec } from '../../../bench/generate';

const FILE = '/virtual/rig.tsense';
const ROOT = path.resolve(__dirname, '../../..');

function specsUnder(dir: string): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
    const p = path.join(dir, e.name);
    return e.isDirectory() ? specsUnder(p) : e.name.endsWith('.tsense') ? [p] : [];
  });
}

describe('syntax diagnostics alone', () => {
  it('are the analysis\' syntax diagnostics of the file', () => {
    const text = generateSpec(5).replace('adc conv_1 {\n', 'adc conv_1 {\n  = 5\n  bits = 12 V ±\n').replace('channel probe_3 {', 'channel probe_3 {\n  range = -40 °C ..');
    const first = syntaxDiagnostics(FILE, text);
    expect(first.length).toBe(3);
    expect(first.every((d) => d.code === 'syntax' && d.file === FILE)).toBe(true);
    const analysis = analyse({ path: FILE, text, state: new DocumentState() });
    expect(first).toEqual(analysis.diagnostics.filter((d) => d.code === 'syntax' && d.file === FILE));
  });

  it('are none for a spec without syntax errors', () => {
    expect(syntaxDiagnostics(FILE, generateSpec(3))).toEqual([]);
  });

  it('the parse that keeps no field finds the problems of the full parse, in every fixture and sample (and each cut short)', () => {
    const files = [...specsUnder(path.join(ROOT, 'tests/fixtures')), ...specsUnder(path.join(ROOT, 'samples'))];
    expect(files.length).toBeGreaterThan(100);
    let withProblems = 0;
    for (const f of files) {
      const text = fs.readFileSync(f, 'utf8');
      // Whole, and cut in the middle of a line (a half-typed value, an unclosed block).
      for (const t of [text, text.slice(0, Math.floor(text.length * 0.6))]) {
        const full = parse(t).problems;
        if (full.length > 0) withProblems++;
        expect(syntaxProblems(t), f).toEqual(full);
      }
    }
    expect(withProblems).toBeGreaterThan(20);
  });
});
