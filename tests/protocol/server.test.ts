// Protocol tests: the bundled server (`node dist/cli.js serve --stdio`) as a real process, each
// feature exercised once over JSON-RPC. Message shapes follow the Language Server Protocol
// specification 3.17 (microsoft.github.io/language-server-protocol); waits are on the
// publishDiagnostics notification and on responses, never on timers.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cursor, ensureBuilt, ROOT, TestClient, uriOf, type Position, type Range } from './client';

const FIX = path.join(ROOT, 'tests', 'fixtures', 'features', 'lsp');
const MAIN = path.join(FIX, 'main.tsense');
const PARTS = path.join(FIX, 'parts.tsense');
const mainText = fs.readFileSync(MAIN, 'utf8');

/** Position of the n-th occurrence of `needle` in `text` (plus `shift` characters). */
function posOf(text: string, needle: string, shift = 0, nth = 0): Position {
  let at = -1;
  for (let i = 0; i <= nth; i++) {
    at = text.indexOf(needle, at + 1);
    if (at < 0) throw new Error(`'${needle}' occurs fewer than ${nth + 1} times`);
  }
  const before = text.slice(0, at + shift).split('\n');
  return { line: before.length - 1, character: before[before.length - 1]!.length };
}

interface TextEdit { range: Range; newText: string }

function applyEdits(text: string, edits: TextEdit[]): string {
  const lines = text.split('\n');
  const off = (p: Position) => lines.slice(0, p.line).reduce((n, l) => n + l.length + 1, 0) + p.character;
  return [...edits].sort((a, b) => off(b.range.start) - off(a.range.start)).reduce((t, e) => t.slice(0, off(e.range.start)) + e.newText + t.slice(off(e.range.end)), text);
}

let client: TestClient;
let mainUri: string;

beforeAll(async () => {
  ensureBuilt();
  client = await TestClient.start({ rootDir: FIX, settings: { debounceMs: 20 } });
  mainUri = client.open(MAIN);
});

afterAll(async () => {
  await client.stop();
  // The server exits cleanly after shutdown + exit (LSP 3.17, "exit" notification: code 0).
  expect(client.exited).toBe(0);
});

describe('diagnostics', () => {
  it('publishes the engine diagnostics of the opened file, with codes and data', async () => {
    const diags = await client.diagnostics(mainUri, 1);
    expect(diags.map((d) => d.code).sort()).toEqual(['bias-current-high', 'clip-high', 'resolution-short', 'unknown-field', 'unknown-name']);
    const high = diags.find((d) => d.code === 'bias-current-high')!;
    expect(high.range.start).toEqual(posOf(mainText, 'resistor 1k5'));
    expect(high.severity).toBe(2); // DiagnosticSeverity.Warning (LSP 3.17)
    // IEC 60063 E24 holds 8.2; the suggestion is an E24 value.
    expect((high.data as { suggestedOhms: number }).suggestedOhms).toBe(82000);
  });

  it('re-checks on change, publishing only for the newest of rapid changes', async () => {
    const before = client.publications(mainUri).length;
    let v = 0;
    for (let i = 0; i < 5; i++) v = client.change(mainUri, mainText.replace('colour = blue', i % 2 ? 'colour = red' : '  '));
    const diags = await client.diagnostics(mainUri, v, before);
    expect(diags.some((d) => d.code === 'unknown-field')).toBe(false);
    const later = client.publications(mainUri).slice(before);
    // With the adaptive debounce a cheap analysis may publish a version of the burst that was
    // already handled; what must hold whatever the timing: versions never go back, and the last is the
    // final version.
    const versions = later.map((p) => p.version ?? 0);
    expect(versions.every((x, i) => i === 0 || x >= versions[i - 1]!)).toBe(true);
    expect(versions[versions.length - 1]).toBe(v);
    const restored = client.change(mainUri, mainText);
    await client.diagnostics(mainUri, restored);
  });

  it('a change to a used file re-checks the spec that uses it (import-problems on the use line)', async () => {
    const partsUri = client.open(PARTS);
    const partsText = fs.readFileSync(PARTS, 'utf8');
    try {
      await client.diagnostics(partsUri, 1);
      const n = client.publications(mainUri).length;
      client.change(partsUri, partsText.replace('bits      = 12', 'bits      = 0'));
      const diags = await client.diagnosticsWhere(mainUri, (ds) => ds.some((d) => d.code === 'import-problems'), n);
      expect(diags.find((d) => d.code === 'import-problems')!.range.start).toEqual(posOf(mainText, '"parts.tsense"'));
      const partsDiags = await client.diagnostics(partsUri, 2);
      expect(partsDiags.map((d) => d.code)).toContain('out-of-domain');
    } finally {
      const m = client.publications(mainUri).length;
      client.change(partsUri, partsText);
      const fixed = await client.diagnosticsWhere(mainUri, (ds) => !ds.some((d) => d.code === 'import-problems'), m);
      expect(fixed.some((d) => d.code === 'bias-current-high')).toBe(true);
      client.close(partsUri);
    }
  });
});

