// A minimal LSP client for protocol tests and the bench: starts the bundled server
// (`node dist/cli.js serve --stdio`) as a real process and talks JSON-RPC over its stdio.
// Waits are on events (publishDiagnostics, responses), never on timers.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import { SERVER_NODE_FLAGS } from '../../client/src/server-flags';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter, type MessageConnection } from 'vscode-jsonrpc/node';

/** The repository root: the nearest folder holding package.json (from tests/protocol, or from dist/ when bundled into the bench). */
export const ROOT = findRoot(__dirname);

function findRoot(from: string): string {
  for (let dir = from; ; dir = path.dirname(dir)) {
    if (fs.existsSync(path.join(dir, 'package.json'))) return dir;
    if (path.dirname(dir) === dir) return path.resolve(__dirname, '..', '..');
  }
}
export const CLI = path.join(ROOT, 'dist', 'cli.js');

export interface Position { line: number; character: number }
export interface Range { start: Position; end: Position }
export interface LspDiagnostic { range: Range; severity?: number; code?: string | number; message: string; data?: unknown }
interface Published { uri: string; version?: number; diagnostics: LspDiagnostic[] }

/** Builds dist/cli.js when it is missing or older than a server source (one builder at a time). */
export function ensureBuilt(): void {
  const newest = newestMtime(path.join(ROOT, 'server', 'src'));
  const built = fs.existsSync(CLI) ? fs.statSync(CLI).mtimeMs : 0;
  if (built >= newest) return;
  const lock = path.join(ROOT, 'dist', '.protocol-build-lock');
  fs.mkdirSync(path.dirname(lock), { recursive: true });
  for (;;) {
    try {
      fs.mkdirSync(lock);
      break;
    } catch {
      // Another test file is building: wait for it (bounded by the lock's age: a build takes seconds,
      // so a lock ten minutes old was left by a killed run, never by a slow one on a busy machine).
      const age = Date.now() - (fs.existsSync(lock) ? fs.statSync(lock).mtimeMs : 0);
      if (age > 10 * 60_000) fs.rmSync(lock, { recursive: true, force: true });
      Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 100);
      if (fs.existsSync(CLI) && fs.statSync(CLI).mtimeMs >= newest && !fs.existsSync(lock)) return;
    }
  }
  try {
    const r = spawnSync(process.execPath, ['scripts/build-grammar.mjs'], { cwd: ROOT, encoding: 'utf8' });
    const b = spawnSync(process.execPath, ['scripts/bundle.mjs'], { cwd: ROOT, encoding: 'utf8' });
    if (r.status !== 0 || b.status !== 0) {
      // Other engineers' work in progress may not build; an existing bundle is still usable.
      if (!fs.existsSync(CLI)) throw new Error(`build failed:\n${r.stderr}\n${b.stderr}`);
      process.stderr.write(`protocol tests: build failed, using the existing dist/cli.js:\n${r.stderr}${b.stderr}\n`);
    }
  } finally {
    fs.rmSync(lock, { recursive: true, force: true });
  }
}

function newestMtime(dir: string): number {
  let newest = 0;
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) newest = Math.max(newest, newestMtime(p));
    else if (!e.name.endsWith('.generated.js') && !e.name.endsWith('.generated.d.ts')) newest = Math.max(newest, fs.statSync(p).mtimeMs);
  }
  return newest;
}

export function uriOf(file: string): string {
  return pathToFileURL(path.resolve(file)).toString();
}

export interface StartOptions {
  rootDir?: string;
  /** Answer to workspace/configuration for the `thermoscribe` section. */
  settings?: Record<string, unknown>;
  initializationOptions?: Record<string, unknown>;
  /** Declare window.workDoneProgress (server-created progress); the test answers window/workDoneProgress/create. */
  workDoneProgress?: boolean;
  /** Node options before the server script, after the editor's own launch flags (e.g. --cpu-prof when profiling). */
  nodeArgs?: string[];
}

export class TestClient {
  readonly stderr: string[] = [];
  readonly logs: string[] = [];
  exited: number | null = null;
  private readonly published = new Map<string, Published[]>();
  private waiters: { test: (p: Published) => boolean; resolve: (p: Published) => void }[] = [];
  private versions = new Map<string, number>();
  private texts = new Map<string, string>();

  private constructor(readonly proc: ChildProcess, readonly conn: MessageConnection, readonly settings: Record<string, unknown>) {}

