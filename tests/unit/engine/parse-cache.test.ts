// The piecewise parse with a cache gives exactly the tree and problems of a whole parse,
// for the samples, every fixture, and random edits (property-based, fast-check).
import * as fs from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parse, ParseCache } from '../../../server/src/syntax/parse';

const ROOT = path.resolve(__dirname, '../../..');
const files = [
  ...fs.readdirSync(path.join(ROOT, 'samples')).filter((f) => f.endsWith('.tsense')).map((f) => path.join(ROOT, 'samples', f)),
  ...fs.readdirSync(path.join(ROOT, 'tests/fixtures/diagnostics')).filter((f) => f.endsWith('.tsense')).map((f) => path.join(ROOT, 'tests/fixtures/diagnostics', f)),
];

describe('ParseCache', () => {
  it('matches a whole parse on every sample and fixture', () => {
    for (const f of files) {
      const text = fs.readFileSync(f, 'utf8');
      expect(new ParseCache().parse(text), f).toEqual(parse(text));
    }
  });

  it('matches a whole parse across 2,000 successive random edits with a warm cache', () => {
    const base = fs.readFileSync(path.join(ROOT, 'samples/cold-chain-problems.tsense'), 'utf8');
    const cache = new ParseCache();
    cache.parse(base);
    const edit = fc.record({ at: fc.nat({ max: base.length }), del: fc.nat({ max: 20 }), ins: fc.oneof(fc.string({ maxLength: 10 }), fc.constantFrom('}', '{', '\n', 'channel x {', '\r\n', '# c', 'adc a {\n bits = 3\n}\n')) });
    let text = base;
    fc.assert(
      fc.property(edit, (e) => {
        const at = Math.min(e.at, text.length);
        text = text.slice(0, at) + e.ins + text.slice(at + e.del);
        expect(cache.parse(text)).toEqual(parse(text));
      }),
      { numRuns: 2000, seed: 11 },
    );
  });
});