describe('hover', () => {
  const hover = async (pos: Position) => {
    const h = await client.request<{ contents: { value: string }; range: Range } | null>('textDocument/hover', { textDocument: { uri: mainUri }, position: pos });
    return h?.contents.value ?? '';
  };

  it('shows channel figures on the channel name', async () => {
    const md = await hover(posOf(mainText, 'cold {', 1));
    expect(md).toContain('**channel cold**');
    expect(md).toMatch(/°C per count/);
    expect(md).toMatch(/mV\/K/);
    // The short summary comes first (issue 14, item 8).
    expect(md).toMatch(/Worst-case error:/);
    // A forward-biased silicon junction falls by about 2 mV/K (common practice, no source).
    const slope = Number(/\| slope \| (-?[\d.]+) mV\/K/.exec(md)?.[1]);
    expect(slope).toBeLessThan(-1.5);
    expect(slope).toBeGreaterThan(-2.6);
  });

  it('gives a number its value in base units', async () => {
    // IEC 60062 resistor code: 1k5 = 1.5 kΩ = 1500 Ω.
    expect(await hover(posOf(mainText, '1k5', 1))).toContain('`1k5` = 1500 Ω = 1.5 kΩ');
    // SI prefix micro = 1e-6 (BIPM SI Brochure, 9th ed., table 7): 100 uA = 1e-4 A.
    expect(await hover(posOf(mainText, '100 uA', 1))).toContain('`100 uA` = 1e-4 A = 100 µA');
  });

  it('shows a field doc with its default on a field name', async () => {
    const md = await hover(posOf(mainText, 'resolution', 2));
    expect(md).toContain('**resolution**');
    expect(md).toContain('counts per °C');
  });

  it('shows ADC figures on an ADC reference: LSB = reference / 2^bits', async () => {
    const md = await hover(posOf(mainText, 'board_adc', 2, 1));
    // 2.5 V / 4096 = 610 µV (ideal ADC transfer, IEEE Std 1241-2010, code width).
    expect(md).toContain('LSB 610 µV');
  });
});

describe('completion', () => {
  const complete = async (marked: string) => {
    const { text, position } = cursor(marked);
    const uri = uriOf(path.join(FIX, 'scratch.tsense'));
    client.open(path.join(FIX, 'scratch.tsense'), text);
    const items = await client.request<{ label: string; documentation?: { value: string } }[]>('textDocument/completion', { textDocument: { uri }, position });
    client.close(uri);
    return items;
  };

  it('offers block keywords at top level', async () => {
    expect((await complete('use "parts.tsense"\n\nch|')).map((i) => i.label)).toEqual(['junction', 'thermistor', 'rtd', 'thermocouple', 'adc', 'channel', 'use']);
  });

  it('offers the fields not yet given, with docs', async () => {
    const items = await complete('use "parts.tsense"\nchannel c {\n  sensor = small_npn\n  |\n}\n');
    const labels = items.map((i) => i.label);
    expect(labels).toContain('bias');
    expect(labels).not.toContain('sensor');
    expect(items.find((i) => i.label === 'bias')?.documentation?.value).toMatch(/resistor R from V/);
  });

  it('offers defined junction names after sensor = (from the used file)', async () => {
    expect((await complete('use "parts.tsense"\nchannel c {\n  sensor = |\n}\n')).map((i) => i.label)).toEqual(['small_npn']);
  });

  it('offers choice options and units', async () => {
    expect((await complete('junction j {\n  kind = |\n}\n')).map((i) => i.label)).toEqual(['npn', 'pnp', 'diode']);
    const units = (await complete('channel c {\n  bias = current 10 |\n}\n')).map((i) => i.label);
    expect(units).toContain('uA');
    expect(units).not.toContain('V');
  });
});

