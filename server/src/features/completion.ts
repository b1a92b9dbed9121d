// Completion by context, read from the text before the cursor (which is usually not valid yet):
// block keywords at top level; the fields of the enclosing block not yet given; after `key =`
// the names, options or forms the field takes; after a number the units of its dimension.
import type { Analysis } from '../analysis/result';
import type { BlockNode, Span } from '../syntax/ast';
import type { BiasDef, SensorDef } from '../model/types';
import { BIAS_FORMS, blockSpec, fieldSpec, type BlockKind, type FieldSpec } from '../model/schema';
import { kindTakes, sensorKind } from '../sensors/registry';
import type { SensorKind } from '../sensors/kind';
import { SUGGESTED_UNITS, type Dimension } from '../model/units';
import { blockSpecs, blockSnippet, fieldSnippet, needText, USE_DOC } from '../model/language';
import { blockAt } from './locate';
import { channelResult, formatSI, trimNumber } from '../analysis/figures';
import { effectiveOversamplingBits } from '../budget/oversampling';

export type CompletionKind = 'keyword' | 'field' | 'unit' | 'reference' | 'option' | 'form' | 'snippet';

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
    return /^[ \t]*[A-Za-z_]*$/.test(prefix) ? fieldNames(a, spec.kind, block, lineStart, wordSpan) : [];
  }
  const fs = fieldSpec(spec, assign[1]!);
  if (!fs) return [];
  return valueItems(a, fs, assign[2]!, offset, wordSpan, block);
}

function topLevel(replace: Span): CompletionItem[] {
  return [
    // One item per word, a snippet: the editor gets no snippet file of its own (package.json), so
    // `channel` and `use` are not listed twice.
    ...blockSpecs().map((b) => ({ label: b.kind, kind: 'snippet' as const, detail: `${b.kind} block`, documentation: b.doc, insertText: blockSnippet(b).join('\n'), snippet: true, replace })),
    { label: 'use', kind: 'snippet', detail: 'use a file of definitions', documentation: USE_DOC, insertText: 'use "${1:parts.tsense}"', snippet: true, replace },
  ];
}

