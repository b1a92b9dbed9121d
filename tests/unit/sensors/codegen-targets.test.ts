// The code-generation checks of the junction channel, run for a thermistor and an RTD sample
// channel: host gcc over every in-range code against the engine's exact inverse (Steinhart-Hart /
// Callendar-Van Dusen), and, where the toolchains are installed, the AVR build in simavr (every result
// equal to the TypeScript simulation of the C arithmetic) and the Cortex-M0 build. Figures printed.
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import { compareOnTargets } from '../../fixtures/codegen/measure';

const SAMPLES = path.resolve(__dirname, '../../../samples');

function sampleInput(spec: string, channel: string) {
  const file = path.join(SAMPLES, spec);
  const host = new DiskHost();
  const a = analyse({ path: file, text: host.read(file)!, root: SAMPLES, host });
  const r = a.channels.find((x) => x.channel.name === channel);
  if (!r) throw new Error(`${spec} has no analysed channel ${channel}`);
  return { r, input: conversionInput(r, file) };
}

describe('generated code for resistive sample channels on every target', () => {
  for (const [spec, kind] of [['sous-vide.tsense', 'thermistor'], ['kiln.tsense', 'rtd']] as const) {
    it(`${spec}: the ${kind} channel`, () => {
      const file = path.join(SAMPLES, spec);
      const host = new DiskHost();
      const a = analyse({ path: file, text: host.read(file)!, root: SAMPLES, host });
      const r = a.channels.find((x) => x.channel.sensor.kind === kind)!;
      expect(r, `a ${kind} channel in ${spec}`).toBeDefined();
      const { input } = sampleInput(spec, r.channel.name);
      const c = compareOnTargets(input, { baselines: false });
      const o = c.ours;
      console.log(`${spec} / ${r.channel.name} (${kind}): ${c.codes} codes, ${c.method} (${c.entries}); max error ${o.maxErrorC.toFixed(4)} °C (target ${input.errorTarget}); AVR ${o.avrBytes ?? 'n/a'} bytes, ${o.avrCyclesMean ?? 'n/a'} cycles; M0 ${o.m0Bytes ?? 'n/a'} bytes; AVR results differing from the simulation: ${c.avrMismatches ?? 'n/a'}${c.skipped.length ? ` (skipped: ${c.skipped.join('; ')})` : ''}`);
      expect(c.ours.maxErrorC).toBeLessThanOrEqual(input.errorTarget);
      if (c.avrMismatches !== undefined) expect(c.avrMismatches).toBe(0);
      if (c.ours.avrBytes !== undefined) expect(c.ours.avrBytes).toBeGreaterThan(0);
      if (c.ours.m0Bytes !== undefined) expect(c.ours.m0Bytes).toBeGreaterThan(0);
    }, 600_000); // compiles for two targets and runs in simavr: generous on a shared machine
  }
});
