// Property-based robustness (fast-check): at least 10,000 random and mutated inputs through
// parse and analyse; nothing throws, and every problem has a range inside the document.
import * as fs from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';

const ROOT = path.resolve(__dirname, '../../..');
const SEED_TEXT = fs.readFileSync(path.join(ROOT, 'tests/fixtures/diagnostics/self-heating.quiet.tsense'), 'utf8');
const TOKENS = ['junction', 'adc', 'channel', 'use', '"x.tsense"', '{', '}', '=', '..', '±', '+/-', '%', '°C', 'K', 'V', 'uA', 'kΩ', 'ohm', 'K/W', '4k7', '1R5', '-40', '1e309', '0', '3.3', 'NaN', 'bias', 'resistor', 'from', 'current', 'range', 'sensor', 'q', 'a', 'per', 'count', '#', '\n', ' ', '\t', '\r\n', 'é', '😀', '\u0000'];

function check(text: string): void {
  const a = analyse({ path: '/virtual/p.tsense', text });
  for (const d of a.diagnostics) {
    expect(d.span.start).toBeGreaterThanOrEqual(0);
    expect(d.span.end).toBeGreaterThanOrEqual(d.span.start);
    expect(d.span.end).toBeLessThanOrEqual(text.length);
    // Figures never print as NaN/undefined (unless the user typed those words themselves).
    if (!/NaN/.test(text)) expect(d.message).not.toMatch(/NaN/);
    if (!/undefined/.test(text)) expect(d.message).not.toMatch(/undefined/);
  }
  for (const c of a.channels) for (const p of c.sweep) expect(Number.isFinite(p.volts) && Number.isFinite(p.amps)).toBe(true);
}

describe('parser and analyser never fail', () => {
  it('on 5,000 token soups', () => {
    fc.assert(fc.property(fc.array(fc.constantFrom(...TOKENS), { maxLength: 60 }), (toks) => check(toks.join(' '))), { numRuns: 5000, seed: 42 });
  });
  it('on 5,000 mutations of a valid spec', () => {
    const edit = fc.record({ at: fc.nat({ max: SEED_TEXT.length }), del: fc.nat({ max: 12 }), ins: fc.oneof(fc.string({ maxLength: 8 }), fc.constantFrom(...TOKENS)) });
    fc.assert(
      fc.property(fc.array(edit, { minLength: 1, maxLength: 4 }), (edits) => {
        let t = SEED_TEXT;
        for (const e of edits) t = t.slice(0, Math.min(e.at, t.length)) + e.ins + t.slice(Math.min(e.at, t.length) + e.del);
        check(t);
      }),
      { numRuns: 5000, seed: 7 },
    );
  });
});
