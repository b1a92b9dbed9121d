// The README's one screenshot of the editor (issue 14, item 16), taken in the offline editor: the
// invented cold-chain sample with its squiggles, the figures beside the fields (inlay hints) and the
// hover of the channel door_seal. Every run saves .test-output/e2e/editor-tour.png; the offline
// runner copies it to media/editor-tour.png (the committed file) only when asked:
//
//   THERMOSCRIBE_TOUR=1 npm run test:e2e
//
// so that ordinary runs leave the committed image alone. Look at the image before committing it.
import * as path from 'node:path';
import type { BrowserContext } from 'playwright-core';
import { closeAllEditors, GOTO, hoverUntilShown, quickOpen, type Outcome } from './offline/browser';

const LIMIT = 60_000;
const FIRST = 120_000;
export const TOUR_FILE = 'editor-tour.png';
/** The environment flag that lets a run replace media/editor-tour.png. */
export const TOUR_FLAG = 'THERMOSCRIBE_TOUR';

export async function tourStep(context: BrowserContext, baseUrl: string, workspace: string, outDir: string): Promise<Outcome[]> {
  const page = await context.newPage();
  const t0 = Date.now();
  const name = 'page: the README tour screenshot (squiggles, inlay figures, a channel hover)';
  let hidSidebar = false;
  try {
    await page.goto(`${baseUrl}/?folder=${encodeURIComponent(workspace)}`, GOTO);
    await page.locator('.monaco-workbench .part.statusbar').waitFor({ state: 'visible', timeout: FIRST });
    // One editor group, no tabs left by earlier steps (the suite opens files and panels beside).
    await closeAllEditors(page);
    await quickOpen(page, 'cold-chain-problems.tsense');
    await page.locator('.tab.active', { hasText: 'cold-chain-problems.tsense' }).first().waitFor({ timeout: LIMIT });
    // The server's answers: a squiggle, and a range line's figure beside the field.
    await page.locator('.monaco-editor .squiggly-warning, .monaco-editor .squiggly-error').first().waitFor({ state: 'attached', timeout: FIRST });
    await page.locator('.monaco-editor .view-line', { hasText: /worst\s[\d.]+\s°C\/count/ }).first().waitFor({ timeout: FIRST });
    // More room for the code and the hover: hide the side bar (Ctrl+B toggles it), put back after.
    const sidebar = page.locator('.part.sidebar');
    if (await sidebar.isVisible()) {
      await page.keyboard.press('Control+B');
      await sidebar.waitFor({ state: 'hidden', timeout: LIMIT });
      hidSidebar = true;
    }
    const channel = page.locator('.monaco-editor .view-line span', { hasText: /^door_seal$/ }).first();
    await channel.waitFor({ state: 'visible', timeout: LIMIT });
    await hoverUntilShown(page, channel);
    const text = (await page.locator('.monaco-hover:not(.hidden)').first().innerText()).replace(/\s+/g, ' ');
    if (!/channel door_seal/.test(text)) throw new Error(`the hover is not the channel's: ${text.slice(0, 160)}`);
    await page.screenshot({ path: path.join(outDir, TOUR_FILE) });
    return [{ name, ok: true, detail: `${((Date.now() - t0) / 1000).toFixed(1)} s; ${text.slice(0, 120)}` }];
  } catch (err) {
    await page.screenshot({ path: path.join(outDir, 'editor-tour-failed.png') }).catch(() => undefined);
    return [{ name, ok: false, detail: err instanceof Error ? err.message.split('\n')[0] : String(err) }];
  } finally {
    if (hidSidebar) {
      await page.mouse.move(0, 0).catch(() => undefined);
      await page.keyboard.press('Escape').catch(() => undefined);
      await page.keyboard.press('Control+B').catch(() => undefined);
      await page.locator('.part.sidebar').waitFor({ state: 'visible', timeout: LIMIT }).catch(() => undefined);
    }
    await page.close().catch(() => undefined);
  }
}
