// Protocol tests of when diagnostics are published (server/src/lsp/diagnostics.ts): a spec just
// opened gets its diagnostics first with the worst-case budgets of at most INLINE_BUDGETS channels,
// and the rest (the budget checks of the other channels) follow for the same version; an older
// version is never published after a newer one, and the last publication is the full analysis of
// the last version. A large spec just opened (100,000 characters or more) gets its syntax diagnostics
// alone first, then its analysis with no budget computed inline (all follow in slices, so a hover
// waits for the analysis alone), then the budgets. LSP 3.17 publishDiagnostics with versions; waits on notifications, never timers.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, TestClient, type LspDiagnostic } from './client';
import { generateSpec } from '../../bench/generate';
import { analyse } from '../../server/src/engine';
import { INLINE_BUDGETS } from '../../server/src/lsp/analyses';

const CHANNELS = INLINE_BUDGETS + 4;
let dir: string;
let client: TestClient;

const accuracy = (d: LspDiagnostic[]) => d.filter((x) => x.code === 'accuracy-unmet').length;

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thermoscribe-steps-'));
  // Default settings: the adaptive debounce as the editor has it.
  client = await TestClient.start({ rootDir: dir });
});

afterAll(async () => {
  await client.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('diagnostics in two steps', () => {
  it('the budget diagnostics follow the first publish of a spec just opened, for the same version', async () => {
    const file = path.join(dir, 'open.tsense');
    const text = generateSpec(CHANNELS);
    const full = analyse({ path: file, text }).diagnostics.filter((d) => d.code === 'accuracy-unmet').length;
    expect(full).toBe(CHANNELS); // every generated channel misses its ±1 K target uncalibrated
    const uri = client.open(file, text);
    const first = await client.diagnostics(uri, 1);
    expect(accuracy(first)).toBe(INLINE_BUDGETS);
    const complete = await client.diagnosticsWhere(uri, (d) => accuracy(d) === CHANNELS);
    expect(complete.length).toBe(first.length + CHANNELS - INLINE_BUDGETS);
    expect(client.publications(uri).every((p) => p.version === 1)).toBe(true);
    client.close(uri);
  });

  it('edits sent while the budgets are under way: no older version is published after a newer one, and the last is complete', async () => {
    const file = path.join(dir, 'typed.tsense');
    const text = generateSpec(CHANNELS);
    const uri = client.open(file, text);
    await client.diagnostics(uri, 1);
    // Retype the first channel's upper range end four times without waiting.
    const line = text.slice(0, text.indexOf('.. 125 °C')).split('\n').length - 1;
    const character = text.split('\n')[line]!.indexOf('.. 125 °C') + 3;
    let last = 1;
    let current = '125';
    for (const next of ['124', '123', '122', '121']) {
      last = client.edit(uri, { start: { line, character }, end: { line, character: character + current.length } }, next);
      current = next;
    }
    // The last version's publications end with its full diagnostics (the budgets the open left
    // pending follow the edited channel's).
    let after = 0;
    for (;;) {
      const done = await client.diagnosticsWhere(uri, (d) => accuracy(d) === CHANNELS, after);
      const pubs = client.publications(uri);
      const at = pubs.findIndex((p, i) => i >= after && p.diagnostics === done);
      if (pubs[at]!.version === last) break;
      after = at + 1;
    }
    const versions = client.publications(uri).map((p) => p.version ?? 0);
    expect(versions).toEqual([...versions].sort((a, b) => a - b));
    expect(versions.at(-1)).toBe(last);
    // Served as usual afterwards.
    const hover = await client.request<{ contents: unknown } | null>('textDocument/hover', { textDocument: { uri }, position: { line, character: 4 } });
    expect(hover).not.toBeUndefined();
    client.close(uri);
  });

  it('a large spec just opened: the first publication carries its syntax errors, the analysis follows for the same version, and a hover sent meanwhile is answered', async () => {
    const file = path.join(dir, 'large.tsense');
    const text = generateSpec(800).replace('adc conv_0 {\n', 'adc conv_0 {\n  = 5\n');
    const uri = client.open(file, text);
    const first = await client.diagnostics(uri, 1);
    const syntax = (d: LspDiagnostic[]) => d.filter((x) => x.code === 'syntax').map((x) => `${x.range.start.line}:${x.message}`);
    expect(syntax(first)).toHaveLength(1);
    expect(first).toHaveLength(1); // the syntax step: nothing of the analysis yet
    const at = text.slice(0, text.indexOf('channel probe_3 ')).split('\n').length - 1;
    const hover = client.request<{ contents: unknown } | null>('textDocument/hover', { textDocument: { uri }, position: { line: at, character: 'channel '.length + 1 } });
    // The analysis (the channels' diagnostics), with the same syntax errors and no budget yet.
    const analysed = await client.diagnosticsWhere(uri, () => true, 1);
    expect(syntax(analysed)).toEqual(syntax(first));
    expect(analysed.length).toBeGreaterThan(1);
    expect(accuracy(analysed)).toBe(0);
    // Then every budget check.
    const complete = await client.diagnosticsWhere(uri, (d) => d.some((x) => x.code === 'accuracy-unmet'));
    expect(syntax(complete)).toEqual(syntax(first));
    expect((await hover)?.contents).toBeTruthy();
    expect(client.publications(uri).every((p) => p.version === 1)).toBe(true);
    client.close(uri);
  });
});
