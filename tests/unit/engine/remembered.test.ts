// Reading sensors and ADCs again only when their block changed gives the same analysis as reading
// everything afresh: diagnostics and sweeps match a cache-free analysis across edits.
import * as fs from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyse, DocumentState } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { contentToken } from '../../../server/src/model/moved';

const ROOT = path.resolve(__dirname, '../../..');
const FILE = path.join(ROOT, 'samples/cold-chain-problems.tsense');

const moveEdit = (t: string) => t.replace('bias     = current 2 mA', 'bias     = current 2.5 mA');

describe('incremental analysis', () => {
  it('matches a fresh analysis after each of a series of edits', () => {
    const host = new DiskHost();
    const base = fs.readFileSync(FILE, 'utf8');
    const caches = { state: new DocumentState() };
    const edits = [
      (t: string) => t.replace('bits       = 10', 'bits       = 11'),
      (t: string) => t.replace('reference = 0.6 V', 'reference = 0.7 V'),
      (t: string) => t.replace('bits       = 11', 'bits       = 10'),
      (t: string) => '# a new first line\n' + t,
      (t: string) => t.replace('IS = ', 'IS = ').replace('bits      = 0', 'bits      = 3'),
      // Length-changing edits move every block below them: their definitions are moved copies.
      moveEdit,
      (t: string) => t.replace('range    = -30 °C .. 10 °C', 'range    = -30 °C .. 5 °C'),
      // An ADC above its channels changes length (channels that name it move and re-read it).
      (t: string) => t.replace('max_source = 10 kohm', 'max_source = 12.5 kohm'),
      // A used ADC's content changes with its length unchanged; then back again.
      (t: string) => t.replace('reference = 0.7 V', 'reference = 0.8 V'),
      (t: string) => t.replace('reference = 0.8 V', 'reference = 0.7 V'),
      // A channel points at another ADC, then a block moves to the end of the file.
      (t: string) => t.replace('adc        = coarse_adc', 'adc        = logger_adc'),
      (t: string) => {
        const block = t.slice(t.indexOf('adc coarse_adc {'), t.indexOf('# bias-current-low'));
        return t.replace(block, '') + '\n' + block;
      },
      // A name a channel uses disappears, then comes back.
      (t: string) => t.replace('adc logger_adc {', 'adc logger_adc2 {'),
      (t: string) => t.replace('adc logger_adc2 {', 'adc logger_adc {'),
      (t: string) => t.slice(t.indexOf('\n') + 1),
    ];
    let text = base;
    let previous: ReturnType<typeof analyse> | undefined;
    for (const edit of edits) {
      const before = text;
      text = edit(text);
      expect(text, `edit ${edits.indexOf(edit)} changes the text`).not.toBe(before);
      const warm = analyse({ path: FILE, text, root: path.dirname(FILE), host, ...caches });
      const cold = analyse({ path: FILE, text, root: path.dirname(FILE), host });
      expect(warm.diagnostics).toEqual(cold.diagnostics);
      expect(warm.channels.map((c) => c.sweep)).toEqual(cold.channels.map((c) => c.sweep));
      expect(warm.channels.map((c) => c.channel)).toEqual(cold.channels.map((c) => c.channel));
      expect(warm.channels.map((c) => c.worstCaseBudget)).toEqual(cold.channels.map((c) => c.worstCaseBudget));
      // A channel below an edit of another block only moved: same content token, so its sweep is kept.
      if (edit === moveEdit && previous) {
        const now = warm.channels.find((c) => c.channel.name === 'cabinet')!;
        const then = previous.channels.find((c) => c.channel.name === 'cabinet')!;
        expect(now.channel).not.toBe(then.channel);
        expect(now.channel.span.start).toBeGreaterThan(then.channel.span.start);
        expect(contentToken(now.channel)).toBe(contentToken(then.channel));
        expect(now.sweep).toBe(then.sweep);
      }
      previous = warm;
    }
  });

  it('matches a fresh analysis across 150 random edits (property-based, fast-check)', () => {
    const host = new DiskHost();
    const base = fs.readFileSync(FILE, 'utf8');
    const caches = { state: new DocumentState() };
    const edit = fc.record({
      at: fc.nat({ max: base.length }),
      del: fc.nat({ max: 12 }),
      ins: fc.oneof(fc.string({ maxLength: 6 }), fc.constantFrom('1', '0.5', ' mA', '\n', '# moved\n', '}', 'adc', 'generic_npn', 'channel x {\n')),
    });
    let text = base;
    analyse({ path: FILE, text, root: path.dirname(FILE), host, ...caches });
    fc.assert(
      fc.property(edit, (e) => {
        const at = Math.min(e.at, text.length);
        text = text.slice(0, at) + e.ins + text.slice(at + e.del);
        const warm = analyse({ path: FILE, text, root: path.dirname(FILE), host, ...caches });
        const cold = analyse({ path: FILE, text, root: path.dirname(FILE), host });
        expect(warm.diagnostics).toEqual(cold.diagnostics);
        expect(warm.channels.map((c) => c.channel)).toEqual(cold.channels.map((c) => c.channel));
        expect(warm.channels.map((c) => c.summary)).toEqual(cold.channels.map((c) => c.summary));
      }),
      { numRuns: 150, seed: 7 },
    );
  });
});
