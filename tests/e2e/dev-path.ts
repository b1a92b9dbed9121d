// Loading the extension from the repository, as a user of the extension development host does
// (issue #14 item 14): code-server with no extension installed, the workbench opened with only
// `extensionDevelopmentPath` (no test suite, no other flag) pointing at the checkout. A .tsense
// file must open as a Thermoscribe spec (not plain text) and get diagnostics. Saves
// .test-output/e2e/dev-path.png. A step the offline runner calls (`devPathStep`), or on its own:
//
//   npm run build && npx tsx tests/e2e/dev-path.ts
import * as path from 'node:path';
import { cpSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import type { BrowserContext } from 'playwright-core';
import { missingPieces, OUTPUT_DIR, ROOT } from './offline/paths';
import { freePort, makeSandbox, serve, stopGroup, waitUntilServing, type Served } from './offline/code-server';
import { launch, type Outcome } from './offline/browser';

const LIMIT = 60_000;

export async function devPathStep(context: BrowserContext, baseUrl: string, workspace: string, outDir: string): Promise<Outcome[]> {
  const page = await context.newPage();
  const t0 = Date.now();
  const name = 'page: loaded from the repository (extensionDevelopmentPath only), a .tsense opens as a spec with diagnostics';
  try {
    const authority = new URL(baseUrl).host;
    const payload = JSON.stringify([['extensionDevelopmentPath', `vscode-remote://${authority}${ROOT}`]]);
    await page.goto(`${baseUrl}/?folder=${encodeURIComponent(workspace)}&payload=${encodeURIComponent(payload)}`, { timeout: 120_000, waitUntil: 'domcontentloaded' });
    await page.locator('.monaco-workbench .part.statusbar').waitFor({ state: 'visible', timeout: LIMIT });
    await page.keyboard.press('Control+P');
    const input = page.locator('.quick-input-widget input');
    await input.waitFor({ state: 'visible', timeout: LIMIT });
    await input.fill('cold-chain-problems.tsense');
    await page.locator('.quick-input-list .monaco-list-row.focused', { hasText: 'cold-chain-problems.tsense' }).first().waitFor({ timeout: LIMIT });
    await page.keyboard.press('Enter');
    await page.locator('.tab.active', { hasText: 'cold-chain-problems.tsense' }).first().waitFor({ timeout: LIMIT });
    // The language mode in the status bar: the contribution's alias, not "Plain Text".
    const mode = page.locator('.statusbar-item[id="status.editor.mode"]');
    await mode.waitFor({ timeout: LIMIT });
    const deadline = Date.now() + LIMIT;
    let label = '';
    while (Date.now() < deadline) {
      label = (await mode.innerText()).trim();
      if (label === 'Thermoscribe spec') break;
      await page.waitForTimeout(250);
    }
    if (label !== 'Thermoscribe spec') throw new Error(`the language mode is '${label}', expected 'Thermoscribe spec'`);
    await page.locator('.monaco-editor .squiggly-error, .monaco-editor .squiggly-warning').first().waitFor({ state: 'attached', timeout: 120_000 });
    await page.screenshot({ path: path.join(outDir, 'dev-path.png') });
    return [{ name, ok: true, detail: `${((Date.now() - t0) / 1000).toFixed(1)} s; language mode '${label}', squiggles shown` }];
  } catch (err) {
    await page.screenshot({ path: path.join(outDir, 'dev-path-failed.png') }).catch(() => undefined);
    return [{ name, ok: false, detail: err instanceof Error ? err.message.split('\n')[0] : String(err) }];
  } finally {
    await page.close().catch(() => undefined);
  }
}

async function main(): Promise<number> {
  const missing = missingPieces();
  if (missing.length > 0) {
    console.log(`dev path: skipped, not installed: ${missing.join(', ')}`);
    return 0;
  }
  mkdirSync(OUTPUT_DIR, { recursive: true });
  const tmp = mkdtempSync(path.join(tmpdir(), 'thermoscribe-devpath-'));
  const sandbox = makeSandbox(tmp, {});
  const workspace = path.join(tmp, 'workspace');
  cpSync(path.join(ROOT, 'samples'), path.join(workspace, 'samples'), { recursive: true });
  let served: Served | undefined;
  let failed = 1;
  try {
    served = serve(sandbox, await freePort(), workspace, path.join(OUTPUT_DIR, 'code-server-dev-path.log'));
    await waitUntilServing(served, 60_000);
    const context = await launch(path.join(tmp, 'chromium-profile'));
    try {
      const out = await devPathStep(context, served.url, workspace, OUTPUT_DIR);
      for (const o of out) console.log(`${o.ok ? 'PASS' : 'FAIL'} ${o.name}${o.detail ? ` — ${o.detail}` : ''}`);
      failed = out.filter((o) => !o.ok).length;
    } finally {
      await context.close().catch(() => undefined);
    }
  } finally {
    if (served) await stopGroup(served.child);
    rmSync(tmp, { recursive: true, force: true, maxRetries: 3 });
  }
  return failed === 0 ? 0 : 1;
}

if (require.main === module) void main().then((code) => { process.exitCode = code; });
