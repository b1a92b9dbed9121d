// What editors and readers are told about the language, derived from the one schema (schema.ts)
// and unit table (units.ts): whether a field is needed, a new block's template, and the word lists
// of the TextMate grammar. Completion reads this; scripts/gen-docs.ts writes the snippets, the
// grammar and docs/reference.md from it.
import { allBlocks, BIAS_FORMS, kindWithArticle, type BlockSpec, type FieldSpec } from './schema';
import { DIMENSION_WORDS, UNIT_TEXTS } from './units';
import { kindsInWords } from '../sensors/registry';

/** Every block kind, in the schema's order (sensor kinds in the registry's, then adc, channel). */
export function blockSpecs(): BlockSpec[] {
  return [...allBlocks().values()];
}

/** Whether a field must be given: `required`, `default` (has one), `optional`, or one of alternative ways. */
export type Need = { need: 'required' } | { need: 'default'; text: string } | { need: 'optional' } | { need: 'alternative'; way: string };

export function needOf(f: FieldSpec): Need {
  if (f.defaultText !== undefined) return { need: 'default', text: f.defaultText };
  if (f.alternative !== undefined) return { need: 'alternative', way: f.alternative };
  return f.optional ? { need: 'optional' } : { need: 'required' };
}

/** One word for completion's detail and the reference's column. */
export function needText(f: FieldSpec): string {
  const n = needOf(f);
  if (n.need === 'default') return `default ${n.text}`;
  if (n.need === 'alternative') return `one way of several: ${n.way}`;
  return n.need;
}

/**
 * What a field with no value is asked for (`conversion =` at the end of a line): the forms it takes,
 * from its schema entry, then its example (model/block-reader.ts reports it).
 */
export function askForValue(f: FieldSpec): string {
  const form = f.form;
  const takes =
    form.form === 'choice' ? inWords(form.options.map((o) => `\`${o}\``))
    : form.form === 'ref' ? `the name of ${form.targets ? kindsInWords() : kindWithArticle(form.target)} definition`
    : form.form === 'bias' ? `one of its forms, ${inWords(BIAS_FORMS.map((b) => `\`${b}\``))} (which ones depends on the sensor's kind)`
    : form.form === 'phrase' ? `the form \`${form.syntax}\``
    : form.form === 'range' ? `a range \`low .. high\` of ${DIMENSION_WORDS[form.dimension]}`
    : form.form === 'resolution' ? 'degrees per count or counts per degree'
    : form.form === 'accuracy' ? 'a target `± t`'
    : DIMENSION_WORDS[form.dimension];
  return `${f.name} has no value: give ${takes}, such as \`${f.example}\``;
}

function inWords(list: string[]): string {
  return list.length < 2 ? list.join('') : `${list.slice(0, -1).join(', ')} or ${list[list.length - 1]}`;
}

/** The field's example value (the text after `=`). */
export function exampleValue(f: FieldSpec): string {
  return f.example.slice(f.example.indexOf('=') + 1).trim();
}

/** Snippet-syntax escapes (VS Code snippet grammar): `$`, `}` and `\\` in a placeholder, also `,` and `|` in a choice. */
function escapeSnippet(s: string, choice = false): string {
  return s.replace(choice ? /[$}\\|,]/g : /[$}\\]/g, (c) => `\\${c}`);
}

/**
 * The indentation of a field inside a block: the formatter writes it, the snippets use it, and
 * package.json gives the editor the same (`configurationDefaults` for `[tsense]`: tab size 2,
 * spaces), so typing, completion and formatting agree (tests/unit/features/editor-defaults.test.ts).
 */
export const INDENT = '  ';

/**
 * A new block as snippet text (`${1:name}` placeholders): the header and the block's template
 * fields, `=` aligned, each holding its example value (a choice offers its options).
 */
export function blockSnippet(b: BlockSpec): string[] {
  const fields = b.template.map((name) => b.fields.find((f) => f.name === name)!);
  const width = Math.max(...fields.map((f) => f.name.length));
  const lines = fields.map((f, i) => {
    const n = i + 2;
    const value = f.form.form === 'choice' ? `\${${n}|${[exampleValue(f), ...f.form.options.filter((o) => o !== exampleValue(f))].map((o) => escapeSnippet(o, true)).join(',')}|}` : `\${${n}:${escapeSnippet(exampleValue(f))}}`;
    return `${INDENT}${f.name.padEnd(width)} = ${value}`;
  });
  return [`${b.kind} \${1:name} {`, ...lines, '}'];
}

/** A field line as snippet text, its example value as the placeholder. */
export function fieldSnippet(f: FieldSpec): string {
  return `${f.name} = \${1:${escapeSnippet(exampleValue(f))}}`;
}

const unique = (xs: string[]) => [...new Set(xs)];
/** Longest first, so that a regular-expression alternation never stops at a shorter prefix. */
const longestFirst = (xs: string[]) => unique(xs).sort((a, b) => b.length - a.length || a.localeCompare(b));
const reEscape = (s: string) => s.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');
const alternation = (xs: string[]) => `(?:${longestFirst(xs).map(reEscape).join('|')})`;

/** The word lists of the language, each from the schema or the unit table. */
export function languageWords(): { blocks: string[]; fields: string[]; options: string[]; words: string[] } {
  const fields = blockSpecs().flatMap((b) => b.fields);
  return {
    blocks: blockSpecs().map((b) => b.kind),
    fields: unique(fields.flatMap((f) => [f.name, ...(f.aliases ?? [])])),
    options: unique(fields.flatMap((f) => (f.form.form === 'choice' ? f.form.options : []))),
    words: unique(fields.flatMap((f) => f.words ?? [])),
  };
}