describe('inlay hints, outline, folding, semantic tokens', () => {
  it('shows the bias current range after the bias line', async () => {
    const hints = await client.request<{ label: string; position: Position }[]>('textDocument/inlayHint', { textDocument: { uri: mainUri }, range: { start: { line: 0, character: 0 }, end: { line: 999, character: 0 } } });
    const bias = hints.find((h) => h.position.line === posOf(mainText, 'current 100 uA').line);
    // A constant-current bias gives the same current at every temperature.
    expect(bias?.label).toBe('→ 100 µA, constant');
    expect(hints.some((h) => h.label.startsWith('LSB '))).toBe(true);
  });

  it('outlines blocks with their fields', async () => {
    const syms = await client.request<{ name: string; children?: { name: string }[] }[]>('textDocument/documentSymbol', { textDocument: { uri: mainUri } });
    expect(syms.map((s) => s.name)).toEqual(['use "parts.tsense"', 'tight_adc', 'probe', 'cold', 'sleepy']);
    expect(syms[2]!.children!.map((c) => c.name)).toEqual(['sensor', 'adc', 'bias', 'range', 'resolution']);
  });

  it('folds each block', async () => {
    const folds = await client.request<{ startLine: number; endLine: number }[]>('textDocument/foldingRange', { textDocument: { uri: mainUri } });
    expect(folds).toContainEqual(expect.objectContaining({ startLine: posOf(mainText, 'channel probe').line, endLine: posOf(mainText, '}', 0, 1).line - 1 }));
  });

  it('classifies tokens with the advertised legend', async () => {
    const tokens = await client.request<{ data: number[] }>('textDocument/semanticTokens/full', { textDocument: { uri: mainUri } });
    const decoded: { line: number; char: number; len: number; type: number }[] = [];
    let line = 0;
    let char = 0;
    for (let i = 0; i < tokens.data.length; i += 5) {
      const [dl, dc, len, type] = tokens.data.slice(i, i + 4) as [number, number, number, number];
      line += dl;
      char = dl === 0 ? char + dc : dc;
      decoded.push({ line, char, len, type });
    }
    const lines = mainText.split('\n');
    const text = (t: (typeof decoded)[number]) => lines[t.line]!.slice(t.char, t.char + t.len);
    const legend = ['keyword', 'type', 'property', 'number', 'unit', 'string', 'comment', 'operator', 'enumMember', 'variable'];
    const of = (word: string) => decoded.filter((t) => text(t) === word).map((t) => legend[t.type]);
    expect(of('channel')[0]).toBe('keyword');
    expect(of('small_npn')[0]).toBe('type');
    expect(of('bias')[0]).toBe('property');
    expect(of('1k5')[0]).toBe('number');
    expect(of('°C')[0]).toBe('unit');
    expect(of('..')[0]).toBe('operator');
    expect(of('"parts.tsense"')[0]).toBe('string');
    expect(decoded.some((t) => legend[t.type] === 'comment' && t.line === 0)).toBe(true);
  });
});

describe('navigation', () => {
  it('goes to a definition in the used file', async () => {
    const loc = await client.request<{ uri: string; range: Range }>('textDocument/definition', { textDocument: { uri: mainUri }, position: posOf(mainText, 'small_npn', 2) });
    expect(loc.uri).toBe(uriOf(PARTS));
    expect(loc.range.start).toEqual(posOf(fs.readFileSync(PARTS, 'utf8'), 'small_npn'));
  });

  it('finds references across the files', async () => {
    const refs = await client.request<{ uri: string }[]>('textDocument/references', { textDocument: { uri: mainUri }, position: posOf(mainText, 'board_adc', 1), context: { includeDeclaration: true } });
    expect(refs.filter((r) => r.uri === mainUri)).toHaveLength(2);
    expect(refs.filter((r) => r.uri === uriOf(PARTS))).toHaveLength(1);
  });

  it('renames a junction everywhere, and refuses an invalid name with a message', async () => {
    const edit = await client.request<{ changes: Record<string, TextEdit[]> }>('textDocument/rename', { textDocument: { uri: mainUri }, position: posOf(mainText, 'small_npn', 1), newName: 'tiny_npn' });
    expect(edit.changes[mainUri]).toHaveLength(2);
    expect(edit.changes[uriOf(PARTS)]).toHaveLength(1);
    expect(applyEdits(mainText, edit.changes[mainUri]!)).toContain('sensor     = tiny_npn');
    await expect(client.request('textDocument/rename', { textDocument: { uri: mainUri }, position: posOf(mainText, 'small_npn', 1), newName: '2fast' })).rejects.toThrow(/not a valid name/);
  });
});

