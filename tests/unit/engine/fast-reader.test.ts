// The fast reader (server/src/syntax/fast-reader.ts) and the piecewise parse give exactly the tree
// and problems of the generated peggy parser (grammar/tsense.peggy) run on the whole text: on the
// samples, every fixture, and random and mutated inputs (fast-check). The reference is the grammar
// itself, the language's one definition.
import * as fs from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parse, parseWithGrammarOnly } from '../../../server/src/syntax/parse';
import { readPieceFast } from '../../../server/src/syntax/fast-reader';
import { generateSpec } from '../../../bench/generate';

const ROOT = path.resolve(__dirname, '../../..');

function specFiles(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...specFiles(p));
    else if (e.name.endsWith('.tsense')) out.push(p);
  }
  return out;
}

const FILES = [...specFiles(path.join(ROOT, 'samples')), ...specFiles(path.join(ROOT, 'tests/fixtures'))];
const TEXTS = FILES.map((f) => fs.readFileSync(f, 'utf8'));

// Pieces of the language where the reader's choices matter: numbers in every form, units and
// near-units, tolerances, ranges, strings, separators with and without spaces, comments, braces.
const TOKENS = [
  '4k7', '1R5', '2M2', '-4k7x', '10k', '1e', '1e-3', '.5', '5.', '-.5e+2', '+3', '+-2', '+/-', '±', '..', '...', '°C', '°', '℃', '℉', 'K/W',
  'mV/K', 'kΩ', 'µA', 'μA', 'uA', 'ohm', 'ohms', 'V', 'v', 'Vx', 'V2', '%', '%x', 'ppm', 'counts', 'per', 'count', 'from', '"a.tsense"', '"',
  'use', 'junction', 'adc', 'channel', 'x', '_y', 'bias', '=', ';', '#', '# c', '{', '}', ' ', '\t', '\u00a0', '\n', '\r\n', '\r', 'é', '😀',
];

// Tokens that can occur inside a value, with more weight on numbers, units and joiners.
const VALUE_TOKENS = [
  '4k7', '1R5', '-2M2', '4k7x', '10k', '10', '-40', '+3', '1e', '1e-3', '2E+2', '.5', '5.', '-.5e+2', '0', '..', '.', '±', '+/-', '+-', '+', '-',
  '°C', '°F', '°', '℃', 'K', 'K/W', 'mV/K', 'V/', 'kΩ', 'µA', 'μA', 'uA', 'ohm', 'ohms', 'V', 'Vx', 'V2', 'V_', '%', '%x', '%2', 'ppm', 'LSB',
  'counts', 'per', 'count', 'from', 'resistor', '"a.tsense"', '"', ';', '# c',
];

function expectSame(text: string): void {
  const reference = parseWithGrammarOnly(text);
  expect(parse(text)).toEqual(reference);
  // The reader gives up exactly on texts with a syntax problem (an error line or an open block),
  // so a reader that gave up too often would be caught here, not hidden by the fallback.
  const whole = readPieceFast(text, 0, text.length);
  expect(whole === null, 'reader gave up').toBe(reference.problems.length > 0);
  if (whole) expect(whole).toEqual(reference.tree.items);
}

