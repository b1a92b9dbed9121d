// The files generated from the engine's tables (docs/reference.md, snippets/tsense.json,
// syntaxes/tsense.tmLanguage.json; scripts/gen-docs.ts) are up to date, and say what the schema says.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { generatedFiles } from '../../../scripts/gen-docs';
import { allBlocks } from '../../../server/src/model/schema';
import { CATALOGUE } from '../../../server/src/diagnostics/catalogue';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';

const ROOT = path.resolve(__dirname, '../../..');
const FILES = generatedFiles();

describe('generated files', () => {
  for (const { file, text } of FILES) {
    it(`${file} is up to date (npm run docs regenerates it)`, () => {
      expect(fs.readFileSync(path.join(ROOT, file), 'utf8')).toBe(text);
    });
  }

  it('the README points to the reference and holds no copy of its tables', () => {
    const readme = fs.readFileSync(path.join(ROOT, 'README.md'), 'utf8');
    expect(readme).toContain('docs/reference.md');
    expect(readme).not.toContain('| field |');
    expect(readme).not.toContain('| code | severity |');
  });

  it('the reference marks optional fields and alternative ways as not required', () => {
    const ref = FILES.find((f) => f.file === 'docs/reference.md')!.text;
    const row = (name: string) => ref.split('\n').find((l) => l.startsWith(`| \`${name}\``))!;
    for (const name of ['max_source', 'sample_cap', 'noise', 'resolution', 'accuracy', 'measured', 'compare_group', 'class', 'element']) expect(row(name), name).toContain('| optional |');
    for (const name of ['r25', 'beta', 'sh_a', 'point_1']) expect(row(name), name).toContain('in the way');
    for (const name of ['IS', 'r0', 'bits', 'reference', 'sensor', 'bias', 'range']) expect(row(name), name).toContain('**required**');
  });

  it('the grammar, the snippets and the catalogue know every block kind and field of the schema', () => {
    const grammar = JSON.parse(FILES.find((f) => f.file.endsWith('tmLanguage.json'))!.text);
    const snippets = JSON.parse(FILES.find((f) => f.file.endsWith('tsense.json'))!.text) as Record<string, { prefix: string }>;
    const blockRe = new RegExp(grammar.repository.block.beginCaptures['1'].patterns[0].match);
    const fieldRe = new RegExp(grammar.repository.field.beginCaptures['1'].patterns[0].match);
    for (const b of allBlocks().values()) {
      expect(blockRe.test(b.kind), b.kind).toBe(true);
      expect(Object.values(snippets).some((s) => s.prefix === b.kind), b.kind).toBe(true);
      for (const f of b.fields) for (const n of [f.name, ...(f.aliases ?? [])]) expect(n.match(fieldRe)?.[0], n).toBe(n);
    }
    expect(blockRe.test('sensor')).toBe(false);
    // The catalogue names no block kind (it cannot go stale); the message lists every one, from the schema.
    expect(CATALOGUE['unknown-block'].doc).not.toMatch(/junction|thermistor|channel/);
    const file = path.join(ROOT, 'samples/unknown-block.tsense');
    const message = analyse({ path: file, text: 'bogus x {\n}\n', root: ROOT, host: new DiskHost() })
      .diagnostics.find((d) => d.code === 'unknown-block')?.message;
    for (const b of allBlocks().values()) expect(message, b.kind).toContain(b.kind);
  });

  it('the grammar scopes units after numbers as the language reads them', () => {
    const grammar = JSON.parse(FILES.find((f) => f.file.endsWith('tmLanguage.json'))!.text);
    const decimal = new RegExp(grammar.repository.number.patterns[1].match, 'u');
    // Units the language reads (README "Units", units.ts): each is the second capture after a number.
    for (const [text, unit] of [['3.3 V', 'V'], ['10 kΩ', 'kΩ'], ['-40 °C', '°C'], ['350 K/W', 'K/W'], ['14 pF', 'pF'], ['1.11 eV', 'eV'], ['2 LSB', 'LSB'], ['10k', 'k'], ['100 uA', 'uA']] as const) {
      expect(decimal.exec(text)?.[2], text).toBe(unit);
    }
    expect(decimal.exec('10 from')?.[2]).toBeUndefined();
  });
});
