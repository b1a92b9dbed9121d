// Protocol tests of conversion code in the editor: the stale-block warning on a spec whose
// `<stem>_conversion.c` was generated from an older version of a channel, its regenerate quick fix,
// and the custom requests behind "Insert Conversion Code" (thermoscribe/conversionChannels and
// thermoscribe/conversionCode). JSON-RPC shapes follow the Language Server Protocol 3.17
// specification (microsoft.github.io/language-server-protocol). The spec is invented.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { analyse } from '../../server/src/engine';
import { channelSpecHash } from '../../server/src/codegen/channel-input';
import { generateForSpec } from '../../server/src/codegen/spec';
import { ensureBuilt, ROOT, TestClient, uriOf, type LspDiagnostic } from './client';

const SPEC_TEXT = fs.readFileSync(path.join(ROOT, 'tests', 'fixtures', 'codegen', 'gen', 'pump.tsense'), 'utf8');
// The coolant channel's bias as it was when the C file was generated (the spec has 20 uA now).
const OLD_TEXT = SPEC_TEXT.replace('bias       = current 20 uA', 'bias       = current 25 uA');

let dir: string;
let spec: string;
let client: TestClient;
let uri: string;

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-conv-'));
  spec = path.join(dir, 'pump.tsense');
  fs.writeFileSync(spec, SPEC_TEXT);
  fs.writeFileSync(path.join(dir, 'spare.tsense'), SPEC_TEXT.replace('channel coolant', 'channel spare_coolant').replace('channel housing', 'channel spare_housing'));
  const old = generateForSpec(analyse({ path: spec, text: OLD_TEXT }), { fileStem: 'pump_conversion' });
  if (!old.ok) throw new Error(old.message);
  fs.writeFileSync(path.join(dir, 'pump_conversion.c'), old.source.text);
  client = await TestClient.start({ rootDir: dir, settings: { debounceMs: 0 } });
  uri = client.open(spec);
});

afterAll(async () => {
  await client.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('stale generated code', () => {
  let stale: LspDiagnostic;

  it('warns on the name of the channel whose generated block is out of date, only that one', async () => {
    const ds = await client.diagnosticsWhere(uri, (d) => d.some((x) => x.code === 'generated-stale'));
    const all = ds.filter((d) => d.code === 'generated-stale');
    expect(all).toHaveLength(1);
    stale = all[0]!;
    // Severity 2 = Warning (LSP 3.17 DiagnosticSeverity).
    expect(stale.severity).toBe(2);
    const line = SPEC_TEXT.split('\n')[stale.range.start.line]!;
    expect(line.slice(stale.range.start.character, stale.range.end.character)).toBe('coolant');
    expect(stale.message).toContain("the generated code for 'coolant' in pump_conversion.c");
  });

  it('offers a regenerate quick fix whose edit writes the current hash', async () => {
    const actions = await client.request<{ title: string; kind: string; edit?: unknown; data?: unknown }[]>('textDocument/codeAction', {
      textDocument: { uri },
      range: stale.range,
      context: { diagnostics: [stale], only: ['quickfix'] },
    });
    const fix = actions.find((a) => a.title === 'Regenerate conversion code for coolant');
    expect(fix?.kind).toBe('quickfix');
    const resolved = fix!.edit ? fix! : await client.request<typeof fix>('codeAction/resolve', fix);
    const a = analyse({ path: spec, text: SPEC_TEXT });
    const hash = channelSpecHash(a.channels.find((r) => r.channel.name === 'coolant')!.channel);
    expect(JSON.stringify(resolved!.edit)).toContain(`thermoscribe:begin channel=coolant spec=${hash} `);
  });
  it('clears the warning once the C file is regenerated and the client reports the change', async () => {
    const fresh = generateForSpec(analyse({ path: spec, text: SPEC_TEXT }), { fileStem: 'pump_conversion' });
    if (!fresh.ok) throw new Error(fresh.message);
    const cFile = path.join(dir, 'pump_conversion.c');
    fs.writeFileSync(cFile, fresh.source.text);
    const after = client.publications(uri).length;
    // FileChangeType 2 = Changed (LSP 3.17 workspace/didChangeWatchedFiles), as the client's watcher sends it.
    void client.conn.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(cFile), type: 2 }] });
    const ds = await client.diagnosticsWhere(uri, (d) => !d.some((x) => x.code === 'generated-stale'), after);
    expect(ds.filter((d) => d.code === 'generated-stale')).toEqual([]);
  });
});

describe('thermoscribe/conversionChannels and thermoscribe/conversionCode', () => {
  it('lists the channels of open and unopened specs', async () => {
    const spare = uriOf(path.join(dir, 'spare.tsense'));
    const list = await client.request<{ uri: string; channel: string }[]>('thermoscribe/conversionChannels', { uris: [uri, spare, uriOf(path.join(dir, 'none.tsense'))] });
    expect(list).toEqual([
      { uri, channel: 'coolant' },
      { uri, channel: 'housing' },
      { uri: spare, channel: 'spare_coolant' },
      { uri: spare, channel: 'spare_housing' },
    ]);
  });

  it("returns the channel's marked block, in the file's line endings", async () => {
    const r = await client.request<{ text: string; method: string; maxErrorC: number }>('thermoscribe/conversionCode', { uri, channel: 'housing', eol: '\r\n' });
    expect(r.text.startsWith('/* thermoscribe:begin channel=housing spec=')).toBe(true);
    expect(r.text.endsWith('/* thermoscribe:end channel=housing */\r\n')).toBe(true);
    expect(r.text.replace(/\r\n/g, '')).not.toMatch(/\n/);
    expect(r.text).toContain('uint8_t housing_code_to_temp(uint16_t code, housing_temp_t *out)');
    expect(r.maxErrorC).toBeLessThanOrEqual(0.02);
  });

  it('refuses an unknown channel with a message and keeps serving', async () => {
    await expect(client.request('thermoscribe/conversionCode', { uri, channel: 'nope' })).rejects.toThrow(/no channel 'nope'/);
    await expect(client.request('thermoscribe/conversionCode', { uri })).rejects.toThrow(/needs \{uri, channel\}/);
    expect(client.exited).toBeNull();
  });
});

