// Issue #17 item 18: after `shutdown` the server refuses every request with InvalidRequest and
// publishes nothing more (LSP 3.17, "Shutdown Request": requests after it "should error with
// InvalidRequest"; ErrorCodes.InvalidRequest = -32600, JSON-RPC 2.0).
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, ROOT, TestClient } from './client';

const FIX = path.join(ROOT, 'tests', 'fixtures', 'features', 'lsp');
const MAIN = path.join(FIX, 'main.tsense');
let client: TestClient;

beforeAll(async () => {
  ensureBuilt();
  client = await TestClient.start({ rootDir: FIX, settings: { debounceMs: 20 } });
});
afterAll(async () => {
  await client.stop();
  expect(client.exited).toBe(0);
});

describe('after shutdown', () => {
  it('refuses requests with InvalidRequest and publishes no more diagnostics', async () => {
    const uri = client.open(MAIN);
    await client.diagnostics(uri, 1);
    const hover = { textDocument: { uri }, position: { line: 0, character: 0 } };
    await client.conn.sendRequest('textDocument/hover', hover);
    await client.conn.sendRequest('shutdown');
    await expect(client.conn.sendRequest('textDocument/hover', hover)).rejects.toMatchObject({ code: -32600 });
    await expect(client.conn.sendRequest('thermoscribe/runBudget', { uri, channel: 'x' })).rejects.toMatchObject({ code: -32600 });
    const before = client.publications(uri).length;
    client.change(uri, '# changed after shutdown\n');
    // A request answered after the change: the change notification has been handled by then.
    await expect(client.conn.sendRequest('textDocument/documentSymbol', { textDocument: { uri } })).rejects.toMatchObject({ code: -32600 });
    // Longer than the 20 ms debounce by far; nothing may arrive (a slow machine can only make this pass, never fail wrongly).
    await new Promise((r) => setTimeout(r, 500));
    expect(client.publications(uri).length).toBe(before);
  });
});
