// Protocol tests of the comparison panel's server side: the custom request thermoscribe/compareData
// through the real server process. JSON-RPC shapes follow the Language Server Protocol 3.17
// specification (microsoft.github.io/language-server-protocol). The spec is the invented sous-vide
// sample, copied to a temporary folder; the figures must be the CLI's (`thermoscribe compare
// --format json`, and the cells the CLI's text table), since both come from server/src/compare.
import { execFileSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CLI, ensureBuilt, ROOT, TestClient } from './client';

interface Answer {
  ok: boolean;
  groupNames: string[];
  headers?: string[];
  groups?: { name: string; rows: Record<string, unknown>[]; differences: unknown[]; cells: string[][] }[];
  errors?: number;
  explain?: string;
  caution?: string;
  message?: string;
}

let dir: string;
let client: TestClient;
let uri: string;
let text: string;
let file: string;

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-compare-lsp-'));
  fs.cpSync(path.join(ROOT, 'samples'), dir, { recursive: true });
  client = await TestClient.start({ rootDir: dir, settings: { debounceMs: 0 } });
  file = path.join(dir, 'sous-vide.tsense');
  text = fs.readFileSync(file, 'utf8');
  uri = client.open(file, text);
  await client.diagnostics(uri);
});

afterAll(async () => {
  await client.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

function cli(...args: string[]): string {
  return execFileSync(process.execPath, [CLI, 'compare', ...args], { cwd: dir, encoding: 'utf8' });
}

describe('thermoscribe/compareData', () => {
  it("returns the CLI's rows for each compare_group, with the CLI's cells", async () => {
    const r = await client.request<Answer>('thermoscribe/compareData', { uri });
    expect(r.ok).toBe(true);
    expect(r.groupNames).toEqual(['bath']);
    expect(r.errors).toBe(0);
    const json = JSON.parse(cli(file, '--format', 'json')) as { groups: { name: string; rows: Record<string, unknown>[] }[]; caution: string };
    expect(r.groups!.map((g) => ({ name: g.name, rows: g.rows, differences: g.differences }))).toEqual(json.groups);
    // The same caution, as a paragraph: the panel flows its own lines (#14 item 10).
    // JSON carries it as one paragraph too: a reader of JSON flows its own lines.
    expect(r.caution).toBe(json.caution);
    expect(r.caution).not.toMatch(/\n/);
    const g = r.groups![0]!;
    expect(g.rows.map((x) => x['channel'])).toEqual(['bath_ntc', 'bath_rtd']);
    // IEC 60751 class A: ±(0.15 + 0.002 |t|) °C, so ±0.34 K at the range's 95 °C end (from memory).
    expect(g.rows[1]!['classToleranceK']).toBeCloseTo(0.15 + 0.002 * 95, 12);
    expect(g.rows[0]!['classToleranceK']).toBeNull();
    // The cells are the CLI's text table, cell for cell.
    expect(r.headers).toEqual(['channel', 'sensor', 'worst resolution', 'error', 'after cal', 'class', 'self-heat', 'parts', 'code']);
    const lines = cli(file).split('\n');
    for (const cells of g.cells) {
      expect(cells).toHaveLength(r.headers!.length);
      const line = lines.find((l) => l.startsWith(cells[0]! + ' '))!;
      expect(line.split(/\s{2,}/).map((s) => s.trim())).toEqual(cells);
    }
    expect(g.cells[1]![5]).toBe('±0.34 K');
  });

  it('answers one group by name, and an unknown group with the names there are', async () => {
    const one = await client.request<Answer>('thermoscribe/compareData', { uri, group: 'bath' });
    expect(one.groups!.map((g) => g.name)).toEqual(['bath']);
    const none = await client.request<Answer>('thermoscribe/compareData', { uri, group: 'oven' });
    expect(none).toEqual({ ok: false, groupNames: ['bath'], message: "no group named 'oven'" });
  });

  it('follows edits of the spec', async () => {
    const v = client.change(uri, text.replace('class       = A', 'class       = B'));
    await client.diagnostics(uri, v);
    const r = await client.request<Answer>('thermoscribe/compareData', { uri });
    // IEC 60751 class B: ±(0.3 + 0.005 |t|) °C, ±0.775 K at 95 °C (from memory).
    expect(r.groups![0]!.rows[1]!['classToleranceK']).toBeCloseTo(0.3 + 0.005 * 95, 12);
    const v2 = client.change(uri, text);
    await client.diagnostics(uri, v2);
  });

  it('refuses bad parameters and keeps serving', async () => {
    await expect(client.request('thermoscribe/compareData', { group: 'bath' })).rejects.toThrow(/needs \{uri, group\?\}/);
    expect((await client.request<Answer>('thermoscribe/compareData', { uri })).ok).toBe(true);
  });
});