describe('fast reader', () => {
  it('reads every sample and fixture as the grammar does, and reads the samples without falling back', () => {
    for (let i = 0; i < FILES.length; i++) expect(parse(TEXTS[i]!), FILES[i]).toEqual(parseWithGrammarOnly(TEXTS[i]!));
    // Well-formed samples are read by the fast reader whole (they have no error lines).
    for (const f of FILES.filter((f) => f.includes(`${path.sep}samples${path.sep}`) && !f.includes('problems'))) {
      const text = fs.readFileSync(f, 'utf8');
      expect(readPieceFast(text, 0, text.length), f).not.toBeNull();
    }
  });

  it('reads the generated benchmark spec as the grammar does', () => {
    const text = generateSpec(30, 2);
    expect(readPieceFast(text, 0, text.length)).not.toBeNull();
    expectSame(text);
  });

  it('gives the same tree as the grammar on 6,000 field values made of tricky tokens', () => {
    // Each gap is empty or a space: the grammar lets terms touch (3.3V, -40°C..125°C).
    const piece = fc.tuple(fc.constantFrom(...VALUE_TOKENS), fc.constantFrom('', '', ' '));
    fc.assert(
      fc.property(fc.array(piece, { minLength: 1, maxLength: 8 }), (parts) => {
        expectSame(`adc a {\n  bits = ${parts.map(([t, gap]) => t + gap).join('')}\n}\n`);
      }),
      { numRuns: 6000, seed: 5 },
    );
  });

  it('gives the same tree as the grammar on 6,000 mostly well-formed values (quantities, ranges, tolerances)', () => {
    const gap = fc.constantFrom('', ' ', '  ', '\t');
    const num = fc.constantFrom('4k7', '1R5', '2M2', '-1k2', '10', '-40', '+3', '0.5', '.25', '1e-3', '-2.5E+2', '3.', '1e');
    const unit = fc.option(fc.constantFrom('V', 'mV', 'uA', 'µA', 'kΩ', 'ohm', '°C', '°F', 'K', '%', 'K/W', 'mV/K', 'ppm', 'eV', 'counts', 'Vx', 'e'), { nil: '' });
    const quantity = fc.tuple(num, gap, unit).map(([n, g, u]) => (u ? n + g + u : n));
    const term = fc.oneof(
      quantity,
      fc.tuple(quantity, gap, fc.constantFrom('..', '±', '+/-', '+-', '...'), gap, quantity).map((p) => p.join('')),
      fc.tuple(fc.constantFrom('±', '+/-', '+-'), gap, quantity).map((p) => p.join('')),
      fc.constantFrom('resistor', 'from', 'per', 'count', 'current', '"parts.tsense"', '°C', '%', 'use'),
    );
    fc.assert(
      fc.property(fc.array(fc.tuple(term, gap), { minLength: 1, maxLength: 6 }), fc.constantFrom('\n', ' ; \n', ' # note\n', ' }', '\r\n'), (parts, ending) => {
        const value = parts.map(([t, g]) => t + g).join('');
        expectSame(`channel c {\n  range = ${value}${ending}${ending === ' }' ? '\n' : '}\n'}`);
      }),
      { numRuns: 6000, seed: 9 },
    );
  });

  it('gives the same tree as the grammar on 3,000 token soups', () => {
    fc.assert(fc.property(fc.array(fc.constantFrom(...TOKENS), { maxLength: 50 }), (toks) => expectSame(toks.join(' '))), { numRuns: 3000, seed: 6 });
  });

  it('gives the same tree as the grammar on 3,000 mutations of the samples and fixtures', () => {
    const edit = fc.record({ at: fc.nat(), del: fc.nat({ max: 12 }), ins: fc.oneof(fc.string({ maxLength: 6 }), fc.constantFrom(...TOKENS)) });
    fc.assert(
      fc.property(fc.nat({ max: TEXTS.length - 1 }), fc.array(edit, { minLength: 1, maxLength: 4 }), (which, edits) => {
        let t = TEXTS[which]!;
        for (const e of edits) {
          const at = e.at % (t.length + 1);
          t = t.slice(0, at) + e.ins + t.slice(at + e.del);
        }
        expectSame(t);
      }),
      { numRuns: 3000, seed: 8 },
    );
  });

  it('reads a last comment line without a line break as a comment (no error)', () => {
    // Found while writing the reader: the grammar used to report `# end` at the very end as an error line.
    for (const text of ['adc a {\n  bits = 10\n}\n# end', 'adc a { bits = 10 }  # end', '# only a comment']) {
      expect(parse(text).problems).toEqual([]);
      expectSame(text);
    }
  });
});
