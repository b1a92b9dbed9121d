// Runs the in-editor suite (tests/e2e/suite) in a desktop VS Code downloaded by @vscode/test-electron.
//
// Needs internet access to the VS Code download host, so it does not run on the offline CI machine
// (there, `npm run test:e2e` runs the same suite in code-server instead). On a developer machine:
//
//   npm run build && npx tsx tests/e2e/run-test-electron.ts
//
// VSCODE_VERSION picks the editor build (default: the lowest version the manifest supports,
// from engines.vscode; use `stable` for the newest). Under Linux without a display, wrap it in
// `xvfb-run -a`.
import * as path from 'node:path';
import { mkdtempSync, mkdirSync, readFileSync, writeFileSync, cpSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { runTests } from '@vscode/test-electron';
import { buildSuite, ROOT } from './build-suite';

async function main(): Promise<void> {
  const manifest = JSON.parse(readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { engines: { vscode: string } };
  const version = process.env.VSCODE_VERSION ?? manifest.engines.vscode.replace(/^\^/, '');
  const suite = await buildSuite();

  // A throw-away workspace holding a copy of the samples, and fresh user data.
  const tmp = mkdtempSync(path.join(tmpdir(), 'thermoscribe-electron-'));
  const workspace = path.join(tmp, 'workspace');
  cpSync(path.join(ROOT, 'samples'), path.join(workspace, 'samples'), { recursive: true });
  const userData = path.join(tmp, 'user-data');
  mkdirSync(path.join(userData, 'User'), { recursive: true });
  writeFileSync(path.join(userData, 'User', 'settings.json'), JSON.stringify({
    'workbench.startupEditor': 'none',
    'telemetry.telemetryLevel': 'off',
    'extensions.autoUpdate': false,
    'security.workspace.trust.enabled': false,
  }, null, 2));
  const results = path.join(tmp, 'results.json');

  try {
    await runTests({
      version,
      extensionDevelopmentPath: ROOT,
      extensionTestsPath: suite,
      extensionTestsEnv: { THERMOSCRIBE_E2E_RESULTS: results },
      launchArgs: [workspace, '--disable-extensions', '--user-data-dir', userData, '--skip-welcome', '--skip-release-notes'],
    });
    console.log('E2E (test-electron): all editor checks passed');
  } catch (err) {
    console.error(`E2E (test-electron): ${err instanceof Error ? err.message : String(err)}`);
    process.exitCode = 1;
  }
}

void main();
