// A thermocouple channel of a spec through `gen`, the editor's code action and the stale check: the
// kind's `conversionInput` member (sensors/thermocouple/codegen.ts) maps the channel to the
// two-input generator. End to end on the host compiler: the cold-junction channel's own generated
// function feeds the thermocouple's, and the result is held to the exact model (ITS-90 reference
// function and its exact inverse, NIST Monograph 175, with the amplifier's nominal gain and
// offsets removed). The spec (tests/fixtures/codegen/thermocouple/oven.tsense) is invented.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { generatorInput, generatableResults } from '../../../server/src/codegen/channel-input';
import { planCompensated, simulateCompensated, type CompensatedInput } from '../../../server/src/codegen/compensated';
import { generateForSpec } from '../../../server/src/codegen/spec';
import { staleBlocks } from '../../../server/src/codegen/stale';
import { generateForChannel } from '../../../server/src/features/generate-code';
import { emf, kelvinAtEmf } from '../../../server/src/sensors/thermocouple/its90';
import { detectVolts } from '../../../server/src/sensors/thermocouple/model';
import { analyseFile, FIXTURES } from '../helpers/fixtures';
import { STRICT, SANITIZE } from '../../fixtures/codegen/compensated';
import { WorkDir, hasTool, run } from '../../fixtures/codegen/toolchain';

const OVEN = path.join(FIXTURES, 'codegen', 'thermocouple', 'oven.tsense');

describe('thermocouple channels in gen, the code action and the stale check', () => {
  const a = analyseFile(OVEN);
  const hot = a.channels.find((r) => r.channel.name === 'hot')!;

  it('generates both channels; the header tells the author to pass the cold-junction channel\'s result', () => {
    expect(generatableResults(a.channels, a.diagnostics).map((r) => r.channel.name).sort()).toEqual(['board', 'hot']);
    const g = generateForSpec(a, { fileStem: 'oven_conversion' });
    if (!g.ok) throw new Error(g.message);
    expect(g.leftOut).toEqual([]);
    expect(g.header.text).toMatch(/uint8_t hot_code_to_temp\(uint16_t code, int16_t cj, hot_temp_t \*out\);/);
    expect(g.header.text).toMatch(/Call channel board's conversion first and pass its result as cj/);
    expect(g.header.text).toMatch(/THSC_REF_CLAMPED/);
  }, 300_000);

  it('the editor\'s code action writes the thermocouple block too', () => {
    const out = generateForChannel(a, 'hot', undefined);
    expect(out.ok).toBe(true);
    if (out.ok) expect(out.result.text).toMatch(/hot_code_to_temp\(uint16_t code, int16_t cj, hot_temp_t \*out\)/);
  }, 300_000);

  it('the thermocouple block goes stale when its cold-junction channel changes', () => {
    const g = generateForSpec(a, { fileStem: 'oven_conversion' });
    if (!g.ok) throw new Error(g.message);
    expect(staleBlocks(g.source.text, a)).toEqual([]);
    const dir = new WorkDir();
    try {
      const edited = fs.readFileSync(OVEN, 'utf8').replace('range  = 25 °C .. 60 °C', 'range  = 20 °C .. 60 °C');
      expect(edited).not.toBe(fs.readFileSync(OVEN, 'utf8'));
      const file = dir.write('oven.tsense', edited);
      const stale = staleBlocks(g.source.text, analyseFile(file)).map((s) => s.block.channel).sort();
      expect(stale).toContain('hot');
    } finally {
      dir.dispose();
    }
  }, 300_000);

  it.skipIf(!hasTool('gcc'))('cold-junction function -> thermocouple function on the host, every code: equal to the simulation and within the claimed error of the exact model', () => {
    const g = generateForSpec(a, { fileStem: 'oven_conversion' });
    if (!g.ok) throw new Error(g.message);
    const input = generatorInput(hot, OVEN) as CompensatedInput;
    const plan = planCompensated(input, 'hot');
    const dir = new WorkDir();
    try {
      dir.write('oven_conversion.c', g.source.text);
      dir.write('oven_conversion.h', g.header.text);
      // Board codes over the cold-junction channel's range, every 64th; every thermocouple code.
      dir.write('main.c', `#include <stdio.h>
#include <stdint.h>
#include "oven_conversion.h"
int main(void)
{
    unsigned long b, c;
    for (b = 0; b < 4096UL; b += 64UL) {
        board_temp_t cj;
        uint8_t sb = board_code_to_temp((uint16_t)b, &cj);
        if (sb != THSC_IN_RANGE) continue;
        for (c = 0; c < 4096UL; c++) {
            hot_temp_t t;
            uint8_t st = hot_code_to_temp((uint16_t)c, cj, &t);
            printf("%lu %ld %u %ld\\n", c, (long)cj, (unsigned)st, (long)t);
        }
    }
    return 0;
}
`);
      run('gcc', [...STRICT, '-O1', ...SANITIZE, 'main.c', 'oven_conversion.c', '-o', 'run'], dir.path, 300_000);
      const lines = run(path.join(dir.path, 'run'), [], dir.path, 300_000).stdout.trim().split('\n');
      expect(lines.length).toBeGreaterThan(4096 * 10);
      const c = hot.channel;
      const gain = c.amplifier!.gain;
      const offset = c.amplifier!.offsetVolts + gain * detectVolts(c);
      const lsb = c.adc.reference.value / 4096;
      let worst = 0;
      let inRange = 0;
      for (const l of lines) {
        const [code, cj, st, v] = l.split(' ').map(Number) as [number, number, number, number];
        const sim = simulateCompensated(plan, code, cj);
        expect([st, v]).toEqual([sim.status, sim.value]);
        if (st !== 0) continue;
        inRange++;
        // Exact model (law of intermediate temperatures): E^-1(E_meas + E(T_cj)).
        const T = kelvinAtEmf('K', ((code + 0.5) * lsb - offset) / gain + emf('K', cj / 100 + 273.15)) - 273.15;
        worst = Math.max(worst, Math.abs(v / 100 - T));
      }
      console.log(`oven.tsense hot (type K via board thermistor): ${inRange} in-range calls, max error ${worst.toFixed(4)} degC (claimed ${plan.maxErrorC.toFixed(4)}, target ${input.errorTarget})`);
      expect(inRange).toBeGreaterThan(1000);
      expect(worst).toBeLessThanOrEqual(plan.maxErrorC + 1e-9);
    } finally {
      dir.dispose();
    }
  }, 600_000);
});
