// Protocol tests of files changed on disk, through the real server process over stdio: a parts file
// that a spec `use`s but the editor has not opened is read from the disk; when the client's file
// watcher reports it changed (LSP 3.17 workspace/didChangeWatchedFiles, FileChangeType 2 = Changed;
// the extension watches **/*.tsense, client/src/disk-watch.ts), the spec is analysed again, also when
// the folder is reached through a symbolic link. The spec and parts are the invented bench logger of
// tests/fixtures/features/lsp. Waits on notifications, never on timers.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, ROOT, TestClient, uriOf, type LspDiagnostic } from './client';

const FIXTURE = path.join(ROOT, 'tests', 'fixtures', 'features', 'lsp');
let dir: string;
let client: TestClient;

const unknownSensor = (d: LspDiagnostic[]) => d.filter((x) => x.message.startsWith("no sensor named 'small_npn' ")).length;
const changed = (file: string) => void client.conn.sendNotification('workspace/didChangeWatchedFiles', { changes: [{ uri: uriOf(file), type: 2 }] });

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-disk-'));
  for (const f of ['main.tsense', 'parts.tsense']) fs.copyFileSync(path.join(FIXTURE, f), path.join(dir, f));
  client = await TestClient.start({ rootDir: dir, settings: { debounceMs: 0 } });
});

afterAll(async () => {
  await client.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('files changed on disk', () => {
  it('a used parts file that is not open: renaming its junction on disk breaks the spec, renaming it back mends it', async () => {
    const spec = path.join(dir, 'main.tsense');
    const parts = path.join(dir, 'parts.tsense');
    const good = fs.readFileSync(parts, 'utf8');
    const uri = client.open(spec);
    const before = await client.diagnostics(uri, 1);
    expect(unknownSensor(before)).toBe(0);

    fs.writeFileSync(parts, good.replace('junction small_npn', 'junction small_npn2'));
    let n = client.publications(uri).length;
    changed(parts);
    const broken = await client.diagnosticsWhere(uri, (d) => unknownSensor(d) > 0, n);
    expect(unknownSensor(broken)).toBe(2); // both channels that name small_npn

    fs.writeFileSync(parts, good);
    n = client.publications(uri).length;
    changed(parts);
    const mended = await client.diagnosticsWhere(uri, (d) => unknownSensor(d) === 0, n);
    expect(mended.map((d) => d.code)).toEqual(before.map((d) => d.code));
    client.close(uri);
  });

  it('the change reported through a link to the folder counts for the spec opened by its real path', async () => {
    const link = path.join(os.tmpdir(), `thsc-disk-link-${process.pid}`);
    fs.rmSync(link, { force: true });
    fs.symlinkSync(dir, link);
    try {
      const spec = path.join(dir, 'main.tsense');
      const parts = path.join(dir, 'parts.tsense');
      const good = fs.readFileSync(parts, 'utf8');
      const uri = client.open(spec);
      await client.diagnosticsWhere(uri, (d) => unknownSensor(d) === 0);
      fs.writeFileSync(parts, good.replace('junction small_npn', 'junction small_npn3'));
      const n = client.publications(uri).length;
      changed(path.join(link, 'parts.tsense'));
      const broken = await client.diagnosticsWhere(uri, (d) => unknownSensor(d) > 0, n);
      expect(unknownSensor(broken)).toBe(2);
      fs.writeFileSync(parts, good);
      client.close(uri);
    } finally {
      fs.rmSync(link, { force: true });
    }
  });
});
