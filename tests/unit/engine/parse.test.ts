// The grammar and the value readers: numbers, units, tolerances, ranges, error recovery.
import { describe, expect, it } from 'vitest';
import { parse } from '../../../server/src/syntax/parse';
import { analyse } from '../../../server/src/engine';
import type { BlockNode, FieldNode, QuantityTerm } from '../../../server/src/syntax/ast';
import { readUnit } from '../../../server/src/model/units';

function firstValue(src: string): FieldNode['value'] {
  const r = parse(`adc x {\n  v = ${src}\n}\n`);
  expect(r.problems).toEqual([]);
  const block = r.tree.items[0] as BlockNode;
  return (block.fields[0] as FieldNode).value;
}

describe('numbers', () => {
  // IEC 60062 resistor code: the letter stands for the decimal point and the multiplier.
  it.each([
    ['4k7', 4700], ['1R5', 1.5], ['2M2', 2.2e6], ['4K7', 4700], ['0R1', 0.1],
    ['10', 10], ['-40', -40], ['+3.5', 3.5], ['1.5e-3', 1.5e-3], ['2E6', 2e6], ['.5', 0.5],
  ])('%s reads as %d', (text, value) => {
    const t = firstValue(text)[0] as QuantityTerm;
    expect(t.kind).toBe('quantity');
    expect(t.number.value).toBeCloseTo(value, 12);
    expect(t.unit).toBeNull();
  });
  it('keeps a prefix letter as a unit: 47k, 100 uA, 10 µA, 3.3 V, 1.11eV', () => {
    expect((firstValue('47k')[0] as QuantityTerm).unit?.text).toBe('k');
    expect((firstValue('100 uA')[0] as QuantityTerm).unit?.text).toBe('uA');
    expect((firstValue('10 µA')[0] as QuantityTerm).unit?.text).toBe('µA');
    expect((firstValue('1.11eV')[0] as QuantityTerm).unit?.text).toBe('eV');
  });
  it('takes a unit of one quotient (mV/K, ppm/K) but not two slashes or a bare prefix over a unit', () => {
    expect((firstValue('-2 mV/K')[0] as QuantityTerm).unit?.text).toBe('mV/K');
    expect((firstValue('50 ppm/K')[0] as QuantityTerm).unit?.text).toBe('ppm/K');
    for (const bad of ['2 mV/K/s', '2 k/K']) {
      const r = parse(`adc x {\n  v = ${bad}\n}\n`);
      const block = r.tree.items[0] as BlockNode | undefined;
      const first = (block?.fields?.[0] as FieldNode | undefined)?.value?.[0] as QuantityTerm | undefined;
      expect(r.problems.length > 0 || first?.unit?.text !== bad.slice(2), bad).toBe(true);
    }
  });
  it('does not take a following word for a unit', () => {
    const v = firstValue('resistor 10 from 3.3 V');
    expect(v.map((t) => t.kind)).toEqual(['word', 'quantity', 'word', 'quantity']);
  });
});

describe('units', () => {
  // °F to K: T[K] = (T[°F] + 459.67) × 5/9 (definition of the Fahrenheit scale, NIST SP 811 §B.8).
  it('converts temperatures and prefixes', () => {
    const f = readUnit('°F');
    if (typeof f === 'string') throw new Error(f);
    expect(32 * f.scale + f.offset).toBeCloseTo(273.15, 10);
    expect(212 * f.scale + f.offset).toBeCloseTo(373.15, 10);
    const k = readUnit('kΩ');
    expect(typeof k !== 'string' && k.dimension === 'resistance' && k.scale === 1e3).toBe(true);
    const p = readUnit('pF');
    expect(typeof p !== 'string' && p.dimension === 'capacitance').toBe(true);
    expect(readUnit('K/W')).toMatchObject({ dimension: 'thermal-resistance', scale: 1 });
    expect(readUnit('furlong')).toMatch(/unknown unit/);
  });
});

describe('tolerances and ranges', () => {
  it('attaches ± and +/- to the quantity before it', () => {
    const [, a, , b] = firstValue('resistor 47k ± 1 % from 3.3 V +/- 2 %') as QuantityTerm[];
    expect(a!.tolerance?.number.value).toBe(1);
    expect(b!.tolerance?.unit?.text).toBe('%');
  });
  it('reads a range, the low end borrowing the high end\'s unit', () => {
    const a = analyse({ path: '/x/r.tsense', text: 'junction q {\n IS = 1 fA\n rated = -40 .. 125 °C\n}\n' });
    expect(a.diagnostics).toEqual([]);
    const q = a.model.sensors.get('q')!;
    expect(q.ratedLowK).toBeCloseTo(233.15, 10);
    expect(q.ratedHighK).toBeCloseTo(398.15, 10);
  });
  it('refuses temperatures at or below 0 K with the figure', () => {
    const a = analyse({ path: '/x/r.tsense', text: 'junction q {\n IS = 1 fA\n rated = -300 °C .. 125 °C\n}\n' });
    expect(a.diagnostics[0]!.code).toBe('out-of-domain');
    expect(a.diagnostics[0]!.message).toMatch(/from 1 to 2273\.15 K \(found -300 °C = -26\.85 K\)/);
  });
});

