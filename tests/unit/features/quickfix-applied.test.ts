// Issue 14, items 1 to 3: every quick fix of the quickfix fixtures, applied to the text and
// analysed again here (independently of the re-analysis the engine does before offering it),
// removes its diagnostic or, for a resolution fix that says it falls short, improves the figure.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse, type Analysis } from '../../../server/src/engine';
import { quickFixes } from '../../../server/src/features/quickfix';
import { E24 } from '../../../server/src/analysis/eseries';

const FIXTURES = path.resolve(__dirname, '..', '..', 'fixtures', 'features');
const DIR = path.join(FIXTURES, 'quickfix');

function load(file: string, overrides?: Map<string, string>): Analysis {
  const read = (p: string) => overrides?.get(p) ?? (fs.existsSync(p) ? fs.readFileSync(p, 'utf8') : undefined);
  return analyse({ path: file, text: read(file)!, root: FIXTURES, host: { read } });
}

/** The channel block (of the entry file) a diagnostic sits in. */
function channelAt(a: Analysis, offset: number): string | undefined {
  for (const item of a.files[0]!.parse.tree.items) if (item.kind === 'block' && offset >= item.span.start && offset <= item.span.end) return item.name.text;
  return undefined;
}

function codesIn(a: Analysis, channel: string): string[] {
  return a.diagnostics.filter((d) => d.file === a.path && channelAt(a, d.span.start) === channel).map((d) => d.code);
}

const worstPerCount = (a: Analysis, channel: string) => a.channels.find((r) => r.channel.name === channel)!.summary.worst.celsiusPerCount;

describe('quick fixes, applied, remove or improve their warning', () => {
  for (const name of fs.readdirSync(DIR).filter((n) => n.endsWith('.tsense'))) {
    it(name, () => {
      const file = path.join(DIR, name);
      const a = load(file);
      const fixes = quickFixes({ analysis: a, range: { start: 0, end: a.files[0]!.text.length }, reanalyse: (o) => load(file, o) });
      for (const fix of fixes) {
        const overrides = new Map<string, string>();
        // Edits of one file, applied from the end so earlier offsets stay valid.
        for (const e of [...fix.edits].sort((x, y) => y.span.start - x.span.start)) {
          const text = overrides.get(e.file) ?? a.files.find((x) => x.path === e.file)!.text;
          overrides.set(e.file, text.slice(0, e.span.start) + e.newText + text.slice(e.span.end));
        }
        const after = load(file, overrides);
        const channel = channelAt(a, fix.diagnostic.span.start);
        if (!channel || fix.diagnostic.code.startsWith('unknown-')) {
          expect(after.diagnostics.some((d) => d.code === fix.diagnostic.code && d.span.start === fix.diagnostic.span.start), fix.title).toBe(false);
          continue;
        }
        const before = codesIn(a, channel);
        const now = codesIn(after, channel);
        // Nothing new in the channel, and no error anywhere.
        expect(now.filter((c) => !before.includes(c)), fix.title).toEqual([]);
        expect(after.diagnostics.filter((d) => d.severity === 'error').length, fix.title).toBeLessThanOrEqual(a.diagnostics.filter((d) => d.severity === 'error').length);
        if (/needed\)/.test(fix.title)) {
          // Said to fall short: the warning stays, the figure improves.
          expect(worstPerCount(after, channel), fix.title).toBeLessThan(worstPerCount(a, channel));
        } else {
          expect(now.filter((c) => c === fix.diagnostic.code), fix.title).toEqual([]);
        }
      }
    });
  }

  it('offers the resolution fixes in the order an author tries them, each with its effect and cost', () => {
    const file = path.join(DIR, 'resolution-order.tsense');
    const a = load(file);
    const titles = quickFixes({ analysis: a, range: { start: 0, end: a.files[0]!.text.length }, reanalyse: (o) => load(file, o) })
      .filter((x) => x.diagnostic.code === 'resolution-short').map((x) => x.title);
    expect(titles.map((t) => t.split(' ')[0])).toEqual(['Set', 'Oversample', 'Narrow', 'Use']);
    // The divider resistor is an E24 value (IEC 60063; the mantissas as printed in that table, from memory).
    const code = /resistor to (\d+)k/.exec(titles[0]!)?.[1];
    expect(E24).toContain(Number(code) / 10);
    expect(titles[0]).toMatch(/current .* µA/);
    // Oversampling by n bits sums 4^n readings (Atmel application note AVR121).
    expect(titles[1]).toMatch(/by 3 bits: .* 64 readings summed per result, 64× the conversion time/);
    expect(titles[2]).toMatch(/no longer covered/);
  });

  it('a smaller common reference says what it does to clipping and who else reads the converter', () => {
    const file = path.join(DIR, 'reference-down.tsense');
    const a = load(file);
    const titles = quickFixes({ analysis: a, range: { start: 0, end: a.files[0]!.text.length }, reanalyse: (o) => load(file, o) }).map((x) => x.title);
    expect(titles[0]).toMatch(/^Set the reference of 'mcu_adc' to 1\.5 V: .* at its low tolerance, no clipping; also read by 1 other channel$/);
    expect(titles.some((t) => /Oversample/.test(t))).toBe(false);
  });

  it('proposes no converter wider than the 24 bits the spec accepts, and says the target is out of reach', () => {
    const file = path.join(DIR, 'bits-out-of-reach.tsense');
    const a = load(file);
    const d = a.diagnostics.find((x) => x.code === 'resolution-short')!;
    expect(d.message).not.toMatch(/ADC of \d+ bits would meet/);
    expect(d.message).toMatch(/out of reach of the converter: it would take \d+ bits \(bits accept 1 to 24\)/);
    expect(d.data?.['neededBits']).toBeUndefined();
    expect(quickFixes({ analysis: a, range: { start: 0, end: a.files[0]!.text.length }, reanalyse: (o) => load(file, o) })).toEqual([]);
  });

  it('an accuracy warning that names a calibration offers that calibration line, at the budget\'s temperatures', () => {
    const file = path.join(DIR, 'calibration.tsense');
    const a = load(file);
    const d = a.diagnostics.find((x) => x.code === 'accuracy-unmet')!;
    const named = /(two-point) calibration at (.*?) and (.*?) would meet it/.exec(d.message);
    expect(named).not.toBeNull();
    const fix = quickFixes({ analysis: a, range: d.span, reanalyse: (o) => load(file, o) }).find((x) => x.diagnostic.code === 'accuracy-unmet')!;
    expect(fix.edits[0]!.newText).toBe(`  calibration = two points at ${named![2]} and ${named![3]}\n`);
  });
});