  static async start(opts: StartOptions = {}): Promise<TestClient> {
    // Started as the editor starts it (client/src/server-flags.ts).
    const proc = spawn(process.execPath, [...SERVER_NODE_FLAGS, ...(opts.nodeArgs ?? []), CLI, 'serve', '--stdio'], { cwd: ROOT, stdio: ['pipe', 'pipe', 'pipe'] });
    const conn = createMessageConnection(new StreamMessageReader(proc.stdout!), new StreamMessageWriter(proc.stdin!));
    const client = new TestClient(proc, conn, opts.settings ?? {});
    proc.stderr!.on('data', (d: Buffer) => client.stderr.push(d.toString()));
    proc.on('exit', (code) => (client.exited = code ?? -1));
    conn.onNotification('textDocument/publishDiagnostics', (p: Published) => {
      const list = client.published.get(p.uri) ?? [];
      list.push(p);
      client.published.set(p.uri, list);
      client.waiters = client.waiters.filter((w) => (w.test(p) ? (w.resolve(p), false) : true));
    });
    conn.onNotification('window/logMessage', (p: { message: string }) => {
      client.logs.push(p.message);
    });
    conn.onRequest('workspace/configuration', (p: { items: { section?: string }[] }) => p.items.map((i) => (i.section === 'thermoscribe' ? client.settings : null)));
    conn.onRequest('client/registerCapability', () => null);
    conn.onRequest('workspace/inlayHint/refresh', () => null);
    conn.listen();
    const rootDir = path.resolve(opts.rootDir ?? ROOT);
    await conn.sendRequest('initialize', {
      processId: process.pid,
      rootUri: uriOf(rootDir),
      workspaceFolders: [{ uri: uriOf(rootDir), name: 'root' }],
      initializationOptions: opts.initializationOptions,
      capabilities: {
        ...(opts.workDoneProgress ? { window: { workDoneProgress: true } } : {}),
        workspace: { configuration: true, workspaceEdit: { documentChanges: true, resourceOperations: ['create'] }, didChangeConfiguration: { dynamicRegistration: true } },
        textDocument: {
          documentSymbol: { hierarchicalDocumentSymbolSupport: true },
          publishDiagnostics: { versionSupport: true },
          rename: { prepareSupport: true },
        },
      },
    });
    await conn.sendNotification('initialized', {});
    return client;
  }

  request<R = unknown>(method: string, params: unknown): Promise<R> {
    return this.conn.sendRequest(method, params) as Promise<R>;
  }

  /** Opens a document (text from the file when not given) and returns its URI. */
  open(file: string, text?: string): string {
    const uri = uriOf(file);
    const t = text ?? fs.readFileSync(file, 'utf8');
    this.versions.set(uri, 1);
    this.texts.set(uri, t);
    void this.conn.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'tsense', version: 1, text: t } });
    return uri;
  }

  /** Replaces the whole text; returns the new version. */
  change(uri: string, text: string): number {
    const v = (this.versions.get(uri) ?? 1) + 1;
    this.versions.set(uri, v);
    this.texts.set(uri, text);
    void this.conn.sendNotification('textDocument/didChange', { textDocument: { uri, version: v }, contentChanges: [{ text }] });
    return v;
  }

  /** An incremental edit; returns the new version. */
  edit(uri: string, range: Range, newText: string): number {
    const v = (this.versions.get(uri) ?? 1) + 1;
    this.versions.set(uri, v);
    void this.conn.sendNotification('textDocument/didChange', { textDocument: { uri, version: v }, contentChanges: [{ range, text: newText }] });
    return v;
  }

  close(uri: string): void {
    void this.conn.sendNotification('textDocument/didClose', { textDocument: { uri } });
  }

  version(uri: string): number {
    return this.versions.get(uri) ?? 0;
  }

  /** Resolves with the first diagnostics published for `uri` at `version` or later (or any version when omitted), past or future. */
  diagnostics(uri: string, version?: number, after = 0): Promise<LspDiagnostic[]> {
    const test = (p: Published) => p.uri === uri && (version === undefined || (p.version ?? 0) >= version);
    const past = (this.published.get(uri) ?? []).slice(after).find(test);
    if (past) return Promise.resolve(past.diagnostics);
    return new Promise((resolve) => this.waiters.push({ test, resolve: (p) => resolve(p.diagnostics) }));
  }

  /** Resolves with the first diagnostics published for `uri` (past index `after`) that satisfy `pred`. */
  diagnosticsWhere(uri: string, pred: (d: LspDiagnostic[]) => boolean, after = 0): Promise<LspDiagnostic[]> {
    const test = (p: Published) => p.uri === uri && pred(p.diagnostics);
    const past = (this.published.get(uri) ?? []).slice(after).find(test);
    if (past) return Promise.resolve(past.diagnostics);
    return new Promise((resolve) => this.waiters.push({ test, resolve: (p) => resolve(p.diagnostics) }));
  }

  /** Every publication for a URI so far. */
  publications(uri: string): Published[] {
    return this.published.get(uri) ?? [];
  }

  async stop(): Promise<void> {
    if (this.exited === null) {
      const exited = new Promise<void>((resolve) => this.proc.once('exit', () => resolve()));
      try {
        await this.conn.sendRequest('shutdown');
        await this.conn.sendNotification('exit');
      } catch {
        this.proc.kill();
      }
      await exited;
    }
    this.conn.dispose();
  }
}

/** Text with the `|` cursor marker removed, and the marker's line/character. */
export function cursor(marked: string): { text: string; position: Position; offset: number } {
  const offset = marked.indexOf('|');
  if (offset < 0) throw new Error('no | cursor marker in the fixture');
  const text = marked.slice(0, offset) + marked.slice(offset + 1);
  const before = text.slice(0, offset).split('\n');
  return { text, position: { line: before.length - 1, character: before[before.length - 1]!.length }, offset };
}
