// Extreme values in every numeric field (#17 items 8, 9, 10): a property test (fast-check) puts zero,
// -0, denormals (1e-320), the largest doubles, huge and tiny magnitudes into each number of a spec
// with a junction, a thermistor and an RTD channel, and renders every output: diagnostics, the text
// report, the budget table, the comparison, JSON, hovers, inlay hints and the plot spec. Nothing
// throws, JSON stays valid, and no text shows NaN, Infinity, -0 or a figure with a huge exponent.
// A value outside a field's stated domain gets an out-of-domain diagnostic naming the range.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { fixedNumber, formatSI, trimNumber } from '../../../server/src/model/read-value';
import { allBlocks } from '../../../server/src/model/schema';
import { EXTREMES, FIRST_SLOTS, GARBAGE, OTHER_SLOTS, SLOTS, checkEachAlone, outputs, shownFigures, spec } from '../helpers/extreme-values';

describe('extreme values in every numeric field', () => {
  it('the one figure formatter never shows NaN, Infinity or -0', () => {
    for (const v of [NaN, Infinity, -Infinity, -0, -1e-320]) {
      expect(trimNumber(v, 3)).not.toMatch(/NaN|Infinity|^-0$/);
      expect(fixedNumber(v, 3)).not.toMatch(/NaN|Infinity|^-0(\.0*)?$/);
      expect(formatSI(v, 'V')).not.toMatch(/NaN|Infinity/);
    }
  });

  it('every quantity field of schema.ts states a finite domain', () => {
    for (const block of allBlocks().values()) {
      for (const f of block.fields) {
        if (f.form.form !== 'quantity') continue;
        expect(Number.isFinite(f.form.min) && Number.isFinite(f.form.max) && f.form.min < f.form.max, `${block.kind}.${f.name}`).toBe(true);
      }
    }
  });

  it('the clean template analyses without errors (so the extremes are what the test varies)', () => {
    const a = analyse({ path: '/virtual/h.tsense', text: spec(SLOTS) });
    expect(a.diagnostics.filter((d) => d.severity === 'error').map((d) => d.message)).toEqual([]);
    expect(a.channels.map((r) => r.channel.name)).toEqual(['cj', 'ct', 'cr']);
  });

  it('each extreme in each slot alone, the two groups together cover every slot once', () => {
    expect([...FIRST_SLOTS, ...OTHER_SLOTS]).toEqual(Object.keys(SLOTS));
    expect(FIRST_SLOTS).toContain('beta');
    expect(OTHER_SLOTS).toContain('r0');
  });

  it('each extreme in each junction and thermistor slot alone: an error diagnostic or sound figures, never garbage (the other slots: hostile-values-alone.test.ts)', () => {
    checkEachAlone(FIRST_SLOTS);
  }, 600_000);

  it('extremes in several slots at once (fast-check, 40 specs)', () => {
    const slot = fc.constantFrom(...Object.keys(SLOTS));
    fc.assert(
      fc.property(fc.dictionary(slot, fc.constantFrom(...EXTREMES), { maxKeys: 4 }), (over) => {
        const text = spec({ ...SLOTS, ...over });
        for (const o of outputs(text)) expect(shownFigures(o)).not.toMatch(GARBAGE);
      }),
      { numRuns: 40, seed: 17 },
    );
  }, 600_000);

  it('a value outside its domain is an out-of-domain error naming the range (#17 item 8 examples)', () => {
    const codes = (slot: string, x: string) => analyse({ path: '/virtual/h.tsense', text: spec({ ...SLOTS, [slot]: x }) }).diagnostics.filter((d) => d.severity === 'error');
    const ref = codes('ref', '1e308');
    expect(ref.map((d) => d.message)).toEqual(['reference must be from 0.001 to 1000 V (found 1e308 V)']);
    const vs = codes('vs', '1e308');
    expect(vs.every((d) => d.code === 'out-of-domain' && /from 0\.001 to 1000 V/.test(d.message))).toBe(true);
    const gain = codes('gain', '1e-320');
    expect(gain.map((d) => d.message)).toEqual(['gain must be from 0.001 to 10000 (found 1e-320)']);
    const ib = codes('ib', '1e-320');
    expect(ib.map((d) => d.message)).toEqual([expect.stringMatching(/^bias must be from 1e-12 to 1 A \(found 1e-320 uA/)]);
  });
});
