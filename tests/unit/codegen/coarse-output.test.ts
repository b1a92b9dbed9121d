// A coarse output unit must not blow up the generated code: table points and constant terms carry
// internal fraction bits and the result is rounded to the output unit once, at the end.
import { describe, expect, it } from 'vitest';
import { generateC } from '../../../server/src/codegen';
import type { ConversionInput } from '../../../server/src/codegen/types';
import { sampleChannelInputs } from '../../fixtures/codegen/samples';
import { junctionChannel, loadOperatingPoint } from '../../fixtures/codegen/channels';
import { compareOnTargets } from '../../fixtures/codegen/measure';
import { planChannels } from '../../../server/src/codegen/generate';
import { SIZE_MODEL } from '../../../server/src/codegen/design';
import { missingTools } from '../../fixtures/codegen/toolchain';
import { measureLinkedSizes } from '../../fixtures/codegen/linked-size';

const missAvr = [...missingTools(['avr-gcc', 'avr-size', 'simavr'])];

/** Bytes of the final rounding step in the generator's AVR estimate (design.ts SIZE_MODEL.avr.fraction). */
const ROUNDING_BYTES = Math.ceil(SIZE_MODEL.avr.fraction);

describe('coarse output units', () => {
  it('0.1 degC with a 0.08 degC target costs at most the final rounding step more than 0.01 degC with 0.02 degC by the estimate (no more, as the fitted model prices that step at 0 bytes), on every sample channel', () => {
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

  it.skipIf(missAvr.length > 0)('linked on the 8-bit target: 0.1 degC never costs more than 0.01 degC beyond its final rounding, on every sample channel', () => {
    const inputs = sampleChannelInputs().filter((c) => c.method !== 'line');
    const rows = measureLinkedSizes(inputs, [], [
      ['fine', { optimise: 'size', outputScale: 100, errorTarget: 0.02 }],
      ['coarse', { optimise: 'size', outputScale: 10, errorTarget: 0.08 }],
    ]);
    const lines: string[] = [];
    let cheaperOrEqual = 0;
    let pairs = 0;
    for (const c of inputs) {
      const fine = rows.find((r) => r.name === `${c.channelName} (fine)`);
      const coarse = rows.find((r) => r.name === `${c.channelName} (coarse)`);
      if (!fine || !coarse) continue;
      pairs++;
      if (coarse.linked.avr <= fine.linked.avr) cheaperOrEqual++;
      lines.push(`${c.channelName}: 0.01 degC ${fine.linked.avr} B (${fine.method} ${fine.entries}), 0.1 degC ${coarse.linked.avr} B (${coarse.method} ${coarse.entries}, ${coarse.fracBits} fraction bit(s))`);
      // The final rounding is one arithmetic shift per fraction bit (asr, ror: 4 bytes); nothing else may grow.
      expect(coarse.linked.avr, lines[lines.length - 1]).toBeLessThanOrEqual(fine.linked.avr + 4 * coarse.fracBits);
    }
    console.log(`${lines.join('\n')}\n${cheaperOrEqual} of ${pairs} channels: 0.1 degC no larger than 0.01 degC`);
    expect(pairs).toBeGreaterThan(8);
  }, 900_000);

  it.skipIf(missAvr.length > 0)('on the 8-bit target (linked bytes, simulated cycles): 0.1 degC costs the fine unit plus at most one arithmetic shift per fraction bit', async () => {
    const op = await loadOperatingPoint();
    if (!op) return;
    const base = junctionChannel(op);
    const fine = compareOnTargets({ ...base, outputScale: 100, errorTarget: 0.02 }, { baselines: false });
    const coarseInput = { ...base, outputScale: 10, errorTarget: 0.08 };
    const coarse = compareOnTargets(coarseInput, { baselines: false });
    const frac = planChannels([coarseInput]).plans[0]!.fracBits;
    console.log(`coarse output on atmega328p: 0.01 degC ${fine.ours.avrBytes} B / ${fine.ours.avrCyclesMean} cycles; 0.1 degC ${coarse.ours.avrBytes} B / ${coarse.ours.avrCyclesMean} cycles (${frac} fraction bit(s))`);
    expect(fine.avrMismatches).toBe(0);
    expect(coarse.avrMismatches).toBe(0);
    // Before: 188 B / 90 cycles against 164 B / 72 (a biased 16-bit rounding and the compiler's
    // 24-bit multiply). Now the rounding's half unit rides in the table points and the shift is one
    // asr/ror pair per bit (2 cycles, 4 bytes): the least a coarser unit with fraction bits costs.
    expect(coarse.ours.avrBytes!).toBeLessThanOrEqual(fine.ours.avrBytes! + 4 * frac);
    expect(coarse.ours.avrCyclesMean!).toBeLessThanOrEqual(fine.ours.avrCyclesMean! + 2 * frac);
  }, 600_000);
});
