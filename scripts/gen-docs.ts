// Writes every file generated from the engine's own tables (schema.ts, units.ts, catalogue.ts):
// docs/reference.md, the editor snippets, the TextMate grammar and the parser's list of top-level words,
// so they cannot drift from the code. Run by `npm run docs` and by the build; a unit test fails when one is stale.
import * as fs from 'node:fs';
import * as path from 'node:path';
import '../server/src/sensors/kinds';
import { CATALOGUE } from '../server/src/diagnostics/catalogue';
import { blockKinds } from '../server/src/model/schema';
import { blockSpecs, needOf, snippets, textMateGrammar } from '../server/src/model/language';
import { DIMENSION_WORDS, UNIT_TEXTS } from '../server/src/model/units';

const ROOT = path.join(__dirname, '..');

function fieldReference(): string {
  const out: string[] = [];
  for (const b of blockSpecs()) {
    out.push(`### \`${b.kind}\``, '', b.doc, '');
    const ways = [...new Set(b.fields.flatMap((f) => (f.alternative === undefined ? [] : [f.alternative])))];
    if (ways.length > 0) out.push(`Give exactly one of these ways: ${ways.map((w) => `*${w}*`).join('; ')}.`, '');
    out.push('| field | needed | default | meaning | example |', '| --- | --- | --- | --- | --- |');
    for (const f of b.fields) {
      const name = [f.name, ...(f.aliases ?? [])].map((n) => `\`${n}\``).join(' or ');
      const n = needOf(f);
      const needed = n.need === 'required' ? '**required**' : n.need === 'alternative' ? `in the way *${n.way}*` : 'optional';
      const options = f.form.form === 'choice' ? ` One of: ${f.form.options.map((o) => `\`${o}\``).join(', ')}.` : '';
      out.push(`| ${name} | ${needed} | ${n.need === 'default' ? esc(n.text) : '—'} | ${esc(f.doc + options)} | \`${esc(f.example)}\` |`);
    }
    out.push('');
  }
  return out.join('\n');
}

function unitReference(): string {
  return [
    `Whole units: ${UNIT_TEXTS.whole.map((u) => `\`${u}\``).join(', ')}.`,
    '',
    `Units that take an SI prefix (${UNIT_TEXTS.prefixes.map((p) => `\`${p}\``).join(' ')}): ${UNIT_TEXTS.prefixable.map((u) => `\`${u}\``).join(', ')} (a prefixed \`F\` is the farad; a plain \`F\` is Fahrenheit). A bare prefix after a resistance is the resistor code's multiplier (\`10k\`). One quotient of two units is read as a thermal resistance (\`K/W\`).`,
    '',
    `Each field takes one of these dimensions: ${Object.values(DIMENSION_WORDS).join('; ')}.`,
  ].join('\n');
}

function diagnosticReference(): string {
  const out = ['| code | severity | meaning |', '| --- | --- | --- |'];
  for (const [code, info] of Object.entries(CATALOGUE)) out.push(`| \`${code}\` | ${info.severity} | **${esc(info.title)}.** ${esc(info.doc)} |`);
  return out.join('\n');
}

/** The words the parser's messages know may start a top-level line (the syntax layer reads no schema). */
function syntaxKeywords(): string {
  return [
    '// Generated from server/src/model/schema.ts by `npm run docs` (scripts/gen-docs.ts). Do not edit.',
    '',
    '/** Words that may start a top-level line: `use` and every block keyword. */',
    `export const TOP_WORDS: readonly string[] = [${['use', ...blockKinds()].map((w) => `'${w}'`).join(', ')}];`,
    '',
  ].join('\n');
}

function esc(s: string): string {
  return s.replace(/\|/g, '\\|').replace(/\n/g, ' ');
}

/** Every generated file: path relative to the repository, and its full text. */
export function generatedFiles(): { file: string; text: string }[] {
  const reference = [
    '# Thermoscribe spec language reference',
    '',
    '<!-- Generated from server/src/model/schema.ts, units.ts and server/src/checks/catalogue.ts by `npm run docs`. Do not edit. -->',
    '',
    'The blocks of a `.tsense` spec, the fields each takes, the units, and every diagnostic. The README',
    'introduces the language; this page is the full list.',
    '',
    '## Blocks and fields',
    '',
    'A field marked **required** must be given; an optional one may be left out, and then takes its',
    'default or, without one, is unchecked (its meaning says what that does).',
    '',
    fieldReference(),
    '## Units',
    '',
    unitReference(),
    '',
    '## Diagnostics',
    '',
    diagnosticReference(),
    '',
  ].join('\n');
  return [
    { file: 'docs/reference.md', text: reference },
    { file: 'snippets/tsense.json', text: JSON.stringify(snippets(), null, 2) + '\n' },
    { file: 'syntaxes/tsense.tmLanguage.json', text: JSON.stringify(textMateGrammar(), null, 2) + '\n' },
    { file: 'server/src/syntax/keywords.generated.ts', text: syntaxKeywords() },
  ];
}

if (require.main === module) {
  for (const { file, text } of generatedFiles()) {
    const p = path.join(ROOT, file);
    fs.mkdirSync(path.dirname(p), { recursive: true });
    if (!fs.existsSync(p) || fs.readFileSync(p, 'utf8') !== text) fs.writeFileSync(p, text);
  }
  console.log('docs: docs/reference.md, snippets/tsense.json, syntaxes/tsense.tmLanguage.json and server/src/syntax/keywords.generated.ts regenerated');
}