describe('formatting', () => {
  it('formats to the canonical layout and refuses a file with syntax errors', async () => {
    const file = path.join(FIX, 'messy.tsense');
    const uri = client.open(file, 'adc  a {bits=12\n reference=3.3V  +/-1%   # ref\n}\nchannel c{\n}\n');
    const edits = await client.request<TextEdit[]>('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 2, insertSpaces: true } });
    expect(applyEdits('adc  a {bits=12\n reference=3.3V  +/-1%   # ref\n}\nchannel c{\n}\n', edits)).toBe('adc a {\n  bits      = 12\n  reference = 3.3 V +/- 1 %  # ref\n}\n\nchannel c {\n}\n');
    client.change(uri, 'adc a {\n  bits = = 12\n}\n');
    expect(await client.request('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 2, insertSpaces: true } })).toEqual([]);
    client.close(uri);
  });
});

describe('code actions', () => {
  const actions = async (needle: string) =>
    client.request<{ title: string; kind: string; edit?: { changes?: Record<string, TextEdit[]>; documentChanges?: unknown[] }; data?: unknown }[]>('textDocument/codeAction', {
      textDocument: { uri: mainUri },
      range: { start: posOf(mainText, needle), end: posOf(mainText, needle, needle.length) },
      context: { diagnostics: [] },
    });

  it('replaces the bias resistor with the suggested E24 value in IEC 60062 code', async () => {
    const fix = (await actions('resistor 1k5')).find((a) => a.kind === 'quickfix')!;
    expect(fix.title).toMatch(/^Set the bias resistor to 82k \(E24\): [\d.]+ µA \.\. [\d.]+ µA$/);
    expect(applyEdits(mainText, fix.edit!.changes![mainUri]!)).toContain('bias       = resistor 82k from 3.3 V');
  });

  it('sets the bits of an ADC in the used file for resolution-short', async () => {
    const fix = (await actions('0.1 °C per count')).find((a) => a.title.startsWith('Use a 14-bit converter'))!;
    expect(fix.title).toMatch(/worst 0\.\d+ °C\/count/);
    expect(applyEdits(fs.readFileSync(PARTS, 'utf8'), fix.edit!.changes![uriOf(PARTS)]!)).toContain('bits      = 14');
  });

  it('raises the reference for clip-high to a value that clears it', async () => {
    const fix = (await actions('tight_adc\n')).find((a) => a.kind === 'quickfix')!;
    expect(fix.title).toMatch(/^Set the reference of 'tight_adc' to [\d.]+ V: peak [\d.]+ mV = [\d.]+ % of it$/);
  });

  it('offers did-you-mean for unknown names and fields', async () => {
    expect((await actions('small_npx')).map((a) => a.title)).toContain("Change 'small_npx' to 'small_npn'");
  });

  it('keeps serving when a generation fails and the client refuses the warning it is shown', async () => {
    // 'cold' clips on tight_adc: the action is disabled with the reason; this test client answers
    // window/showMessageRequest with an error, which must not take the server down.
    const gen = (await actions('channel cold')).find((a) => a.title === 'Generate conversion code for cold') as { disabled?: { reason: string } } | undefined;
    if (gen) expect(gen.disabled?.reason).toMatch(/end code/);
    expect((await actions('small_npx')).map((a) => a.title)).toContain("Change 'small_npx' to 'small_npn'");
  });

  it('generates conversion code for a channel into <stem>_conversion.c', async () => {
    // 'cold' clips on tight_adc (every code an end code), so it is 'probe' that generates.
    const gen = (await actions('channel probe')).find((a) => a.title === 'Generate conversion code for probe');
    expect(gen).toBeDefined();
    const resolved = gen!.edit ? gen! : await client.request<typeof gen>('codeAction/resolve', gen);
    const text = JSON.stringify(resolved!.edit);
    expect(text).toContain('main_conversion.c');
    expect(text).toContain('thermoscribe:begin channel=probe');
  });
});

describe('settings', () => {
  it('turns inlay hints off with thermoscribe.inlayHints.enabled = false', async () => {
    const other = await TestClient.start({ rootDir: FIX, settings: { debounceMs: 0, inlayHints: { enabled: false } } });
    const uri = other.open(MAIN);
    await other.diagnostics(uri, 1);
    const hints = await other.request<unknown[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 999, character: 0 } } });
    expect(hints).toEqual([]);
    await other.stop();
  });

  it('answers for an unknown document with empty results and keeps serving', async () => {
    const uri = uriOf(path.join(os.tmpdir(), 'not-open.tsense'));
    expect(await client.request('textDocument/hover', { textDocument: { uri }, position: { line: 0, character: 0 } })).toBeNull();
    expect(await client.request('textDocument/documentSymbol', { textDocument: { uri } })).toEqual([]);
    expect(client.exited).toBeNull();
  });
});
