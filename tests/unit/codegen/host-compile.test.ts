// Compiles the generated C with the host gcc (C99, -Wall -Wextra -Werror -pedantic), runs it over
// every ADC code and compares each result with the channel's model. The models come from
// published equations (IEC 60751 Callendar-Van Dusen; SPICE diode/BJT temperature laws as published
// in Massobrio & Antognetti, Semiconductor Device Modeling with SPICE, 2nd ed. 1993, from memory),
// not from the generator, so the error figure is an outside check.

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateC } from '../../../server/src/codegen';
import { planChannels } from '../../../server/src/codegen/generate';
import type { ConversionInput } from '../../../server/src/codegen/types';
import { sampleChannelInputs } from '../../fixtures/codegen/samples';
import { junctionChannel, loadOperatingPoint, rtdChannel, syntheticDiodeChannel } from '../../fixtures/codegen/channels';
import { expectedOutput } from '../../fixtures/codegen/measure';
import { WorkDir, hasTool, hostBuildRun, run } from '../../fixtures/codegen/toolchain';

const haveGcc = hasTool('gcc');
if (!haveGcc) console.log('host-compile: skipped, gcc not found (run scripts/install-toolchains.sh)');

interface Row { status: number; value: number; f?: number }

describe.skipIf(!haveGcc)('generated C on the host compiler, every code', () => {
  const channels: ConversionInput[] = [
    syntheticDiodeChannel({ floatVariant: true, note: 'invented diode */ ??/ note\nsecond line' }),
    rtdChannel({ calibration: { mode: 'offset', offset: -0.7, runtime: false } }),
    rtdChannel({ channelName: 'rtd poly', method: 'polynomial', outputScale: 20, floatVariant: true, calibration: { mode: 'two-point', offset: 1.2, gain: 1.013, runtime: false } }),
    rtdChannel({ channelName: 'rtd runtime', calibration: { mode: 'two-point', offset: 0.3, gain: 0.995, runtime: true }, floatVariant: true }),
    rtdChannel({ channelName: 'rtd milli', outputScale: 1000, errorTarget: 0.01 }),
    syntheticDiodeChannel({ channelName: 'coarse diode', errorTarget: 0.3 }, 8),
    syntheticDiodeChannel({ channelName: 'direct diode', errorTarget: 0.006, method: 'table', floatVariant: true }, 8),
  ];
  const rows = new Map<string, Row[]>();
  const retrimmed = new Map<string, number[]>();
  let dir: WorkDir;

  beforeAll(async () => {
    const op = await loadOperatingPoint();
    if (op) channels.push(junctionChannel(op));
    else console.log('host-compile: junction channel skipped, server/src/sensors/junction/physics.ts not present');
    // Every channel of samples/*.tsense the engine analyses, with the options its spec gives; the
    // model is the engine's exact inverse (analysis/inverse.ts), itself checked against published
    // equations in the physics and sensor tests.
    channels.push(...sampleChannelInputs());
    // The same channels with a coarse output unit (0.1 degC, 0.08 degC target): the kernel then
    // carries internal fraction bits and rounds at the end, which must match the simulation too.
    channels.push(...sampleChannelInputs().map((c) => ({ ...c, channelName: `${c.channelName}.coarse`, outputScale: 10, errorTarget: 0.08 })));
    const src = generateC(channels, { fileStem: 'conv' });
    const hdr = generateC(channels, { fileStem: 'conv', header: true });
    const { plans } = planChannels(channels);
    let main = '#include <stdio.h>\n#include <stdint.h>\n#include "conv.h"\nint main(void)\n{\n    unsigned c;\n';
    plans.forEach((p, i) => {
      const id = p.ident;
      main += `    for (c = 0; c < ${2 ** p.bits}u; c++) {\n        ${id}_temp_t v;\n        uint8_t st = ${id}_code_to_temp((uint16_t)c, &v);\n`;
      if (p.floatVariant) main += `        float fv;\n        (void)${id}_code_to_celsius_f((uint16_t)c, &fv);\n        printf("R ${i} %u %u %ld %.9g\\n", c, (unsigned)st, (long)v, (double)fv);\n`;
      else main += `        printf("R ${i} %u %u %ld\\n", c, (unsigned)st, (long)v);\n`;
      main += '    }\n';
      if (p.trim.runtime) {
        main += p.trim.mode === 'offset' ? `    ${id}_set_trim(${p.trim.offsetScaled + 50});\n` : `    ${id}_set_trim(${p.trim.offsetScaled + 50}, ${p.trim.gainQ}u);\n`;
        main += `    for (c = ${p.low}u; c <= ${p.high}u; c++) {\n        ${id}_temp_t v;\n        (void)${id}_code_to_temp((uint16_t)c, &v);\n        printf("T ${i} %u %ld\\n", c, (long)v);\n    }\n`;
      }
    });
    main += '    return 0;\n}\n';
    dir = new WorkDir();
    dir.write('conv.c', src.text);
    dir.write('conv.h', hdr.text);
    dir.write('main.c', main);
    const out = hostBuildRun(dir, ['main.c', 'conv.c'], 'conv');
    for (const line of out.split('\n')) {
      const p = line.split(' ');
      const name = channels[Number(p[1])]?.channelName ?? '?';
      if (p[0] === 'R') {
        const list = rows.get(name) ?? [];
        list[Number(p[2])] = { status: Number(p[3]), value: Number(p[4]), f: p[5] === undefined ? undefined : Number(p[5]) };
        rows.set(name, list);
      } else if (p[0] === 'T') {
        const list = retrimmed.get(name) ?? [];
        list[Number(p[2])] = Number(p[3]);
        retrimmed.set(name, list);
      }
    }
  }, 300_000); // compiles and runs every code of every channel: generous on a shared machine
  afterAll(() => dir?.dispose());

  it('compiles without a warning and runs every code of every channel', () => {
    for (const c of channels) expect(rows.get(c.channelName)?.filter(Boolean).length).toBe(2 ** c.bits);
    expect(channels.filter((c) => c.channelName.startsWith('greenhouse.')).length).toBeGreaterThan(0);
  });

  it.skipIf(!hasTool('g++'))('compiles as C++ too (the editor inserts blocks into C++ files)', () => {
    // ISO C++11 with GNU's warnings as errors; the header's extern "C" keeps the C linkage.
    run('g++', ['-x', 'c++', '-std=c++11', '-Wall', '-Wextra', '-Werror', '-pedantic', '-c', 'conv.c', '-o', 'conv_cpp.o'], dir.path);
  });

  it('equals the generator simulation of the C arithmetic at every code', () => {
    for (const c of channels) {
      const expect1 = expectedOutput(c);
      const got = rows.get(c.channelName)!;
      let mismatches = 0;
      for (let code = 0; code < 2 ** c.bits; code++) {
        const e = expect1(code);
        if (got[code]!.status !== e.status || got[code]!.value !== e.value) mismatches++;
      }
      expect(mismatches, c.channelName).toBe(0);
    }
  });

  it('stays within the error target of the model over every in-range code', () => {
    for (const c of channels) {
      const got = rows.get(c.channelName)!;
      const gain = c.calibration.mode === 'two-point' ? c.calibration.gain ?? 1 : 1;
      const offset = c.calibration.mode === 'none' ? 0 : c.calibration.offset ?? 0;
      let worst = 0;
      let worstFloat = 0;
      for (let code = c.codeLow; code <= c.codeHigh; code++) {
        // Model: IEC 60751 (RTD) or SPICE junction laws; trims as y = gain * T + offset.
        const want = gain * c.celsiusAtCode(code) + offset;
        worst = Math.max(worst, Math.abs(got[code]!.value / c.outputScale - want));
        if (got[code]!.f !== undefined) worstFloat = Math.max(worstFloat, Math.abs(got[code]!.f! - want));
      }
      console.log(`host gcc: ${c.channelName}: ${c.codeHigh - c.codeLow + 1} codes, max error ${worst.toFixed(4)} degC (target ${c.errorTarget})${c.floatVariant ? `, float variant ${worstFloat.toFixed(4)} degC` : ''}`);
      // A straight line (`conversion = line`) is held to its own claimed error, not to the target.
      const claimed = c.method === 'line' ? planChannels([c]).plans[0]!.maxErrorC + 1e-9 : c.errorTarget;
      expect(worst, c.channelName).toBeLessThanOrEqual(claimed);
      // The float variant skips only the final integer rounding: within target plus one output unit.
      if (c.floatVariant) expect(worstFloat, c.channelName).toBeLessThanOrEqual(c.errorTarget + 1 / c.outputScale);
    }
  });

  it('saturates out-of-range codes to the range end with a status, never wrapping', () => {
    for (const c of channels) {
      const got = rows.get(c.channelName)!;
      const top = 2 ** c.bits - 1;
      const lowEnd = got[c.codeLow]!;
      const highEnd = got[c.codeHigh]!;
      expect(lowEnd.status).toBe(0);
      expect(highEnd.status).toBe(0);
      for (const code of [0, c.codeLow - 1].filter((x) => x >= 0 && x < c.codeLow)) {
        expect(got[code]!.value).toBe(lowEnd.value);
        expect(got[code]!.status).not.toBe(0);
      }
      for (const code of [top, c.codeHigh + 1].filter((x) => x <= top && x > c.codeHigh)) {
        expect(got[code]!.value).toBe(highEnd.value);
        expect(got[code]!.status).not.toBe(0);
      }
      // Status names the temperature side: a falling channel's low codes are hot (2), a rising one's cold (1).
      const falling = c.celsiusAtCode(c.codeHigh) < c.celsiusAtCode(c.codeLow);
      // Code 0 may instead be a sensor fault (3) when a shorted or open sensor reads near it.
      if (c.codeLow > 0) expect(c.faultBelow !== undefined && 0 <= c.faultBelow ? 3 : falling ? 2 : 1).toBe(got[0]!.status);
    }
  });

  it('applies run-time trims set through the setter', () => {
    const c = channels.find((x) => x.calibration.runtime)!;
    const before = rows.get(c.channelName)!;
    const after = retrimmed.get(c.channelName)!;
    for (let code = c.codeLow; code <= c.codeHigh; code++) expect(after[code]).toBe(before[code]!.value + 50);
  });
});
