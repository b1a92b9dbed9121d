// A coarse output unit must not blow up the generated code: table points and constant terms carry
// internal fraction bits and the result is rounded to the output unit once, at the end.
import { describe, expect, it } from 'vitest';
import { generateC } from '../../../server/src/codegen';
import type { ConversionInput } from '../../../server/src/codegen/types';
import { sampleChannelInputs } from '../../fixtures/codegen/samples';

/** Bytes of the final rounding step in the generator's estimate (generate.ts ROUND_BYTES). */
const ROUNDING_BYTES = 24;

describe('coarse output units', () => {
  it('0.1 degC with a 0.08 degC target costs at most the final rounding step more than 0.01 degC with 0.02 degC, on every sample channel', () => {
    const inputs = sampleChannelInputs().filter((c) => c.method !== 'line');
    expect(inputs.length).toBeGreaterThan(8);
    for (const c of inputs) {
      // Compared on bytes alone (optimise = size); balanced may trade a few bytes for cycles.
      const fine = generateC([{ ...c, optimise: 'size', outputScale: 100, errorTarget: 0.02 }], { fileStem: 'f' }).channels[0]!;
      const coarse = generateC([{ ...c, optimise: 'size', outputScale: 10, errorTarget: 0.08 }], { fileStem: 'c' }).channels[0]!;
      // Before: the kiln's chamber took a 1,700-point table at 0.1 degC against 7 segments at 0.01 degC.
      // The fewest bytes may be a few more points without the rounding step; never a blow-up.
      const data = (g: typeof fine) => (g.method === 'table' ? g.entries * 2 : g.entries * 12);
      expect(data(coarse), c.channelName).toBeLessThanOrEqual(2 * data(fine) + 2 * ROUNDING_BYTES);
      expect(coarse.bytesEstimate, c.channelName).toBeLessThanOrEqual(fine.bytesEstimate + ROUNDING_BYTES);
      expect(coarse.maxErrorC, c.channelName).toBeLessThanOrEqual(0.08);
    }
  });
});
