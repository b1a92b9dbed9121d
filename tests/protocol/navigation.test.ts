// Navigation over the protocol (LSP 3.17 textDocument/definition, references, prepareRename,
// rename) for a named block of each kind, across the workspace: tests/fixtures/features/nav holds a
// parts file, a spec the test opens and a spec it never opens (found by the server's workspace
// scan). A rename is applied to copies of the files and the copies are checked with the CLI, so a
// rename that leaves a file broken fails here. Waits are on responses, never on timers.
import { execFileSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CLI, ensureBuilt, ROOT, TestClient, uriOf, type Position, type Range } from './client';

const FIX = path.join(ROOT, 'tests', 'fixtures', 'features', 'nav');
const FILES = ['parts.tsense', 'open.tsense', 'closed.tsense'];
const text = (name: string) => fs.readFileSync(path.join(FIX, name), 'utf8');
const uri = (name: string) => uriOf(path.join(FIX, name));

interface Location { uri: string; range: Range }
interface TextEdit { range: Range; newText: string }

/** Position of the n-th occurrence of `needle` in `t` (plus `shift` characters). */
function posOf(t: string, needle: string, shift = 0, nth = 0): Position {
  let at = -1;
  for (let i = 0; i <= nth; i++) {
    at = t.indexOf(needle, at + 1);
    if (at < 0) throw new Error(`'${needle}' occurs fewer than ${nth + 1} times`);
  }
  const before = t.slice(0, at + shift).split('\n');
  return { line: before.length - 1, character: before[before.length - 1]!.length };
}

function applyEdits(t: string, edits: TextEdit[]): string {
  const lines = t.split('\n');
  const off = (p: Position) => lines.slice(0, p.line).reduce((n, l) => n + l.length + 1, 0) + p.character;
  return [...edits].sort((a, b) => off(b.range.start) - off(a.range.start)).reduce((s, e) => s.slice(0, off(e.range.start)) + e.newText + s.slice(off(e.range.end)), t);
}

