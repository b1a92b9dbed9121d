// Issue 14, items 11 to 13: what the editor is told agrees with what the server writes.
// Common practice, no source: an editor's language defaults (`configurationDefaults`) set how a new
// line is indented; they must match the formatter and the snippets, or every completion re-indents.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { completion } from '../../../server/src/features/completion';
import { formatText } from '../../../server/src/features/format';
import { INDENT, blockSpecs, blockSnippet } from '../../../server/src/model/language';

const ROOT = path.resolve(__dirname, '..', '..', '..');
const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as {
  contributes: { snippets?: unknown; configurationDefaults?: Record<string, Record<string, unknown>> };
};
const FIXTURES = path.join(ROOT, 'tests', 'fixtures', 'features');

function load(text: string) {
  const file = path.join(FIXTURES, 'completion', 'inline.tsense');
  return analyse({ path: file, text, root: FIXTURES, host: { read: (p: string) => (fs.existsSync(p) ? fs.readFileSync(p, 'utf8') : undefined) } });
}

describe('editor defaults, completion and formatting agree', () => {
  it('package.json sets tab size and spaces for [tsense] to the formatter\'s indent', () => {
    const d = pkg.contributes.configurationDefaults?.['[tsense]'];
    expect(d?.['editor.tabSize']).toBe(INDENT.length);
    expect(d?.['editor.insertSpaces']).toBe(true);
    expect(d?.['editor.detectIndentation']).toBe(false);
    expect(formatText('adc a {\nbits = 12\n}\n')).toEqual({ ok: true, text: `adc a {\n${INDENT}bits = 12\n}\n` });
    for (const b of blockSpecs()) for (const line of blockSnippet(b).slice(1, -1)) expect(line.startsWith(INDENT) && line[INDENT.length] !== ' ').toBe(true);
  });

  it('top level lists each block keyword and use once, as a snippet (no snippet file contributed besides)', () => {
    expect(pkg.contributes.snippets).toBeUndefined();
    const a = load('ch\n');
    const items = completion(a, 2);
    const labels = items.map((i) => i.label);
    expect(new Set(labels).size).toBe(labels.length);
    expect(items.find((i) => i.label === 'channel')?.kind).toBe('snippet');
    expect(items.find((i) => i.label === 'use')?.kind).toBe('snippet');
  });
});

describe('a completed target raises no warning by itself (issue 14, item 12)', () => {
  const channel = (extra: string) => `use "../lsp/parts.tsense"\nchannel probe {\n  sensor = small_npn\n  adc    = board_adc\n  bias   = current 100 uA\n  range  = -40 °C .. 125 °C\n${extra}}\n`;
  /** The text with the snippet's first placeholder's default taken, as the editor would on Tab. */
  const expand = (snippet: string) => snippet.replace(/\$\{\d+:([^}]*)\}/g, '$1').replace(/\$\d/g, '');
  const warnings = (text: string) => load(text).diagnostics.filter((d) => d.code === 'resolution-short' || d.code === 'accuracy-unmet').map((d) => d.code);

  for (const field of ['resolution', 'accuracy']) {
    it(`the ${field} field, completed, is met by the channel`, () => {
      const text = channel('  \n');
      const offset = text.indexOf('  \n}') + 2;
      const item = completion(load(text), offset).find((i) => i.label === field);
      expect(item?.insertText).toBeDefined();
      // The schema's example for resolution (0.1 °C per count, the case), and a tighter
      // accuracy than the channel achieves, both warn: what was inserted before.
      const withExample = channel(`  ${field} = ${field === 'resolution' ? '0.1 °C per count' : '± 0.05 °C'}\n`);
      expect(warnings(withExample)).toContain(field === 'resolution' ? 'resolution-short' : 'accuracy-unmet');
      const completed = text.slice(0, offset) + expand(item!.insertText!) + text.slice(offset);
      expect(completed).toMatch(new RegExp(`${field} = [±\\d]`));
      expect(warnings(completed)).toEqual([]);
    });
  }

  it('the accuracy value after `accuracy =` is the same met figure', () => {
    const text = channel('  accuracy = \n');
    const offset = text.indexOf('accuracy = ') + 'accuracy = '.length;
    const item = completion(load(text), offset)[0]!;
    const completed = text.slice(0, offset) + expand(item.insertText!) + text.slice(offset);
    expect(warnings(completed)).toEqual([]);
  });
});
