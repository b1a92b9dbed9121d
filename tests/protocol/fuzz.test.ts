// Property test: random edits (insertions, deletions, garbage, unicode) against a sample, sent to
// the real server process as incremental changes. The server never exits, every response has the
// shape the LSP 3.17 specification gives it, and the diagnostics finally published are for the
// last version with ranges inside the document. About 200 edits in all, so it runs in seconds.
import * as fs from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { ensureBuilt, ROOT, TestClient } from './client';

const SAMPLE = path.join(ROOT, 'samples', 'greenhouse.tsense');

let client: TestClient;

beforeAll(async () => {
  ensureBuilt();
  client = await TestClient.start({ rootDir: path.join(ROOT, 'samples'), settings: { debounceMs: 0 } });
});

afterAll(async () => {
  await client.stop();
});

const pieces = fc.oneof(
  fc.constantFrom('{', '}', '=', '..', '±', '+/-', '#', '"', '\n', '\r\n', 'channel x {', 'bias = resistor', '4k7', '-40 °C', ' 1e309', 'use "x.tsense"', '\t', '\u00a0'),
  fc.string({ maxLength: 8 }),
  fc.string({ unit: 'grapheme', maxLength: 4 }),
  fc.string({ unit: 'binary', maxLength: 3 }),
);

const edit = fc.record({
  at: fc.nat(),
  remove: fc.oneof(fc.constant(0), fc.nat({ max: 40 })),
  insert: fc.oneof(fc.constant(''), pieces),
  probe: fc.nat(),
});

interface Hover { contents: { kind: string; value: string }; range?: unknown }

it('survives random edits with well-formed responses', async () => {
  const original = fs.readFileSync(SAMPLE, 'utf8');
  let run = 0;
  await fc.assert(
    fc.asyncProperty(fc.array(edit, { minLength: 5, maxLength: 10 }), async (edits) => {
      const file = path.join(ROOT, 'samples', `fuzz-${run++}.tsense`);
      const uri = client.open(file, original);
      let doc = TextDocument.create(uri, 'tsense', 1, original);
      for (const e of edits) {
        const text = doc.getText();
        const start = e.at % (text.length + 1);
        const end = Math.min(text.length, start + e.remove);
        const range = { start: doc.positionAt(start), end: doc.positionAt(end) };
        const version = client.edit(uri, range, e.insert);
        doc = TextDocument.update(doc, [{ range, text: e.insert }], version);
        const position = doc.positionAt(e.probe % (doc.getText().length + 1));
        const [hover, items, tokens, hints] = await Promise.all([
          client.request<Hover | null>('textDocument/hover', { textDocument: { uri }, position }),
          client.request<unknown[]>('textDocument/completion', { textDocument: { uri }, position }),
          client.request<{ data: number[] }>('textDocument/semanticTokens/full', { textDocument: { uri } }),
          client.request<unknown[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: doc.positionAt(doc.getText().length) } }),
        ]);
        if (hover !== null) expect(typeof hover.contents.value).toBe('string');
        expect(Array.isArray(items)).toBe(true);
        expect(tokens.data.length % 5).toBe(0);
        expect(Array.isArray(hints)).toBe(true);
      }
      const [fmt, syms] = await Promise.all([
        client.request<unknown[]>('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 2, insertSpaces: true } }),
        client.request<unknown[]>('textDocument/documentSymbol', { textDocument: { uri } }),
      ]);
      expect(Array.isArray(fmt) && Array.isArray(syms)).toBe(true);
      const diags = await client.diagnostics(uri, doc.version);
      const lines = doc.lineCount;
      for (const d of diags) {
        expect(d.range.end.line).toBeLessThan(lines);
        expect(d.message).not.toMatch(/NaN|undefined/);
      }
      client.close(uri);
      expect(client.exited).toBeNull();
    }),
    { numRuns: 25, seed: 20240601 },
  );
  // Handlers log a caught exception as 'failed for' (server/src/lsp/guard.ts): none may occur.
  expect(client.logs.join('\n')).not.toMatch(/failed for/);
});