/** Applies a workspace edit to copies of the fixture files and checks them with the CLI: each file's text and its error diagnostics. */
function checkAfter(changes: Record<string, TextEdit[]>): Record<string, { errors: string[]; text: string }> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'ts-nav-'));
  try {
    for (const f of FILES) fs.writeFileSync(path.join(dir, f), applyEdits(text(f), changes[uri(f)] ?? []));
    let json: string;
    try {
      json = execFileSync(process.execPath, [CLI, 'check', '--format', 'json', ...FILES], { cwd: dir, encoding: 'utf8' });
    } catch (err) {
      json = (err as { stdout: string }).stdout; // exit status 1 when there are errors; the report is still printed
    }
    const report = JSON.parse(json) as { diagnostics: { severity: string; file: string; message: string }[] };
    const out: Record<string, { errors: string[]; text: string }> = {};
    for (const f of FILES) {
      const errors = report.diagnostics.filter((d) => d.severity === 'error' && path.basename(d.file) === f).map((d) => d.message);
      out[f] = { errors, text: fs.readFileSync(path.join(dir, f), 'utf8') };
    }
    return out;
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

let client: TestClient;

beforeAll(async () => {
  ensureBuilt();
  client = await TestClient.start({ rootDir: FIX, settings: { debounceMs: 20 } });
  client.open(path.join(FIX, 'open.tsense'));
});

afterAll(async () => {
  await client.stop();
});

// One named block of each kind that a field refers to; `closedUses`: how often closed.tsense (never
// opened) names it.
const KINDS = [
  { kind: 'junction', name: 'nav_npn', closedUses: 1 },
  { kind: 'thermistor', name: 'nav_bead', closedUses: 1 },
  { kind: 'rtd', name: 'nav_pt', closedUses: 0 },
  { kind: 'adc', name: 'nav_adc', closedUses: 2 },
];

describe.each(KINDS)('a $kind named from a channel', ({ kind, name, closedUses }) => {
  const openText = text('open.tsense');
  const usage = () => ({ textDocument: { uri: uri('open.tsense') }, position: posOf(openText, `= ${name}`, 3) });

  it('goes to its definition in the used file', async () => {
    const loc = await client.request<Location>('textDocument/definition', usage());
    expect(loc.uri).toBe(uri('parts.tsense'));
    expect(loc.range.start).toEqual(posOf(text('parts.tsense'), `${kind} ${name}`, kind.length + 1));
  });

  it('finds its references in the open spec, the parts file and the spec that is not open', async () => {
    const refs = await client.request<Location[]>('textDocument/references', { ...usage(), context: { includeDeclaration: true } });
    const count = (file: string) => refs.filter((r) => r.uri === uri(file)).length;
    const inOpen = openText.split(`= ${name}\n`).length - 1;
    expect([count('parts.tsense'), count('open.tsense'), count('closed.tsense')]).toEqual([1, inOpen, closedUses]);
  });

  it('renames it everywhere, leaving every file clean', async () => {
    const prep = await client.request<{ placeholder: string }>('textDocument/prepareRename', usage());
    expect(prep.placeholder).toBe(name);
    const edit = await client.request<{ changes: Record<string, TextEdit[]> }>('textDocument/rename', { ...usage(), newName: `${name}_2` });
    const after = checkAfter(edit.changes);
    for (const f of FILES) {
      expect(after[f]!.errors, `${f} after the rename:\n${after[f]!.text}`).toEqual([]);
      expect(after[f]!.text.includes(`${name}\n`) || after[f]!.text.includes(`${name} {`)).toBe(false);
    }
    expect(after['parts.tsense']!.text).toContain(`${kind} ${name}_2 {`);
    expect(after['closed.tsense']!.text.split(`= ${name}_2\n`).length - 1).toBe(closedUses);
  });
});

describe('renaming from the definition and across files', () => {
  it('renames a thermistor from its definition in the parts file, including the spec that is not open', async () => {
    const parts = client.open(path.join(FIX, 'parts.tsense'));
    try {
      const at = { textDocument: { uri: parts }, position: posOf(text('parts.tsense'), 'thermistor nav_bead', 11) };
      const edit = await client.request<{ changes: Record<string, TextEdit[]> }>('textDocument/rename', { ...at, newName: 'bath_bead' });
      expect(Object.keys(edit.changes).sort()).toEqual([uri('closed.tsense'), uri('open.tsense'), uri('parts.tsense')].sort());
      const after = checkAfter(edit.changes);
      for (const f of FILES) expect(after[f]!.errors, f).toEqual([]);
      const defn = await client.request<Location>('textDocument/definition', at);
      expect(defn.uri).toBe(parts);
    } finally {
      client.close(parts);
    }
  });

  it('refuses a new name that a spec not open already defines, naming that file', async () => {
    const openText = text('open.tsense');
    const at = { textDocument: { uri: uri('open.tsense') }, position: posOf(openText, '= nav_npn', 3) };
    await expect(client.request('textDocument/rename', { ...at, newName: 'closed_bead' })).rejects.toThrow(/'closed_bead' is already defined in closed\.tsense/);
  });

  it('names every accepted kind when a referenced name is not defined', async () => {
    const file = path.join(FIX, 'unsaved-typo.tsense');
    const t = 'use "parts.tsense"\nchannel c {\n  sensor = nav_missing\n  adc = nav_adc\n}\n';
    const u = client.open(file, t);
    try {
      const at = { textDocument: { uri: u }, position: posOf(t, 'nav_missing', 2) };
      await expect(client.request('textDocument/prepareRename', at)).rejects.toThrow(/No junction, thermistor, rtd or thermocouple named 'nav_missing' is defined/);
      expect(await client.request('textDocument/definition', at)).toBeNull();
    } finally {
      client.close(u);
    }
  });

  it('finds a channel from its name; renaming a channel is refused with the reason', async () => {
    const openText = text('open.tsense');
    const at = { textDocument: { uri: uri('open.tsense') }, position: posOf(openText, 'channel open_bead', 10) };
    const loc = await client.request<Location>('textDocument/definition', at);
    expect(loc).toEqual({ uri: uri('open.tsense'), range: { start: posOf(openText, 'open_bead'), end: posOf(openText, 'open_bead', 'open_bead'.length) } });
    const refs = await client.request<Location[]>('textDocument/references', { ...at, context: { includeDeclaration: true } });
    expect(refs).toHaveLength(1);
    await expect(client.request('textDocument/prepareRename', at)).rejects.toThrow(/generated code and logs refer to them/);
  });
});
