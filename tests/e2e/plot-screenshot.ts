// The plot panel in the offline editor, as a user opens it: Ctrl+P greenhouse.tsense, the command
// palette's "Thermoscribe: Show Plot", the channel bench_air from the quick pick; waits for the
// webview's chart and saves .test-output/e2e/plot-panel.png. A separate step the offline runner can
// call (`plotPanelStep`), or on its own (packages and serves the extension itself):
//
//   npx tsx tests/e2e/plot-screenshot.ts
import * as path from 'node:path';
import { cpSync, mkdirSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { execFileSync } from 'node:child_process';
import type { BrowserContext, Page } from 'playwright-core';
import { missingPieces, OUTPUT_DIR, ROOT } from './offline/paths';
import { freePort, installExtension, makeSandbox, serve, stopGroup, waitUntilServing, type Served } from './offline/code-server';
import { GOTO, launch, type Outcome } from './offline/browser';

const LIMIT = 60_000;

export async function plotPanelStep(context: BrowserContext, baseUrl: string, workspace: string, outDir: string): Promise<Outcome[]> {
  const page = await context.newPage();
  const t0 = Date.now();
  const name = 'page: Thermoscribe: Show Plot opens the plot panel for bench_air';
  try {
    await page.goto(`${baseUrl}/?folder=${encodeURIComponent(workspace)}`, GOTO);
    await page.locator('.monaco-workbench .part.statusbar').waitFor({ state: 'visible', timeout: LIMIT });
    await quickInput(page, 'Control+P', 'greenhouse.tsense');
    // first(): the suite's generated C file opened beside the spec leaves two editor groups, each with an active tab.
    await page.locator('.tab.active', { hasText: 'greenhouse.tsense' }).first().waitFor({ timeout: LIMIT });
    // The code lens appears once the server has answered: the extension is active and the server running.
    await page.locator('.monaco-editor .codelens-decoration', { hasText: 'Show plots' }).first().waitFor({ timeout: 120_000 });
    await quickInput(page, 'F1', 'Thermoscribe: Show Plot');
    // The quick pick of channels.
    await page.locator('.quick-input-list .monaco-list-row', { hasText: 'bench_air' }).first().waitFor({ timeout: LIMIT });
    await page.keyboard.type('bench_air');
    await page.locator('.quick-input-list .monaco-list-row.focused', { hasText: 'bench_air' }).first().waitFor({ timeout: LIMIT });
    await page.keyboard.press('Enter');
    const frame = page.frameLocator('iframe.webview.ready').frameLocator('iframe#active-frame');
    await frame.locator('#chart[data-state="ready"] svg').waitFor({ timeout: LIMIT });
    const labels = (await frame.locator('#chart svg text').allTextContents()).filter((t): t is string => typeof t === 'string');
    await page.screenshot({ path: path.join(outDir, 'plot-panel.png') });
    if (!labels.some((t) => t.includes('worst case'))) throw new Error(`the chart has no "worst case" label (${labels.length} labels)`);
    return [{ name, ok: true, detail: `${((Date.now() - t0) / 1000).toFixed(1)} s; ${labels.length} labels in the chart` }];
  } catch (err) {
    await page.screenshot({ path: path.join(outDir, 'plot-panel-failed.png') }).catch(() => undefined);
    return [{ name, ok: false, detail: err instanceof Error ? err.message.split('\n')[0] : String(err) }];
  } finally {
    await page.close().catch(() => undefined);
  }
}

async function quickInput(page: Page, key: string, text: string): Promise<void> {
  await page.keyboard.press(key);
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ state: 'visible', timeout: LIMIT });
  await input.fill(key === 'F1' ? `>${text}` : text);
  // Wait until the focused row is the one asked for: the list filters asynchronously, and Enter
  // on a stale list (recently opened files) would open another file.
  await page.locator('.quick-input-list .monaco-list-row.focused', { hasText: text.replace(/^.*: /, '') }).first().waitFor({ timeout: LIMIT });
  await page.keyboard.press('Enter');
}

async function main(): Promise<number> {
  const missing = missingPieces();
  if (missing.length > 0) {
    console.log(`E2E plot: skipped, not installed: ${missing.join(', ')}`);
    return 0;
  }
  mkdirSync(OUTPUT_DIR, { recursive: true });
  execFileSync('npm', ['run', '--silent', 'package'], { cwd: ROOT, stdio: ['ignore', 'inherit', 'inherit'] });
  const tmp = mkdtempSync(path.join(tmpdir(), 'thermoscribe-plot-e2e-'));
  const sandbox = makeSandbox(tmp, {});
  const workspace = path.join(tmp, 'workspace');
  cpSync(path.join(ROOT, 'samples'), path.join(workspace, 'samples'), { recursive: true });
  installExtension(sandbox, path.join(ROOT, 'thermoscribe.vsix'));
  if (!readdirSync(sandbox.extensions).some((d) => d.startsWith('thermoscribe.thermoscribe-'))) throw new Error('the .vsix did not install');
  let served: Served | undefined;
  let outcomes: Outcome[] = [];
  try {
    served = serve(sandbox, await freePort(), workspace, path.join(OUTPUT_DIR, 'code-server-plot.log'));
    await waitUntilServing(served, 60_000);
    const context = await launch(path.join(tmp, 'chromium-profile'));
    try {
      outcomes = await plotPanelStep(context, served.url, workspace, OUTPUT_DIR);
    } finally {
      await context.close().catch(() => undefined);
    }
  } finally {
    if (served) await stopGroup(served.child);
    rmSync(tmp, { recursive: true, force: true, maxRetries: 3 });
  }
  for (const o of outcomes) console.log(`${o.ok ? 'PASS' : 'FAIL'} ${o.name}${o.detail ? ` — ${o.detail}` : ''}`);
  return outcomes.every((o) => o.ok) ? 0 : 1;
}

if (require.main === module) {
  main().then((code) => { process.exitCode = code; }, (err: unknown) => {
    console.error(`E2E plot: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
    process.exitCode = 1;
  });
}
