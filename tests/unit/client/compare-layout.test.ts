// The comparison panel's page laid out by a real browser engine (Debian's chromium through
// playwright-core, the one the editor suite uses) at the width the issue names: 800 px, with the
// padding and font size VS Code gives a webview (20 px each side, 13 px), and at 380 px (the panel
// beside the spec in an 800 px window). Issue #14 item 10: the
// last column must not be cut, and the caution must flow as one paragraph (no hard line breaks).
// The rows are the engine's own for the invented samples, so the cells are those the panel shows.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type Browser } from 'playwright-core';
import { COMPARE_EXPLAIN, COMPARE_HEADERS, compareCells, compareGroups } from '../../../server/src/engine';
import { CAUTION_PARAGRAPH } from '../../../server/src/report/caution';
import { comparePage, compareTables, type CompareAnswer } from '../../../client/src/compare-html';
import { analyseFile } from '../helpers/fixtures';

const ROOT = path.resolve(__dirname, '../../..');
const CHROMIUM = (JSON.parse(fs.readFileSync(path.join(ROOT, 'scripts', 'e2e', 'versions.json'), 'utf8')) as { chromium: string }).chromium;
const OUT = path.join(ROOT, '.test-output', 'compare-layout');
const haveBrowser = fs.existsSync(CHROMIUM);

function answerFor(sample: string): CompareAnswer {
  const a = analyseFile(path.join(ROOT, 'samples', sample));
  const groups = compareGroups(a);
  return {
    ok: true,
    groupNames: groups.map((g) => g.name),
    headers: [...COMPARE_HEADERS],
    groups: groups.map((g) => ({ name: g.name, rows: g.rows, cells: g.rows.map(compareCells) })),
    errors: 0,
    explain: COMPARE_EXPLAIN.join(' '),
    caution: CAUTION_PARAGRAPH,
  };
}

let browser: Browser | undefined;
beforeAll(async () => {
  if (!haveBrowser) return;
  browser = await chromium.launch({ executablePath: CHROMIUM, headless: true, args: ['--headless', '--no-sandbox', '--disable-gpu', '--no-first-run', '--disable-background-networking'] });
});
afterAll(async () => { await browser?.close(); });

describe.skipIf(!haveBrowser)('comparison panel layout', () => {
  // 800 px: a panel on its own; 380 px: beside the spec in a window of 800 px.
  for (const [sample, width] of [['sous-vide.tsense', 800], ['sous-vide.tsense', 380], ['greenhouse.tsense', 800], ['greenhouse.tsense', 380], ['kiln.tsense', 800], ['kiln.tsense', 380]] as const) {
    it(`${sample} at ${width} px: every table and its last column lie inside the panel; the caution is one paragraph`, async () => {
      const answer = answerFor(sample);
      expect(answer.groups!.length).toBeGreaterThan(0);
      const page = await browser!.newPage({ viewport: { width, height: 900 }, bypassCSP: true });
      try {
        await page.setContent(comparePage('Compare', compareTables(answer)));
        // What VS Code's webview adds around the page (its default stylesheet), common practice, no source.
        await page.addStyleTag({ content: 'html { font-size: 13px; } body { margin: 0; padding: 0 20px; font-size: 13px; font-family: sans-serif; }' });
        const m = await page.evaluate(`(() => {
          const width = document.documentElement.clientWidth;
          const shown = [...document.querySelectorAll('table')].filter((t) => getComputedStyle(t).display !== 'none');
          const rights = shown.map((t) => {
            const cells = [...t.querySelectorAll('tr')].map((r) => r.lastElementChild.getBoundingClientRect().right);
            return Math.max(t.getBoundingClientRect().right, ...cells);
          });
          const caution = document.querySelector('.caution');
          return { tables: shown.length, width, scroll: document.documentElement.scrollWidth, rights, caution: caution ? caution.innerHTML : '', whiteSpace: caution ? getComputedStyle(caution).whiteSpace : '' };
        })()`) as { tables: number; width: number; scroll: number; rights: number[]; caution: string; whiteSpace: string };
        fs.mkdirSync(OUT, { recursive: true });
        await page.screenshot({ path: path.join(OUT, `${sample.replace('.tsense', '')}-${width}.png`), fullPage: true });
        expect(m.tables).toBe(answer.groups!.length);
        expect(m.scroll, 'the page scrolls sideways').toBeLessThanOrEqual(m.width);
        for (const r of m.rights) expect(r, 'a table reaches past the panel').toBeLessThanOrEqual(m.width);
        expect(m.caution).not.toMatch(/\n|<br/);
        expect(m.whiteSpace).toBe('normal');
        expect(m.caution).toContain('local codes, the applicable safety standards and licensed professional practice');
      } finally {
        await page.close();
      }
    });
  }
});
