// Reading sensors and ADCs again only when their block changed gives the same analysis as reading
// everything afresh: diagnostics and sweeps match a cache-free analysis across edits.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse, ParseCache, SweepCache } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';

const ROOT = path.resolve(__dirname, '../../..');
const FILE = path.join(ROOT, 'samples/cold-chain-problems.tsense');

describe('incremental analysis', () => {
  it('matches a fresh analysis after each of a series of edits', () => {
    const host = new DiskHost();
    const base = fs.readFileSync(FILE, 'utf8');
    const caches = { cache: new SweepCache(), parseCache: new ParseCache() };
    const edits = [
      (t: string) => t.replace('bits       = 10', 'bits       = 11'),
      (t: string) => t.replace('reference = 0.6 V', 'reference = 0.7 V'),
      (t: string) => t.replace('bits       = 11', 'bits       = 10'),
      (t: string) => '# a new first line\n' + t,
      (t: string) => t.replace('IS = ', 'IS = ').replace('bits      = 0', 'bits      = 3'),
    ];
    let text = base;
    for (const edit of edits) {
      text = edit(text);
      const warm = analyse({ path: FILE, text, root: path.dirname(FILE), host, ...caches });
      const cold = analyse({ path: FILE, text, root: path.dirname(FILE), host });
      expect(warm.diagnostics).toEqual(cold.diagnostics);
      expect(warm.channels.map((c) => c.sweep)).toEqual(cold.channels.map((c) => c.sweep));
    }
  });
});