/** The TextMate grammar of .tsense files (syntaxes/tsense.tmLanguage.json) for editors without semantic tokens. */
export function textMateGrammar(): object {
  const w = languageWords();
  const word = (xs: string[]) => `(?<![A-Za-z0-9_])${alternation(xs)}(?![A-Za-z0-9_])`;
  const prefix = `[${UNIT_TEXTS.prefixes.join('')}]`;
  const simple = `(?:${alternation(UNIT_TEXTS.whole)}|${prefix}?${alternation(UNIT_TEXTS.prefixable)})`;
  // After a number: a unit, one quotient of two (K/W), or a bare prefix of the resistor code (10k).
  const unit = `((?:${simple}(?:/${simple})?|${prefix})(?![A-Za-z0-9_]))`;
  // Units that are never a word of their own (a lone `C` or `A` may be a name or an option).
  const standalone = UNIT_TEXTS.whole.filter((u) => !/^[A-Za-z]$/.test(u));
  const numbered = (number: string, scope: string) => ({
    match: `(${number})(?:\\s*${unit})?`,
    captures: { 1: { name: `constant.numeric.${scope}.tsense` }, 2: { name: 'keyword.other.unit.tsense' } },
  });
  return {
    $schema: 'https://raw.githubusercontent.com/martinring/tmlanguage/master/tmlanguage.json',
    name: 'Thermoscribe spec',
    scopeName: 'source.tsense',
    comment: 'Generated from server/src/model/schema.ts and units.ts by `npm run docs`. Do not edit.',
    fileTypes: ['tsense'],
    patterns: [{ include: '#comment' }, { include: '#use' }, { include: '#block' }, { include: '#field' }, { include: '#value' }],
    repository: {
      comment: { match: '(#).*$', name: 'comment.line.number-sign.tsense', captures: { 1: { name: 'punctuation.definition.comment.tsense' } } },
      use: {
        match: '^\\s*(use)(?![A-Za-z0-9_])\\s*("[^"\\r\\n]*")?',
        captures: { 1: { name: 'keyword.control.import.tsense' }, 2: { patterns: [{ include: '#string' }] } },
      },
      block: {
        comment: 'A block runs to its closing brace, or to the next block header when the brace is missing (as the parser reads it).',
        begin: '^\\s*([A-Za-z_][A-Za-z0-9_]*)\\s+([A-Za-z_][A-Za-z0-9_]*)\\s*(\\{)',
        beginCaptures: {
          1: { patterns: [{ match: word(w.blocks), name: 'storage.type.block.tsense' }, { match: '.+', name: 'invalid.illegal.block-keyword.tsense' }] },
          2: { name: 'entity.name.type.block.tsense' },
          3: { name: 'punctuation.section.block.begin.tsense' },
        },
        end: '(\\})|(?=^\\s*[A-Za-z_][A-Za-z0-9_]*\\s+[A-Za-z_][A-Za-z0-9_]*\\s*\\{)',
        endCaptures: { 1: { name: 'punctuation.section.block.end.tsense' } },
        name: 'meta.block.tsense',
        patterns: [{ include: '#comment' }, { include: '#field' }, { include: '#value' }],
      },
      field: {
        begin: '(?:^|(?<=;)|(?<=\\{))\\s*([A-Za-z_][A-Za-z0-9_]*)\\s*(=)',
        beginCaptures: {
          1: { patterns: [{ match: word(w.fields), name: 'support.type.property-name.tsense' }, { match: '.+', name: 'variable.other.property.tsense' }] },
          2: { name: 'keyword.operator.assignment.tsense' },
        },
        end: '(;)|(?=#|\\})|$',
        endCaptures: { 1: { name: 'punctuation.terminator.tsense' } },
        name: 'meta.field.tsense',
        patterns: [{ include: '#value' }],
      },
      value: {
        patterns: [
          { include: '#string' },
          { match: '±|\\+/-|\\+-', name: 'keyword.operator.tolerance.tsense' },
          { match: '\\.\\.', name: 'keyword.operator.range.tsense' },
          { include: '#number' },
          { match: `(?<![A-Za-z0-9_])${alternation(standalone)}(?![A-Za-z0-9_])`, name: 'keyword.other.unit.tsense' },
          { match: word(w.words), name: 'keyword.other.tsense' },
          { match: word(w.options), name: 'constant.language.tsense' },
          { match: '[A-Za-z_][A-Za-z0-9_]*', name: 'variable.other.reference.tsense' },
        ],
      },
      number: {
        patterns: [
          { comment: 'IEC 60062 code: the letter is the decimal marker and multiplier (4k7, 1R5, 2M2).', ...numbered('[+-]?\\d+[RrkKMG]\\d+(?![A-Za-z0-9_])', 'iec') },
          numbered('[+-]?(?:\\d+(?:\\.\\d+)?|\\.\\d+)(?:[eE][+-]?\\d+)?', 'decimal'),
        ],
      },
      string: {
        match: '(")[^"\\r\\n]*(")',
        name: 'string.quoted.double.tsense',
        captures: { 1: { name: 'punctuation.definition.string.begin.tsense' }, 2: { name: 'punctuation.definition.string.end.tsense' } },
      },
    },
  };
}

/** The editor snippets (snippets/tsense.json): one per block kind, and `use`. */
export function snippets(): object {
  const out: Record<string, object> = {};
  for (const b of blockSpecs()) out[`${b.kind} block`] = { prefix: b.kind, description: b.doc, body: [...blockSnippet(b), '$0'] };
  out['use a file of definitions'] = { prefix: 'use', description: USE_DOC, body: ['use "${1:parts.tsense}"', '$0'] };
  return out;
}

export const USE_DOC = 'Brings in the definitions of another spec file (its sensors and ADCs, by name), e.g. `use "parts.tsense"`. The path is relative to this file and may not leave the workspace.';
