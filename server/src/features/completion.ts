// Completion by context, read from the text before the cursor (which is usually not valid yet):
// block keywords at top level; the fields of the enclosing block not yet given; after `key =`
// the names, options or forms the field takes; after a number the units of its dimension.
import type { Analysis } from '../analysis/result';
import type { BlockNode, Span } from '../syntax/ast';
import { blockSpec, fieldSpec, type BlockKind, type FieldSpec } from '../model/schema';
import { sensorKind } from '../sensors/registry';
import { SUGGESTED_UNITS, type Dimension } from '../model/units';
import { blockSpecs, blockSnippet, fieldSnippet, needText, USE_DOC } from '../model/language';
import { blockAt } from './locate';
import { formatSI } from '../analysis/figures';

export type CompletionKind = 'keyword' | 'field' | 'unit' | 'reference' | 'option' | 'form';

export interface CompletionItem {
  label: string;
  kind: CompletionKind;
  detail?: string;
  /** Markdown. */
  documentation?: string;
  /** Text inserted; a snippet (`${1:x}` placeholders) when `snippet` is true. */
  insertText?: string;
  snippet?: boolean;
  /** Text replaced by the item (the partial word before the cursor). */
  replace: Span;
}

const NUMBER_AT_END = /([+-]?(?:\d+[RrkKMG]\d+|\d*\.?\d+(?:[eE][+-]?\d+)?))([ \t]*)([^\s\d.+-][^\s]*)?$/;

export function completion(a: Analysis, offset: number): CompletionItem[] {
  const file = a.files[0];
  if (!file) return [];
  const text = file.text;
  const lineStart = Math.max(text.lastIndexOf('\n', offset - 1), text.lastIndexOf('\r', offset - 1)) + 1;
  const prefix = text.slice(lineStart, offset);
  if (prefix.includes('#')) return [];
  const word = /[A-Za-z_][A-Za-z0-9_]*$/.exec(prefix)?.[0] ?? '';
  const wordSpan = { start: offset - word.length, end: offset };
  const block = blockAt(file.parse.tree, offset);
  const headerEnd = block ? text.indexOf('{', block.span.start) : -1;
  if (!block || offset <= headerEnd) {
    return /^[ \t]*[A-Za-z_]*$/.test(prefix) ? topLevel(wordSpan) : [];
  }
  const spec = blockSpec(block.keyword.text);
  if (!spec) return [];
  const assign = /^[ \t]*([A-Za-z_][A-Za-z0-9_]*)[ \t]*=[ \t]*(.*)$/.exec(prefix);
  if (!assign) {
    return /^[ \t]*[A-Za-z_]*$/.test(prefix) ? fieldNames(spec.kind, block, lineStart, wordSpan) : [];
  }
  const fs = fieldSpec(spec, assign[1]!);
  if (!fs) return [];
  return valueItems(a, fs, assign[2]!, offset, wordSpan);
}

function topLevel(replace: Span): CompletionItem[] {
  return [
    ...blockSpecs().map((b) => ({ label: b.kind, kind: 'keyword' as const, detail: `${b.kind} block`, documentation: b.doc, insertText: blockSnippet(b).join('\n'), snippet: true, replace })),
    { label: 'use', kind: 'keyword', detail: 'use a file of definitions', documentation: USE_DOC, insertText: 'use "${1:parts.tsense}"', snippet: true, replace },
  ];
}

function fieldNames(kind: BlockKind, block: BlockNode, lineStart: number, replace: Span): CompletionItem[] {
  const spec = blockSpec(kind)!;
  const given = new Set<string>();
  for (const fl of block.fields) {
    if (fl.kind !== 'field' || (fl.span.start >= lineStart && fl.span.start <= replace.end)) continue;
    const fs = fieldSpec(spec, fl.key.text);
    if (fs) given.add(fs.name);
  }
  return spec.fields.filter((fs) => !given.has(fs.name)).map((fs) => ({
    label: fs.name,
    kind: 'field' as const,
    detail: needText(fs),
    documentation: `${fs.doc}\n\nExample: \`${fs.example}\``,
    insertText: fieldSnippet(fs),
    snippet: true,
    replace,
  }));
}

