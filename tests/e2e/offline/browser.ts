// Drives code-server's page with Debian's chromium through playwright-core: (1) the in-editor suite
// through the smoke-test driver's payload, (2) a user's path through the workbench.
import * as path from 'node:path';
import { chromium, type BrowserContext, type Locator, type Page } from 'playwright-core';
import { CHROMIUM } from './paths';

export interface Outcome {
  name: string;
  ok: boolean;
  detail?: string;
}

/** Page loads wait for the document, not every resource, with a generous limit: the machine is shared and slow. */
export const GOTO = { timeout: 120_000, waitUntil: 'domcontentloaded' as const };

export async function launch(profileDir: string): Promise<BrowserContext> {
  return chromium.launchPersistentContext(profileDir, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1400, height: 900 },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
}

/**
 * Opens the workbench with a payload naming the extension under test and the compiled suite; the
 * workbench runs the suite's `run()` in the extension host and reports its exit code through
 * `codeAutomationExit` (0 passed, 1 failed). Resolves with that code, or null on time-out.
 */
export async function runSuiteThroughPayload(
  context: BrowserContext, baseUrl: string, workspace: string, extensionDir: string, suiteIndex: string,
  timeoutMs: number, onLine: (line: string) => void,
): Promise<number | null> {
  const page = await context.newPage();
  const authority = new URL(baseUrl).host;
  let finish: (code: number | null) => void = () => undefined;
  const exited = new Promise<number | null>((resolve) => { finish = resolve; });
  await page.exposeFunction('codeAutomationExit', (code: number) => finish(code));
  page.on('console', (msg) => {
    const text = msg.text();
    if (text.includes('[thermoscribe-e2e]')) onLine(text.slice(text.indexOf('[thermoscribe-e2e]')));
  });
  const payload = JSON.stringify([
    ['extensionDevelopmentPath', `vscode-remote://${authority}${extensionDir}`],
    ['extensionTestsPath', `vscode-remote://${authority}${suiteIndex}`],
  ]);
  const timer = setTimeout(() => finish(null), timeoutMs);
  try {
    await page.goto(`${baseUrl}/?folder=${encodeURIComponent(workspace)}&payload=${encodeURIComponent(payload)}`, GOTO);
    return await exited;
  } finally {
    clearTimeout(timer);
    await page.close().catch(() => undefined);
  }
}

const LIMIT = 60_000;

/** The user's path: open the sample, see squiggles, open Problems, hover a channel name. */
export async function walkAsUser(context: BrowserContext, baseUrl: string, workspace: string, outDir: string): Promise<Outcome[]> {
  const outcomes: Outcome[] = [];
  const page = await context.newPage();
  const step = async (name: string, fn: () => Promise<string | void>): Promise<boolean> => {
    const t0 = Date.now();
    const took = (): string => `${((Date.now() - t0) / 1000).toFixed(1)} s`;
    try {
      const detail = await fn();
      outcomes.push({ name, ok: true, detail: `${took()}${detail ? `; ${detail}` : ''}` });
      return true;
    } catch (err) {
      outcomes.push({ name, ok: false, detail: `${took()}; ${err instanceof Error ? err.message.split('\n')[0] : String(err)}` });
      return false;
    }
  };
  try {
    const opened = await step('workbench loads and Ctrl+P opens cold-chain-problems.tsense', async () => {
      await page.goto(`${baseUrl}/?folder=${encodeURIComponent(workspace)}`, GOTO);
      await page.locator('.monaco-workbench .part.statusbar').waitFor({ state: 'visible', timeout: LIMIT });
      await quickOpen(page, 'cold-chain-problems.tsense');
      await page.locator('.tab.active', { hasText: 'cold-chain-problems.tsense' }).first().waitFor({ timeout: LIMIT });
    });
    if (!opened) return outcomes;

    await step('a squiggle appears in the editor', async () => {
      const squiggle = page.locator('.monaco-editor .squiggly-error, .monaco-editor .squiggly-warning').first();
      await squiggle.waitFor({ state: 'attached', timeout: 120_000 });
      const errors = await page.locator('.monaco-editor .squiggly-error').count();
      const warnings = await page.locator('.monaco-editor .squiggly-warning').count();
      return `${errors} error and ${warnings} warning squiggles in view`;
    });

    await step('the Problems panel (Ctrl+Shift+M) lists diagnostics', async () => {
      await page.keyboard.press('Control+Shift+M');
      const rows = page.locator('.markers-panel .monaco-list-row');
      await rows.first().waitFor({ state: 'visible', timeout: LIMIT });
      const texts = await rows.allInnerTexts();
      const codes = [...new Set(texts.join('\n').match(/\b[a-z]+(?:-[a-z]+)+\b/g) ?? [])].filter((c) => !c.startsWith('cold-chain'));
      await page.screenshot({ path: path.join(outDir, 'problems.png') });
      if (!texts.some((t) => t.includes('bias-current-low'))) throw new Error(`rows listed but none mention bias-current-low: ${texts.slice(0, 3).join(' | ')}`);
      return `${texts.length} rows visible; codes seen: ${codes.join(', ')}`;
    });

    await step('hovering the channel name door_seal shows a hover', async () => {
      // Close the panel so that the line is in view, then point at the name.
      await page.keyboard.press('Control+Shift+M');
      const name = page.locator('.monaco-editor .view-line span', { hasText: /^door_seal$/ }).first();
      await name.waitFor({ state: 'visible', timeout: LIMIT });
      await hoverUntilShown(page, name);
      const text = (await page.locator('.monaco-hover:not(.hidden)').first().innerText()).replace(/\s+/g, ' ').trim();
      await page.screenshot({ path: path.join(outDir, 'hover.png') });
      if (text.length === 0) throw new Error('hover is empty');
      return text.slice(0, 160);
    });
  } finally {
    await page.screenshot({ path: path.join(outDir, 'last.png') }).catch(() => undefined);
    await page.close().catch(() => undefined);
  }
  return outcomes;
}

