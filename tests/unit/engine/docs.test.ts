// README.md's generated reference sections match the engine's tables (run `npm run docs`).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { expect, it } from 'vitest';
import { renderReadme } from '../../../scripts/gen-docs';

it('README reference sections are up to date (npm run docs regenerates them)', () => {
  const p = path.resolve(__dirname, '../../../README.md');
  const text = fs.readFileSync(p, 'utf8');
  expect(renderReadme(text)).toBe(text);
});