function fieldNames(a: Analysis, kind: BlockKind, block: BlockNode, lineStart: number, replace: Span): CompletionItem[] {
  const spec = blockSpec(kind)!;
  // A channel whose sensor is known is not offered the fields only other kinds take (the reader
  // would refuse them: sensors/registry.ts kindTakes).
  const own = kind === 'channel' ? channelSensor(a, block).kind : undefined;
  const given = new Set<string>();
  for (const fl of block.fields) {
    if (fl.kind !== 'field' || (fl.span.start >= lineStart && fl.span.start <= replace.end)) continue;
    const fs = fieldSpec(spec, fl.key.text);
    if (fs) given.add(fs.name);
  }
  return spec.fields.filter((fs) => !given.has(fs.name) && (!own || kindTakes(own, fs.name))).map((fs) => {
    const met = kind === 'channel' ? metTarget(a, block, fs.name) : null;
    return {
      label: fs.name,
      kind: 'field' as const,
      detail: needText(fs),
      documentation: `${fs.doc}\n\nExample: \`${fs.example}\`${met ? `\n\nInserted: what this channel achieves now, \`${met}\`.` : ''}`,
      insertText: met ? `${fs.name} = \${1:${met}}` : fieldSnippet(fs),
      snippet: true,
      replace,
    };
  });
}

/**
 * A target a completed field starts with: what the channel achieves now (rounded up to two
 * significant digits), so that completing the field raises no warning by itself. Null when the
 * channel has no analysis (then no target check runs, and the schema's example is inserted).
 */
function metTarget(a: Analysis, block: BlockNode, field: string): string | null {
  const r = channelResult(a, block.name.text);
  if (!r) return null;
  if (field === 'resolution') {
    const perCount = r.summary.worst.celsiusPerCount / 2 ** effectiveOversamplingBits(r.channel);
    return perCount > 0 && Number.isFinite(perCount) ? `${roundUp(perCount)} °C per count` : null;
  }
  if (field === 'accuracy') {
    const k = r.worstCaseBudget?.stated.worstAbsK;
    return k !== undefined && k > 0 && Number.isFinite(k) ? `± ${roundUp(k)} °C` : null;
  }
  return null;
}

/** Rounded up to two significant digits: 0.0913 → 0.092 (never below the figure itself). */
function roundUp(x: number): string {
  const step = 10 ** (Math.floor(Math.log10(x)) - 1);
  return trimNumber(Math.ceil(x / step - 1e-9) * step, 2);
}

function valueItems(a: Analysis, fs: FieldSpec, value: string, offset: number, wordSpan: Span, block: BlockNode): CompletionItem[] {
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
  if (form.form === 'bias' && onlyWord) return biasForms(a, block, wordSpan);
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
    const met = metTarget(a, block, 'accuracy');
    const label = met ?? '± 0.5 °C';
    return [{ label, kind: 'form', detail: met ? 'accuracy target: what this channel achieves now' : 'accuracy target', documentation: fs.doc, insertText: label.replace(/^± (.*) °C$/, '± $${1:$1} °C'), snippet: true, replace: wordSpan }];
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

/** Illustrative values of each bias form's probe: the kind's own check (`biasProblem`) says whether it takes the form. */
const PROBE = { value: 1e4, tolerance: 0, span: { start: 0, end: 0 } };

/**
 * The bias forms (schema BIAS_FORMS, in that order), as snippets: those the channel's sensor kind
 * takes (its `biasProblem` and `twoCurrent`), or all five while the sensor is not known yet.
 */
function biasForms(a: Analysis, block: BlockNode, replace: Span): CompletionItem[] {
  const forms: (CompletionItem & { probe: BiasDef | 'two' })[] = [
    { label: 'resistor', kind: 'form', detail: BIAS_FORMS[0], documentation: 'A resistor from a supply rail; each value may carry a tolerance, e.g. `resistor 47k ± 1 % from 3.3 V ± 2 %`.', insertText: 'resistor ${1:47k} from ${2:3.3 V}', snippet: true, replace, probe: { kind: 'resistor', ohms: PROBE, supply: PROBE, span: PROBE.span } },
    { label: 'current', kind: 'form', detail: BIAS_FORMS[1], documentation: 'A constant-current source, e.g. `current 100 uA ± 2 %`.', insertText: 'current ${1:100 uA}', snippet: true, replace, probe: { kind: 'current', amps: PROBE, span: PROBE.span } },
    { label: 'divider', kind: 'form', detail: BIAS_FORMS[2], documentation: 'A thermistor or RTD in a divider with a fixed resistor R from a supply: `above` puts R on the supply side (the sensor to ground), `below` puts the sensor on the supply side, e.g. `divider 10k ± 0.1 % above from 3.3 V`.', insertText: 'divider ${1:10k} ${2|above,below|} from ${3:3.3 V}', snippet: true, replace, probe: { kind: 'divider', ohms: PROBE, supply: PROBE, position: 'above', span: PROBE.span } },
    { label: 'currents', kind: 'form', detail: BIAS_FORMS[3], documentation: 'Two currents switched in turn (the two-current method): the channel reads the difference of the two voltages, e.g. `currents 10 uA and 100 uA`.', insertText: 'currents ${1:10 uA} and ${2:100 uA}', snippet: true, replace, probe: 'two' },
    { label: 'resistors', kind: 'form', detail: BIAS_FORMS[4], documentation: 'Two resistors from one supply, switched in turn (the two-current method), e.g. `resistors 330k and 33k from 3.3 V`.', insertText: 'resistors ${1:330k} and ${2:33k} from ${3:3.3 V}', snippet: true, replace, probe: 'two' },
  ];
  const { sensor, kind } = channelSensor(a, block);
  return forms
    .filter((f) => !sensor || !kind || (f.probe === 'two' ? kind.twoCurrent : kind.biasProblem(sensor, f.probe) === null))
    .map(({ probe: _probe, ...item }) => item);
}

/** The sensor a channel block names, and its kind, when the spec defines that sensor. */
function channelSensor(a: Analysis, block: BlockNode): { sensor?: SensorDef; kind?: SensorKind } {
  const field = block.fields.find((f) => f.kind === 'field' && f.key.text === 'sensor' && f.value[0]?.kind === 'word');
  const word = field?.kind === 'field' ? field.value[0] : undefined;
  const sensor = word?.kind === 'word' ? a.model.sensors.get(word.text) : undefined;
  return sensor ? { sensor, kind: sensorKind(sensor.kind) } : {};
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
      if (/^[ \t]*currents?\b/.test(before)) return 'current';
      if (/\bfrom[ \t]*$/.test(before)) return 'voltage';
      if (/^[ \t]*(?:resistors?|divider)[ \t]*$/.test(before) || /^[ \t]*resistors\b.*\band[ \t]*$/.test(before)) return 'resistance';
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