describe('error recovery', () => {
  const src = [
    'junction q {', '  IS = 10 fA', '  BF = 200 )', '}',
    'adc a {', '  bits = = 12', '  reference = 1.2 V', '}',
    'what is this',
    'channel good {', '  sensor = q', '  adc = a', '  bias = current 20 uA', '  range = 0 °C .. 40 °C', '}',
    'channel open {', '  sensor = q',
  ].join('\n');

  it('reports every syntax error in one pass, each with its own range', () => {
    const r = parse(src);
    expect(r.problems.map((p) => src.slice(p.span.start, p.span.end))).toEqual([')', '=', 'what is this', 'open']);
    expect(r.problems[0]!.message).toBe('expected another value or word, ";", a comment or the end of the line, found ")"');
    expect(r.problems[3]!.message).toMatch(/not closed/);
  });

  it('still analyses the intact channel', () => {
    const a = analyse({ path: '/x/e.tsense', text: src });
    // adc 'a' lost its bits line, so channel 'good' cannot resolve its ADC, but junction q
    // parsed around the bad line; a channel over intact definitions is analysed:
    const fixed = src.replace('bits = = 12', 'bits = 12');
    const b = analyse({ path: '/x/e.tsense', text: fixed });
    expect(b.channels.map((c) => c.channel.name)).toEqual(['good']);
    expect(a.diagnostics.filter((d) => d.code === 'syntax').length).toBe(4);
  });

  it('never throws on an empty or blank file', () => {
    for (const t of ['', '\n', '   ', '# only a comment', '\r\n\r\n', '}', '{']) expect(() => analyse({ path: '/x/b.tsense', text: t })).not.toThrow();
  });
});

// README "Blocks": fields one per line, or separated by `;` (issue 17, item 16).
describe('fields separated by ;', () => {
  it('reads two fields on one line, each with its own span', () => {
    const src = 'adc a {\n  bits = 12; reference = 1.2 V\n}\n';
    const r = parse(src);
    expect(r.problems).toEqual([]);
    const fields = (r.tree.items[0] as BlockNode).fields as FieldNode[];
    expect(fields.map((f) => src.slice(f.span.start, f.span.end))).toEqual(['bits = 12', 'reference = 1.2 V']);
  });

  it('takes a trailing ; before a comment, the line end or the closing brace, and a one-line block', () => {
    for (const src of ['adc a {\n  bits = 12;  # twelve\n  reference = 1.2 V;\n}\n', 'adc a { bits = 12; reference = 1.2 V; }\n', 'adc a { bits = 12; reference = 1.2 V }\n']) {
      const r = parse(src);
      expect(r.problems, src).toEqual([]);
      expect(((r.tree.items[0] as BlockNode).fields as FieldNode[]).map((f) => f.key.text), src).toEqual(['bits', 'reference']);
    }
  });

  it('gives a bad rest of the line its own error and keeps the field before it', () => {
    const src = 'adc a {\n  bits = 12; garbage here\n  reference = 1.2 V\n}\n';
    const r = parse(src);
    expect(r.problems).toHaveLength(1);
    expect(r.problems[0]!.span.start).toBeGreaterThan(src.indexOf('garbage'));
    expect((r.tree.items[0] as BlockNode).fields.map((f) => f.kind)).toEqual(['field', 'error', 'field']);
    expect(parse('adc a {\n  bits = 12;;\n}\n').problems).toHaveLength(1);
  });

  it('analyses a channel written with ; as the same channel written one field per line', () => {
    const lines = ['junction q {', '  kind = npn', '  IS = 10 fA', '  N = 1', '  BF = 200', '  EG = 1.11 eV', '  XTI = 3', '}', 'adc a {', '  bits = 12', '  reference = 1.2 V', '}', 'channel c {', '  sensor = q', '  adc = a', '  bias = current 20 uA', '  range = 0 °C .. 40 °C', '}', ''];
    const joined = lines.join('\n').replace('  bits = 12\n  reference', '  bits = 12; reference').replace('  sensor = q\n  adc = a', '  sensor = q; adc = a');
    const a = analyse({ path: '/x/s.tsense', text: lines.join('\n') });
    const b = analyse({ path: '/x/s.tsense', text: joined });
    expect(b.diagnostics.map((d) => d.code)).toEqual(a.diagnostics.map((d) => d.code));
    expect(b.channels.map((c) => c.summary.voltsMax)).toEqual(a.channels.map((c) => c.summary.voltsMax));
    expect(b.channels).toHaveLength(1);
  });
});

// A UTF-8 byte-order mark (U+FEFF, The Unicode Standard, section 23.8) at the start is skipped, and
// offsets keep counting it as the one UTF-16 unit it is, as LSP positions do (issue 17, item 16).
describe('byte-order mark', () => {
  const src = 'adc a {\n  bits = 12\n  reference = 1.2 V\n}\n';

  it('parses a spec that starts with a BOM without problems, offsets moved by one', () => {
    const plain = parse(src);
    const marked = parse('\uFEFF' + src);
    expect(marked.problems).toEqual([]);
    const f0 = (plain.tree.items[0] as BlockNode).fields[0] as FieldNode;
    const f1 = (marked.tree.items[0] as BlockNode).fields[0] as FieldNode;
    expect(f1.span).toEqual({ start: f0.span.start + 1, end: f0.span.end + 1 });
  });

  it('reports a syntax error after a BOM at the right offset', () => {
    const bad = '\uFEFFadc a {\n  bits = = 12\n}\n';
    const r = parse(bad);
    expect(r.problems).toHaveLength(1);
    expect(bad.slice(r.problems[0]!.span.start, r.problems[0]!.span.end)).toBe('=');
    expect(analyse({ path: '/x/bom.tsense', text: '\uFEFF# comment first\n' + src }).diagnostics.filter((d) => d.code === 'syntax')).toEqual([]);
  });
});