/**
 * Points the mouse at `target` until the editor shows a hover with content (not "Loading..."):
 * code lenses and inlay hints arriving after the pointer came to rest can move the line away from
 * under it, and the editor then shows no hover, so it points again until one shows.
 */
export async function hoverUntilShown(page: Page, target: Locator, limit = LIMIT): Promise<void> {
  // (A string: this runs in the page, and the project compiles without DOM types.)
  const shown = `(() => {
    const el = document.querySelector('.monaco-hover:not(.hidden)');
    const text = el ? el.innerText : '';
    return text.trim().length > 0 && !/Loading/.test(text);
  })()`;
  const deadline = Date.now() + limit;
  for (;;) {
    await page.mouse.move(0, 0);
    await target.hover();
    const ok = await page.waitForFunction(shown, undefined, { timeout: 10_000 }).then(() => true, () => false);
    if (ok) return;
    if (Date.now() > deadline) throw new Error(`no hover with content within ${limit} ms`);
  }
}

/** F1 and a command by its title; waits until the focused row is that command before Enter. */
export async function runCommand(page: Page, title: string): Promise<void> {
  await page.keyboard.press('F1');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ state: 'visible', timeout: LIMIT });
  await input.fill(`>${title}`);
  await page.locator('.quick-input-list .monaco-list-row.focused', { hasText: title.replace(/^.*: /, '') }).first().waitFor({ timeout: LIMIT });
  await page.keyboard.press('Enter');
}

/**
 * Closes every editor and editor group, answering "Don't Save" to any question about an unsaved
 * editor (the workspace is a temporary copy), until one empty group is left.
 */
export async function closeAllEditors(page: Page): Promise<void> {
  await runCommand(page, 'View: Close All Editor Groups');
  const dontSave = page.locator('.monaco-dialog-box .monaco-button', { hasText: "Don't Save" });
  const deadline = Date.now() + LIMIT;
  const closed = `document.querySelectorAll('.tabs-container .tab').length === 0 && document.querySelectorAll('.editor-group-container').length === 1`;
  for (;;) {
    const done = await page.waitForFunction(closed, undefined, { timeout: 5_000 }).then(() => true, () => false);
    if (done) return;
    if (await dontSave.first().isVisible()) await dontSave.first().click();
    if (Date.now() > deadline) throw new Error('the editors did not close');
  }
}

export async function quickOpen(page: Page, fileName: string): Promise<void> {
  await page.keyboard.press('Control+P');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ state: 'visible', timeout: LIMIT });
  await input.fill(fileName);
  // The list filters asynchronously: wait until the focused row is the file, or Enter on a stale
  // list (recently opened files) opens another one.
  await page.locator('.quick-input-list .monaco-list-row.focused', { hasText: fileName }).first().waitFor({ timeout: LIMIT });
  await page.keyboard.press('Enter');
}