function valueItems(a: Analysis, fs: FieldSpec, value: string, offset: number, wordSpan: Span): CompletionItem[] {
  const form = fs.form;
  const onlyWord = /^[A-Za-z_]*$/.test(value);
  if (form.form === 'ref') {
    if (!onlyWord) return [];
    const kinds: BlockKind[] = form.targets ?? [form.target];
    return [...a.model.blocks.values()].filter((b) => kinds.includes(b.kind)).map((b) => ({
      label: b.node.name.text,
      kind: 'reference' as const,
      detail: `${b.kind}${b.file === a.path ? '' : ` from ${b.file.split(/[\\/]/).pop()}`}`,
      documentation: referenceDoc(a, b.kind, b.node.name.text),
      replace: wordSpan,
    }));
  }
  if (form.form === 'choice') {
    if (!onlyWord) return [];
    return form.options.map((o) => ({ label: o, kind: 'option' as const, detail: fs.name, documentation: fs.optionDocs?.[o] ?? fs.doc, replace: wordSpan }));
  }
  if (form.form === 'bias' && onlyWord) {
    return [
      { label: 'resistor', kind: 'form', detail: 'resistor R from V', documentation: 'A resistor from a supply rail; each value may carry a tolerance, e.g. `resistor 47k ± 1 % from 3.3 V ± 2 %`.', insertText: 'resistor ${1:47k} from ${2:3.3 V}', snippet: true, replace: wordSpan },
      { label: 'current', kind: 'form', detail: 'current I', documentation: 'A constant-current source, e.g. `current 100 uA ± 2 %`.', insertText: 'current ${1:100 uA}', snippet: true, replace: wordSpan },
      { label: 'divider', kind: 'form', detail: 'divider R above|below from V', documentation: 'A thermistor or RTD in a divider with a fixed resistor R from a supply: `above` puts R on the supply side (the sensor to ground), `below` puts the sensor on the supply side, e.g. `divider 10k ± 0.1 % above from 3.3 V`.', insertText: 'divider ${1:10k} ${2|above,below|} from ${3:3.3 V}', snippet: true, replace: wordSpan },
    ];
  }
  if (form.form === 'bias' && /^divider[ \t]+\S+(?:[ \t]*(?:±|\+\/-|\+-)[ \t]*\S+(?:[ \t]*%)?)?[ \t]+[A-Za-z]*$/.test(value) && !NUMBER_AT_END.test(value)) {
    return [
      { label: 'above', kind: 'keyword', detail: 'fixed resistor on the supply side', documentation: 'The fixed resistor sits between the supply and the ADC node; the sensor runs from the node to ground.', replace: wordSpan },
      { label: 'below', kind: 'keyword', detail: 'sensor on the supply side', documentation: 'The sensor sits between the supply and the ADC node; the fixed resistor runs from the node to ground.', replace: wordSpan },
    ];
  }
  if (form.form === 'bias' && /^divider[ \t]+.*\b(?:above|below)[ \t]+[A-Za-z]*$/.test(value)) {
    return [{ label: 'from', kind: 'keyword', detail: 'from a supply', documentation: 'Names the supply the divider is tied to: `from 3.3 V`.', replace: wordSpan }];
  }
  if (form.form === 'phrase' && fs.name === 'wiring' && /^[ \t]*$/.test(value)) {
    return [
      { label: '2 wires', kind: 'form', detail: 'both leads in series with the sensor', documentation: 'Both leads add their resistance to the sensor\'s, e.g. `2 wires 0.5 ohm` (per lead).', insertText: '2 wires ${1:0.5 ohm}', snippet: true, replace: wordSpan },
      { label: '3 wires', kind: 'form', detail: 'third lead cancels matched leads', documentation: 'The third lead cancels the lead resistance when the leads match, e.g. `3 wires 0.5 ohm`.', insertText: '3 wires ${1:0.5 ohm}', snippet: true, replace: wordSpan },
      { label: '4 wires', kind: 'form', detail: 'no lead error', documentation: 'Separate sense leads carry no current, so the leads add no error.', insertText: '4 wires', snippet: false, replace: wordSpan },
    ];
  }
  if (form.form === 'bias' && /^resistor[ \t]+\S+[ \t]+[A-Za-z]*$/.test(value) && !NUMBER_AT_END.test(value)) {
    return [{ label: 'from', kind: 'keyword', detail: 'from a supply', documentation: 'Names the supply the resistor is tied to: `from 3.3 V`.', replace: wordSpan }];
  }
  if (form.form === 'accuracy' && value.trim() === '') {
    return [{ label: '± 0.5 °C', kind: 'form', detail: 'accuracy target', documentation: fs.doc, insertText: '± ${1:0.5} °C', snippet: true, replace: wordSpan }];
  }
  const num = NUMBER_AT_END.exec(value);
  if (!num) return [];
  const partial = num[3] ?? '';
  const replace = { start: offset - partial.length, end: offset };
  const before = value.slice(0, value.length - num[0].length);
  if (form.form === 'resolution') {
    return [
      { label: '°C per count', kind: 'unit', detail: 'kelvin per ADC count', documentation: 'The value is the largest temperature step one count may span.', replace },
      { label: 'counts per °C', kind: 'unit', detail: 'ADC counts per kelvin', documentation: 'The value is the fewest counts one kelvin must give.', replace },
    ];
  }
  const dim = numberDimension(fs, before);
  if (!dim) return [];
  return SUGGESTED_UNITS[dim].map(([label, doc]) => ({ label, kind: 'unit' as const, detail: doc, replace }));
}

/** Dimension of a number being typed in a field, from its place in the value. */
function numberDimension(fs: FieldSpec, before: string): Dimension | null {
  if (/(±|\+\/-|\+-)[ \t]*$/.test(before)) return 'ratio';
  const form = fs.form;
  switch (form.form) {
    case 'quantity':
    case 'range':
      return form.dimension;
    case 'accuracy':
      return 'temperature';
    case 'bias':
      if (/^[ \t]*current\b/.test(before)) return 'current';
      if (/\bfrom[ \t]*$/.test(before)) return 'voltage';
      if (/^[ \t]*(?:resistor|divider)[ \t]*$/.test(before)) return 'resistance';
      return null;
    default:
      return null;
  }
}

function referenceDoc(a: Analysis, kind: BlockKind, name: string): string {
  const sensor = sensorKind(kind);
  if (sensor) {
    const s = a.model.sensors.get(name);
    return s ? sensor.summary(s) : `${kind} (has errors)`;
  }
  const adc = a.model.adcs.get(name);
  return adc ? `${adc.bits} bits, reference ${formatSI(adc.reference.value, 'V')}` : 'adc (has errors)';
}
