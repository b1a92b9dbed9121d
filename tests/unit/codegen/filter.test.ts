// The firmware filter's integer arithmetic (codegen/filter.ts), simulated exactly: the overflow
// bound of its proof holds for any input sequence (property test over every uint16_t sequence
// fast-check draws, and the adversarial ones), the recursive filter has no steady-state error, and
// channels without dynamics fields generate exactly the code they did before.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { filterReset, filterStateBound, filterUpdate, filterZero, type CodeFilter } from '../../../server/src/codegen/filter';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { generateC } from '../../../server/src/codegen';
import { filterBytes } from '../../../server/src/codegen/design';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import { analyse } from '../../../server/src/engine';
import { sampleChannelInputs } from '../../fixtures/codegen/samples';
import { syntheticDiodeChannel } from '../../fixtures/codegen/channels';
import { CLI, ensureBuilt, ROOT } from '../../protocol/client';

const FILTERS: CodeFilter[] = [
  ...[1, 2, 3, 5, 8, 12, 16].map((shift) => ({ kind: 'recursive', shift }) as const),
  ...[1, 2, 3, 4, 5, 6].map((log2n) => ({ kind: 'average', log2n }) as const),
];

describe('overflow bounds (the proof in codegen/filter.ts)', () => {
  it('hold for every input sequence, from a reset or a zeroed state', () => {
    fc.assert(
      fc.property(fc.constantFrom(...FILTERS), fc.option(fc.integer({ min: 0, max: 65535 })), fc.array(fc.oneof(fc.integer({ min: 0, max: 65535 }), fc.constantFrom(0, 65535)), { maxLength: 400 }), (f, start, xs) => {
        const s = start === null ? filterZero(f) : filterReset(f, start);
        for (const x of xs) {
          const y = filterUpdate(f, s, x); // throws when a bound fails
          expect(y).toBeGreaterThanOrEqual(0);
          expect(y).toBeLessThanOrEqual(65535);
          expect(s.acc).toBeLessThanOrEqual(filterStateBound(f));
          expect(s.acc).toBeLessThan(2 ** 32);
        }
      }),
      { numRuns: 400, seed: 16 },
    );
  });
  it('the recursive bound is reached, so it is tight: full scale held from just below it', () => {
    for (const shift of [1, 8, 16]) {
      const f: CodeFilter = { kind: 'recursive', shift };
      const s = { acc: filterStateBound(f), ring: [], next: 0 };
      expect(filterUpdate(f, s, 65535)).toBe(65535);
      expect(s.acc).toBe(2 ** (shift + 16) - 1);
    }
  });
  it('a constant input is reached exactly (no steady-state error) from any state', () => {
    for (const f of FILTERS) {
      for (const [from, to] of [[0, 65535], [65535, 0], [1234, 1235], [40000, 39999]] as const) {
        const s = filterReset(f, from);
        let y: number = from;
        for (let i = 0; i < 2 ** 22 && y !== to; i++) y = filterUpdate(f, s, to);
        expect(y, JSON.stringify(f)).toBe(to);
        expect(filterUpdate(f, s, to)).toBe(to);
      }
    }
  });
});

describe('generated code', () => {
  it('is unchanged for channels without dynamics fields (no filter emitted)', () => {
    const inputs = sampleChannelInputs();
    for (const c of inputs) expect(c.filter).toBeUndefined();
    const text = generateC(inputs, { fileStem: 'conv' }).text + generateC(inputs, { fileStem: 'conv', header: true }).text;
    expect(text).not.toContain('_filter_');
  });
  it('refuses a filter outside the ones the proof covers, naming the spec field', () => {
    expect(() => generateC([syntheticDiodeChannel({ filter: { kind: 'recursive', shift: 17 } })], { fileStem: 'conv' })).toThrow(/noise_limit: must be a recursive filter of shift 1..16/);
    expect(() => generateC([syntheticDiodeChannel({ filter: { kind: 'average', log2n: 7 } })], { fileStem: 'conv' })).toThrow(/average of 2\^1..2\^6 values/);
  });
});

describe('byte estimate (issue 16: gen\'s "about N bytes" counts the filter)', () => {
  // The filter's own term is held to real links (avr-gcc, arm-none-eabi-gcc) by
  // tests/unit/codegen/filter-compile.test.ts; here: the estimate of a channel is its conversion's plus its filter's.
  it('adds the filter\'s bytes on both targets, and nothing without a filter', () => {
    for (const f of FILTERS) {
      const withFilter = generateC([syntheticDiodeChannel({ filter: f })], { fileStem: 'conv' }).channels[0]!;
      const without = generateC([syntheticDiodeChannel({})], { fileStem: 'conv' }).channels[0]!;
      expect(withFilter.bytesEstimate - without.bytesEstimate, JSON.stringify(f)).toBe(filterBytes(f, 'avr'));
      expect(withFilter.bytesEstimateM0 - without.bytesEstimateM0, JSON.stringify(f)).toBe(filterBytes(f, 'm0'));
      expect(filterBytes(f, 'avr')).toBeGreaterThan(100);
      expect(filterBytes(f, 'm0')).toBeGreaterThan(40);
    }
    expect(filterBytes(undefined, 'avr')).toBe(0);
  });

  it('`thermoscribe gen` prints the estimate with the filter for the invented tank of tests/fixtures/dynamics/tank.tsense', () => {
    ensureBuilt();
    const spec = path.join(ROOT, 'tests', 'fixtures', 'dynamics', 'tank.tsense');
    const a = analyse({ path: spec, text: fs.readFileSync(spec, 'utf8') });
    const input = conversionInput(a.channels.find((r) => r.channel.name === 'tank')!, spec);
    expect('filter' in input && input.filter).toBeTruthy();
    const withFilter = generateC([input], { fileStem: 'tank' }).channels[0]!;
    const { filter: _f, ...bare } = input as typeof input & { filter?: CodeFilter };
    const without = generateC([bare], { fileStem: 'tank' }).channels[0]!;
    expect(withFilter.bytesEstimate).toBe(without.bytesEstimate + filterBytes((input as { filter?: CodeFilter }).filter, 'avr'));
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-gen-filter-'));
    try {
      const r = spawnSync(process.execPath, [CLI, 'gen', spec, '--channel', 'tank', '--out', path.join(dir, 'tank_conversion.c')], { cwd: ROOT, encoding: 'utf8' });
      expect(r.status).toBe(0);
      expect(r.stdout).toContain(`about ${withFilter.bytesEstimate} bytes linked on an 8-bit AVR, ${withFilter.bytesEstimateM0} on a Cortex-M0; firmware filter: `);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
