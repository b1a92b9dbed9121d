// An isolated code-server: its own HOME, XDG folders, user data and extensions, served on a free
// loopback port in its own process group so that the whole tree can be ended by the group id.
import * as path from 'node:path';
import * as net from 'node:net';
import * as http from 'node:http';
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { createWriteStream, mkdirSync, writeFileSync } from 'node:fs';
import { CODE_SERVER, NODE_BIN } from './paths';

export interface Sandbox {
  tmp: string;
  config: string;
  userData: string;
  extensions: string;
  env: NodeJS.ProcessEnv;
}

export function makeSandbox(tmp: string, extraEnv: Record<string, string>): Sandbox {
  const home = path.join(tmp, 'home');
  const sandbox: Sandbox = {
    tmp,
    config: path.join(tmp, 'config.yaml'),
    userData: path.join(tmp, 'user-data'),
    extensions: path.join(tmp, 'extensions'),
    env: {
      ...process.env,
      HOME: home,
      XDG_CONFIG_HOME: path.join(home, '.config'),
      XDG_DATA_HOME: path.join(home, '.local', 'share'),
      XDG_CACHE_HOME: path.join(home, '.cache'),
      XDG_STATE_HOME: path.join(home, '.local', 'state'),
      XDG_RUNTIME_DIR: path.join(tmp, 'runtime'),
      // code-server needs the Node it was installed with.
      PATH: `${NODE_BIN}${path.delimiter}${process.env.PATH ?? ''}`,
      ...extraEnv,
    },
  };
  for (const dir of [home, path.join(home, '.config'), path.join(home, '.local', 'share'), path.join(home, '.cache'), path.join(home, '.local', 'state'), path.join(tmp, 'runtime'), sandbox.extensions, path.join(sandbox.userData, 'User')]) {
    mkdirSync(dir, { recursive: true, mode: 0o700 });
  }
  writeFileSync(sandbox.config, 'auth: none\n');
  writeFileSync(path.join(sandbox.userData, 'User', 'settings.json'), JSON.stringify({
    'workbench.startupEditor': 'none',
    'telemetry.telemetryLevel': 'off',
    'extensions.autoUpdate': false,
    'extensions.autoCheckUpdates': false,
    'update.mode': 'none',
    'security.workspace.trust.enabled': false,
    'workbench.tips.enabled': false,
    'window.restoreWindows': 'none',
    // Keep the screenshots on the editor: no chat side bar.
    'chat.disableAIFeatures': true,
    'workbench.secondarySideBar.defaultVisibility': 'hidden',
  }, null, 2) + '\n');
  return sandbox;
}

function baseArgs(s: Sandbox): string[] {
  return ['--config', s.config, '--user-data-dir', s.userData, '--extensions-dir', s.extensions];
}

export function installExtension(s: Sandbox, vsix: string): void {
  const r = spawnSync(CODE_SERVER, [...baseArgs(s), '--install-extension', vsix], { env: s.env, encoding: 'utf8', timeout: 120_000 });
  if (r.status !== 0) throw new Error(`code-server --install-extension failed (${r.status ?? r.signal}): ${r.stderr || r.stdout}`);
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.unref();
    srv.on('error', reject);
    srv.listen(0, '127.0.0.1', () => {
      const addr = srv.address();
      const port = typeof addr === 'object' && addr ? addr.port : 0;
      srv.close(() => resolve(port));
    });
  });
}

export interface Served {
  child: ChildProcess;
  port: number;
  url: string;
}

export function serve(s: Sandbox, port: number, workspace: string, logFile: string): Served {
  const log = createWriteStream(logFile);
  const child = spawn(CODE_SERVER, [
    ...baseArgs(s),
    '--bind-addr', `127.0.0.1:${port}`,
    '--auth', 'none',
    '--disable-telemetry',
    '--disable-update-check',
    '--disable-workspace-trust',
    '--disable-getting-started-override',
    '--vscode-option', 'enable-smoke-test-driver',
    workspace,
  ], { env: s.env, detached: true, stdio: ['ignore', 'pipe', 'pipe'] });
  child.stdout?.pipe(log);
  child.stderr?.pipe(log);
  return { child, port, url: `http://127.0.0.1:${port}` };
}

/** Resolves once the server answers its health check; polls on a short interval until `timeoutMs`. */
export async function waitUntilServing(served: Served, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  let exited = false;
  served.child.once('exit', () => { exited = true; });
  while (Date.now() < deadline) {
    if (exited) throw new Error('code-server exited before it answered');
    const ok = await new Promise<boolean>((resolve) => {
      const req = http.get(`${served.url}/healthz`, (res) => { res.resume(); resolve(res.statusCode === 200); });
      req.on('error', () => resolve(false));
      req.setTimeout(2000, () => { req.destroy(); resolve(false); });
    });
    if (ok) return;
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`code-server did not answer within ${timeoutMs} ms`);
}

/** Ends code-server's whole process group: SIGTERM, then SIGKILL if it lingers. */
export async function stopGroup(child: ChildProcess): Promise<void> {
  const pid = child.pid;
  if (pid === undefined) return;
  const alive = (): boolean => {
    try { process.kill(-pid, 0); return true; } catch { return false; }
  };
  try { process.kill(-pid, 'SIGTERM'); } catch { return; }
  const deadline = Date.now() + 10_000;
  while (alive() && Date.now() < deadline) await new Promise((r) => setTimeout(r, 200));
  if (alive()) {
    try { process.kill(-pid, 'SIGKILL'); } catch { /* already gone */ }
  }
}
