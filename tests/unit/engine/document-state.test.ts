// The document state's invalidation rule (server/src/document-state.ts): each analysis keeps exactly
// what it used, so the state holds what the latest version needs and no more, however many versions
// came before; a trial analysis changes nothing. And the syntax-only requests (folding, outline,
// semantic tokens) answer from the parse without running an analysis. Facts of this design, checked
// on the samples (common practice, no source).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { analyse, DocumentState } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { AnalysisCache } from '../../../server/src/lsp/analyses';
import type { OpenDocuments } from '../../../server/src/lsp/documents';
import type { ServerContext } from '../../../server/src/lsp/context';
import { onSemanticTokens } from '../../../server/src/lsp/handlers/semantic-tokens';
import { onFoldingRanges } from '../../../server/src/lsp/handlers/folding';
import { onDocumentSymbols } from '../../../server/src/lsp/handlers/document-symbols';

const ROOT = path.resolve(__dirname, '../../..');
const FILE = path.join(ROOT, 'samples/greenhouse.tsense');
const TEXT = fs.readFileSync(FILE, 'utf8');

describe('document state', () => {
  it('holds one entry per channel of the latest version, after many versions with new values', () => {
    const state = new DocumentState();
    const host = new DiskHost();
    const site = TEXT.indexOf('.. ', TEXT.indexOf('range')) + 3;
    const number = /^-?\d+/.exec(TEXT.slice(site))![0];
    let last = analyse({ path: FILE, text: TEXT, root: path.dirname(FILE), host, state });
    const channels = last.channels.length;
    expect(channels).toBeGreaterThan(1);
    for (let i = 1; i <= 40; i++) {
      // Every version gives the first channel a range end no version had before.
      const text = TEXT.slice(0, site) + String(Number(number) - i / 8) + TEXT.slice(site + number.length);
      last = analyse({ path: FILE, text, root: path.dirname(FILE), host, state });
      expect(state.size).toBe(channels);
    }
    // The Monte Carlo budget read after an analysis stays with its channel's entry.
    const b = last.channels[1]!.budget;
    expect(b).toBeDefined();
    expect(state.size).toBe(channels);
  });

  it('is left unchanged by a trial analysis', () => {
    const state = new DocumentState();
    const host = new DiskHost();
    const before = analyse({ path: FILE, text: TEXT, root: path.dirname(FILE), host, state });
    // Other text for every channel (each ADC's resolution changes): a trial must not drop what the document keeps.
    const trial = analyse({ path: FILE, text: TEXT.replace(/bits( *)= *\d+/g, 'bits$1= 8'), root: path.dirname(FILE), host, state, trial: true });
    expect(trial.channels.map((c) => c.summary)).not.toEqual(before.channels.map((c) => c.summary));
    // The next real analysis of the document's text finds every channel's sweep kept (the very same table).
    const after = analyse({ path: FILE, text: TEXT, root: path.dirname(FILE), host, state });
    after.channels.forEach((c, i) => expect(c.table).toBe(before.channels[i]!.table));
  });
});

describe('syntax-only requests', () => {
  it('answer folding, outline and semantic tokens from the parse, without an analysis', () => {
    const uri = 'file:///virtual/greenhouse.tsense';
    const docs = {
      roots: [path.dirname(FILE)],
      rootFor: () => path.dirname(FILE),
      host: () => new DiskHost(),
      byPath: () => undefined,
    } as unknown as OpenDocuments;
    const analyses = new AnalysisCache(docs);
    let doc = TextDocument.create(uri, 'tsense', 1, TEXT);
    const ctx = { documents: { get: () => doc }, analyses } as unknown as ServerContext;
    const params = { textDocument: { uri } };
    expect(onSemanticTokens(ctx, params).data.length).toBeGreaterThan(0);
    expect(onFoldingRanges(ctx, params).length).toBeGreaterThan(0);
    expect(onDocumentSymbols(ctx, params).length).toBeGreaterThan(0);
    expect(analyses.peek(uri)).toBeUndefined();
    // After an edit, the analysis of the earlier version is left as it was.
    const first = analyses.get(doc);
    doc = TextDocument.update(doc, [{ text: TEXT.replace('bits', 'bits ') }], 2);
    expect(onSemanticTokens(ctx, params).data.length).toBeGreaterThan(0);
    expect(analyses.peek(uri)).toBe(first);
  });
});