describe('orphan generated blocks (#13 item 10)', () => {
  it('warns of a block whose channel the spec no longer defines, and offers to remove it from the C file', async () => {
    const withOld = generateForSpec(analyse({ path: spec, text: SPEC_TEXT.replace('channel housing', 'channel old_pump') }), { fileStem: 'pump_conversion' });
    if (!withOld.ok) throw new Error(withOld.message);
    const cFile = path.join(dir, 'pump_conversion.c');
    fs.writeFileSync(cFile, withOld.source.text);
    const after = client.publications(uri).length;
    void client.conn.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(cFile), type: 2 }] });
    const ds = await client.diagnosticsWhere(uri, (d) => d.some((x) => x.code === 'generated-orphan'), after);
    const orphan = ds.find((d) => d.code === 'generated-orphan')!;
    expect(orphan.message).toContain("pump_conversion.c holds a generated block for 'old_pump'");
    const actions = await client.request<{ title: string; kind: string; edit?: { changes: Record<string, { range: { start: { line: number }; end: { line: number } }; newText: string }[]> } }[]>('textDocument/codeAction', {
      textDocument: { uri },
      range: orphan.range,
      context: { diagnostics: [orphan], only: ['quickfix'] },
    });
    const fix = actions.find((a) => a.title === "Remove the generated block of 'old_pump'");
    expect(fix?.kind).toBe('quickfix');
    const edits = fix!.edit!.changes[uriOf(cFile)]!;
    expect(edits).toHaveLength(1);
    const lines = withOld.source.text.split('\n');
    expect(lines[edits[0]!.range.start.line]).toMatch(/^\/\* thermoscribe:begin channel=old_pump /);
    expect(lines[edits[0]!.range.end.line - 1]).toBe('/* thermoscribe:end channel=old_pump */');
    expect(edits[0]!.newText).toBe('');
  });
});

describe('generating from the editor says what was written and where (#14 item 4)', () => {
  // The client names the command it runs itself; the server then attaches it to the resolved
  // action (LSP 3.17: a code action's command runs after its edit is applied).
  it('a client with thermoscribe.showGenerated gets it with the file, the block line and a summary', async () => {
    const fresh = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-show-'));
    const freshSpec = path.join(fresh, 'pump.tsense');
    fs.writeFileSync(freshSpec, SPEC_TEXT);
    const c = await TestClient.start({ rootDir: fresh, settings: { debounceMs: 0 }, initializationOptions: { clientCommands: ['thermoscribe.showGenerated'] } });
    try {
      const u = c.open(freshSpec);
      const resolved = await c.request<{ edit?: unknown; command?: { command: string; arguments: { uri: string; line: number; message: string }[] } }>(
        'codeAction/resolve', { title: 'Generate conversion code for housing', kind: 'refactor.generateConversion', data: { uri: u, channel: 'housing' } });
      expect(resolved.command?.command).toBe('thermoscribe.showGenerated');
      const args = resolved.command!.arguments[0]!;
      expect(args.uri).toBe(uriOf(path.join(fresh, 'pump_conversion.c')));
      // The summary's figures are the generator's own (thermoscribe/conversionCode gives the same).
      const code = await c.request<{ text: string; method: string; maxErrorC: number }>('thermoscribe/conversionCode', { uri: u, channel: 'housing' });
      expect(args.message).toMatch(new RegExp(`^Wrote the conversion of 'housing' into pump_conversion\\.c \\(a new file\\): a (table of \\d+ entries|polynomial in \\d+ segments|straight line), worst error ${code.maxErrorC.toFixed(3).replace('.', '\\.')} °C against the model over every in-range code, about \\d+ bytes of flash \\(8-bit AVR estimate\\); the file holds \\d+ bytes of C\\.$`));
      // The line is the channel's begin marker in the text the edit writes.
      const edit = JSON.stringify(resolved.edit);
      const written = (JSON.parse(edit) as { documentChanges: ({ edits?: { newText: string }[] })[] }).documentChanges.find((d) => d.edits)!.edits![0]!.newText;
      expect(written.split('\n')[args.line]).toMatch(/^\/\* thermoscribe:begin channel=housing /);
      const bytes = Number(/holds (\d+) bytes/.exec(args.message)![1]);
      expect(bytes).toBe(Buffer.byteLength(written, 'utf8'));
    } finally {
      await c.stop();
      fs.rmSync(fresh, { recursive: true, force: true });
    }
  });

  it('any other client is told the same summary in a message', async () => {
    const shown: string[] = [];
    client.conn.onNotification('window/showMessage', (p: { message: string }) => { shown.push(p.message); });
    const resolved = await client.request<{ edit?: unknown; command?: unknown }>(
      'codeAction/resolve', { title: 'Generate conversion code for housing', kind: 'refactor.generateConversion', data: { uri, channel: 'housing' } });
    expect(resolved.edit).toBeDefined();
    expect(resolved.command).toBeUndefined();
    // Notifications and responses keep their order on the wire: the message came first.
    expect(shown.some((m) => /^Wrote the conversion of 'housing' into pump_conversion\.c: /.test(m))).toBe(true);
  });
});
