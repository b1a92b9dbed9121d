// The syntax step of the language server (lsp/diagnostics.ts: a large spec's syntax diagnostics
// are published before its analysis) publishes engine.ts `syntaxDiagnostics` of the document's
// parse: the same diagnostics, in the same order, as the analysis reports for that file, so the
// second publication only adds to the first. A fact of this design (common practice, no source).
import { describe, expect, it } from 'vitest';
import { analyse, DocumentState, syntaxDiagnostics } from '../../../server/src/engine';
import { generateSpec } from '../../../bench/generate';

const FILE = '/virtual/rig.tsense';

describe('syntax diagnostics alone', () => {
  it('are the analysis\' syntax diagnostics of the file, from the same parse cache', () => {
    const text = generateSpec(5).replace('adc conv_1 {\n', 'adc conv_1 {\n  = 5\n  bits = 12 V ±\n').replace('channel probe_3 {', 'channel probe_3 {\n  range = -40 °C ..');
    const state = new DocumentState();
    const first = syntaxDiagnostics(FILE, state.pieces.parse(text));
    expect(first.length).toBe(3);
    expect(first.every((d) => d.code === 'syntax' && d.file === FILE)).toBe(true);
    const analysis = analyse({ path: FILE, text, state });
    expect(first).toEqual(analysis.diagnostics.filter((d) => d.code === 'syntax' && d.file === FILE));
  });

  it('are none for a spec without syntax errors', () => {
    const text = generateSpec(3);
    expect(syntaxDiagnostics(FILE, new DocumentState().pieces.parse(text))).toEqual([]);
  });
});
