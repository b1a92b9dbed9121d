// Generated C for a thermistor and an RTD channel (invented designs): compiled with the host gcc
// (C99, -Wall -Wextra -Werror -pedantic), run over every ADC code, compared with the generator's
// simulation of its own integer arithmetic and with the model. The model is the engine's exact
// inverse, itself checked against IEC 60751 table values (RTD) and the Steinhart-Hart equation
// (thermistor) in the neighbouring tests, and here against an independent bisection on the forward
// equations (Ohm's law + CVD / beta model written out in this file).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import { generateC } from '../../../server/src/codegen';
import { planChannels } from '../../../server/src/codegen/generate';
import type { ConversionInput } from '../../../server/src/codegen/types';
import { expectedOutput } from '../../fixtures/codegen/measure';
import { WorkDir, hasTool, hostBuildRun } from '../../fixtures/codegen/toolchain';
import { analyseText, PARTS } from '../../fixtures/sensors/analyse';

const haveGcc = hasTool('gcc');

const SPEC = `${PARTS}
adc adc10 {
  bits      = 10
  reference = 2.5 V
}
# Invented: a drinks-cooler probe, 10k bead in a ratiometric divider.
channel cooler {
  sensor      = bead10k
  adc         = adc12
  bias        = divider 10k ± 0.1 % above from 3.3 V
  ratiometric = yes
  range       = -30 °C .. 60 °C
}
# Invented: a freezer-room Pt1000 on 250 µA through an amplifier, reaching below 0 °C.
channel freezer_room {
  sensor = pt1000
  adc    = adc10
  bias   = current 250 uA
  gain   = 4
  offset = -0.5 V
  wiring = 3 wires 0.3 ohm
  range  = -90 °C .. 40 °C
}
`;

/** Independent forward models (this file only): beta model / CVD below and above 0 °C + Ohm's law. */
const K0 = 273.15;
const ntcVolts = (c: number) => { const r = 10000 * Math.exp(3950 * (1 / (c + K0) - 1 / (25 + K0))); return (3.3 * r) / (10000 + r); };
const pt1000 = (t: number) => 1000 * (1 + 3.9083e-3 * t - 5.775e-7 * t * t + (t < 0 ? -4.183e-12 * (t - 100) * t ** 3 : 0)); // IEC 60751:2008
const rtdVolts = (c: number) => 4 * 250e-6 * pt1000(c) - 0.5;
function bisect(f: (c: number) => number, v: number, lo: number, hi: number): number {
  const rising = f(hi) > f(lo);
  for (let i = 0; i < 200; i++) { const m = (lo + hi) / 2; if ((f(m) < v) === rising) lo = m; else hi = m; }
  return (lo + hi) / 2;
}

describe.skipIf(!haveGcc)('thermistor and RTD conversion code on the host compiler', () => {
  const a = analyseText(SPEC);
  const inputs: ConversionInput[] = a.channels.map((r) => conversionInput(r, '/virtual/sensors.tsense'));
  const rows = new Map<string, { status: number; value: number }[]>();
  let dir: WorkDir;

  beforeAll(() => {
    expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const { plans } = planChannels(inputs);
    let main = '#include <stdio.h>\n#include <stdint.h>\n#include "conv.h"\nint main(void)\n{\n    unsigned c;\n';
    plans.forEach((p, i) => {
      main += `    for (c = 0; c < ${2 ** p.bits}u; c++) {\n        ${p.ident}_temp_t v;\n        uint8_t st = ${p.ident}_code_to_temp((uint16_t)c, &v);\n        printf("${i} %u %u %ld\\n", c, (unsigned)st, (long)v);\n    }\n`;
    });
    main += '    return 0;\n}\n';
    dir = new WorkDir();
    dir.write('conv.c', generateC(inputs, { fileStem: 'conv' }).text);
    dir.write('conv.h', generateC(inputs, { fileStem: 'conv', header: true }).text);
    dir.write('main.c', main);
    for (const line of hostBuildRun(dir, ['main.c', 'conv.c'], 'conv').trim().split('\n')) {
      const [i, code, st, v] = line.split(' ').map(Number);
      const name = inputs[i!]!.channelName;
      const list = rows.get(name) ?? [];
      list[code!] = { status: st!, value: v! };
      rows.set(name, list);
    }
  }, 300_000); // compiles and runs: generous on a shared machine
  afterAll(() => dir?.dispose());

  it('the model inverse equals an independent bisection on the forward equations', () => {
    // Reference: bisection on the beta model / IEC 60751 CVD with Ohm's law, written out above.
    const [ntc, rtd] = inputs;
    for (const code of [ntc!.codeLow, (ntc!.codeLow + ntc!.codeHigh) >> 1, ntc!.codeHigh]) {
      expect(ntc!.celsiusAtCode(code)).toBeCloseTo(bisect(ntcVolts, ((code + 0.5) / 4096) * 3.3, -60, 120), 8);
    }
    for (const code of [rtd!.codeLow, (rtd!.codeLow + rtd!.codeHigh) >> 1, rtd!.codeHigh]) {
      expect(rtd!.celsiusAtCode(code)).toBeCloseTo(bisect(rtdVolts, ((code + 0.5) / 1024) * 2.5, -200, 200), 8);
    }
    expect(rtd!.celsiusAtCode(rtd!.codeLow)).toBeLessThan(-80); // below 0 °C: Newton on the full CVD
  });

  it('compiles without a warning and equals the generator simulation at every code', () => {
    for (const c of inputs) {
      const want = expectedOutput(c);
      const got = rows.get(c.channelName)!;
      expect(got.filter(Boolean).length).toBe(2 ** c.bits);
      let mismatches = 0;
      for (let code = 0; code < 2 ** c.bits; code++) {
        const e = want(code);
        if (got[code]!.status !== e.status || got[code]!.value !== e.value) mismatches++;
      }
      expect(mismatches, c.channelName).toBe(0);
    }
  });

  it('stays within the error target of the model over every in-range code', () => {
    for (const c of inputs) {
      const got = rows.get(c.channelName)!;
      let worst = 0;
      for (let code = c.codeLow; code <= c.codeHigh; code++) worst = Math.max(worst, Math.abs(got[code]!.value / c.outputScale - c.celsiusAtCode(code)));
      console.log(`sensors host gcc: ${c.channelName}: ${c.codeHigh - c.codeLow + 1} codes, max error ${worst.toFixed(4)} degC (target ${c.errorTarget})`);
      expect(worst, c.channelName).toBeLessThanOrEqual(c.errorTarget);
    }
  });
});
