// The generated firmware filter compiled with the host gcc (C99, -pedantic, -Wall -Wextra
// -Wconversion -Wsign-conversion -Werror, address and undefined-behaviour sanitizers) and run on
// input sequences: every output equals the exact TypeScript simulation (codegen/filter.ts), and its
// step response follows the first-order analytic response 1 − e^(−t/τ) (K. Ogata, Modern Control
// Engineering, "First-order systems", unit-step response) with the filter's equivalent time
// constant τ_f = −T / ln(1 − 2^−k), within the one code that its integer truncation allows.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { generateC } from '../../../server/src/codegen';
import { planChannels } from '../../../server/src/codegen/generate';
import { filterReset, filterUpdate, filterZero, type CodeFilter } from '../../../server/src/codegen/filter';
import { recursiveTimeConstant, stepRemainder } from '../../../server/src/analysis/dynamics';
import { Xoshiro128 } from '../../../server/src/budget/prng';
import { syntheticDiodeChannel } from '../../fixtures/codegen/channels';
import { WorkDir, avrElf, elfBytes, hasTool, m0Elf, missingTools, run } from '../../fixtures/codegen/toolchain';
import { filterBytes } from '../../../server/src/codegen/design';
import { filterOnAvr } from '../../fixtures/codegen/filter-avr';

const STRICT = ['-std=c99', '-pedantic', '-Wall', '-Wextra', '-Wconversion', '-Wsign-conversion', '-Werror', '-O1'];
const SANITIZE = ['-fsanitize=address,undefined', '-fno-sanitize-recover=all', '-fno-omit-frame-pointer'];
const haveGcc = hasTool('gcc');

const FILTERS: CodeFilter[] = [
  { kind: 'recursive', shift: 1 }, { kind: 'recursive', shift: 4 }, { kind: 'recursive', shift: 9 }, { kind: 'recursive', shift: 16 },
  { kind: 'average', log2n: 1 }, { kind: 'average', log2n: 3 }, { kind: 'average', log2n: 6 },
];

/** The input sequences: random codes, full-scale swings, a step, and a sampled first-order sensor (τ = 20 samples). */
function sequences(): { name: string; start: number | null; xs: number[] }[] {
  const rng = new Xoshiro128(8);
  const random = Array.from({ length: 2000 }, () => rng.nextUint32() & 0xffff);
  const swing = Array.from({ length: 600 }, (_, i) => (Math.floor(i / 37) % 2 === 0 ? 65535 : 0));
  const step = Array.from({ length: 700 }, () => 40000);
  const sensor = Array.from({ length: 700 }, (_, n) => Math.round(40000 * (1 - Math.exp(-n / 20))));
  return [
    { name: 'random', start: null, xs: random },
    { name: 'swing', start: 65535, xs: swing },
    { name: 'step', start: 0, xs: step },
    { name: 'sensor', start: 0, xs: sensor },
  ];
}

describe.skipIf(!haveGcc)('generated filter on the host compiler, strict warnings and sanitizers', () => {
  const seqs = sequences();
  const inputs = FILTERS.map((f, i) => syntheticDiodeChannel({ channelName: `filtered ${i}`, filter: f, samplePeriodS: 0.25 }));
  const got = new Map<string, number[]>();
  let dir: WorkDir;

  beforeAll(() => {
    dir = new WorkDir();
    const { plans } = planChannels(inputs);
    dir.write('conv.c', generateC(inputs, { fileStem: 'conv' }).text);
    dir.write('conv.h', generateC(inputs, { fileStem: 'conv', header: true }).text);
    let main = '#include <stdio.h>\n#include <stdint.h>\n#include "conv.h"\n';
    seqs.forEach((s, j) => (main += `static const uint16_t seq${j}[${s.xs.length}] = {${s.xs.join(',')}};\n`));
    main += 'int main(void)\n{\n    unsigned i;\n';
    plans.forEach((p, k) => {
      seqs.forEach((s, j) => {
        main += `    {\n        static ${p.ident}_filter_t f;\n`;
        if (s.start !== null) main += `        ${p.ident}_filter_reset(&f, ${s.start}u);\n`;
        main += `        for (i = 0; i < ${s.xs.length}u; i++) printf("${k} ${j} %u %u\\n", i, (unsigned)${p.ident}_filter_update(&f, seq${j}[i]));\n    }\n`;
      });
    });
    main += '    return 0;\n}\n';
    dir.write('main.c', main);
    run('gcc', [...STRICT, ...SANITIZE, 'main.c', 'conv.c', '-o', 'filt'], dir.path, 300_000);
    const out = run(`${dir.path}/filt`, [], dir.path, 300_000).stdout;
    for (const line of out.trim().split('\n')) {
      const [k, j, i, y] = line.split(' ').map(Number);
      const key = `${k} ${j}`;
      const list = got.get(key) ?? [];
      list[i!] = y!;
      got.set(key, list);
    }
  }, 300_000);
  afterAll(() => dir?.dispose());

  it('gives exactly the outputs of the TypeScript simulation, for every sequence', () => {
    FILTERS.forEach((f, k) => {
      seqs.forEach((s, j) => {
        const st = s.start === null ? filterZero(f) : filterReset(f, s.start);
        const want = s.xs.map((x) => filterUpdate(f, st, x));
        expect(got.get(`${k} ${j}`), `${JSON.stringify(f)} ${s.name}`).toEqual(want);
      });
    });
  });

  it('recursive: step response within one code of 1 − e^(−nT/τ_f) (Ogata, first-order unit-step response)', () => {
    FILTERS.forEach((f, k) => {
      if (f.kind !== 'recursive') return;
      const tf = recursiveTimeConstant(f.shift, 1);
      const ys = got.get(`${k} 2`)!;
      ys.forEach((y, i) => {
        const n = i + 1; // the first update is the first sample after the step
        expect(Math.abs(y - 40000 * (1 - Math.exp(-n / tf))), `${f.shift} at ${n}`).toBeLessThanOrEqual(1);
      });
    });
  });

  it('average: a step is taken linearly over N values, then held exactly', () => {
    FILTERS.forEach((f, k) => {
      if (f.kind !== 'average') return;
      const N = 2 ** f.log2n;
      got.get(`${k} 2`)!.forEach((y, i) => expect(Math.abs(y - (40000 * Math.min(i + 1, N)) / N)).toBeLessThanOrEqual(0.5));
    });
  });

  it('behind a sampled first-order sensor: within 1.5 codes of the cascade\'s closed form (analysis/dynamics.ts)', () => {
    FILTERS.forEach((f, k) => {
      got.get(`${k} 3`)!.forEach((y, n) => {
        // Sample n of the sequence is the sensor n samples after the step (n = 0: the step's instant).
        expect(Math.abs(y - 40000 * (1 - stepRemainder(f, 20, 1, n))), `${JSON.stringify(f)} at ${n}`).toBeLessThanOrEqual(1.5);
      });
    });
  });
});

const avrMissing = missingTools(['avr-gcc', 'avr-size', 'simavr']);
if (avrMissing.length > 0) console.log(`filter-compile: AVR run skipped, missing ${avrMissing.join(', ')}`);

describe.skipIf(avrMissing.length > 0)('generated filter on the 8-bit target (avr-gcc, simavr)', () => {
  it('gives exactly the outputs of the TypeScript simulation (bytes and cycles: npm run bench)', () => {
    for (const f of [{ kind: 'recursive', shift: 5 }, { kind: 'recursive', shift: 16 }, { kind: 'average', log2n: 4 }] as CodeFilter[]) {
      const m = filterOnAvr(f);
      expect(m.outputs, JSON.stringify(f)).toEqual(m.expected);
      expect(m.flashBytes).toBeGreaterThan(0);
    }
  });
});

const sizeMissing = missingTools(['avr-gcc', 'avr-size', 'arm-none-eabi-gcc', 'arm-none-eabi-size']);
if (sizeMissing.length > 0) console.log(`filter-compile: size check skipped, missing ${sizeMissing.join(', ')}`);

describe.skipIf(sizeMissing.length > 0)('the filter\'s term of the byte estimate (codegen/design.ts filterBytes) against real links', () => {
  // Linked .text + .data of a program converting with the filter's reset and update called, minus
  // the same program converting without them (-Os, gc-sections); within 15 % on both targets.
  it('is within 15 % of the linked bytes on the atmega328p and the Cortex-M0', () => {
    const lines: string[] = [];
    const rel: { f: CodeFilter; avr: number; m0: number }[] = [];
    for (const f of FILTERS) {
      const dir = new WorkDir();
      try {
        const input = syntheticDiodeChannel({ channelName: 'sized', filter: f });
        dir.write('conv.c', generateC([input], { fileStem: 'conv' }).text);
        dir.write('conv.h', generateC([input], { fileStem: 'conv', header: true }).text);
        // Both programs convert, as firmware does: the filter's term is what it adds beside a conversion
        // (on the Cortex-M0 it shares start-up and literal-pool code with it; alone it links about 15 B more).
        dir.write('main.c', `#include <stdint.h>\n#include "conv.h"\nvolatile uint16_t sink_in, sink_out;\nvolatile uint8_t sink;\nint16_t reading;\nint main(void)\n{\n    uint16_t in = sink_in;\n#if WHICH == 1\n    static sized_filter_t f;\n    sized_filter_reset(&f, in);\n    in = sized_filter_update(&f, in);\n#endif\n    sink = sized_code_to_temp(in, &reading);\n    for (;;) {\n    }\n}\n`);
        const avr = [0, 1].map((w) => elfBytes('avr-size', dir, avrElf(dir, ['main.c', 'conv.c'], `a${w}.elf`, [`WHICH=${w}`])));
        const m0 = [0, 1].map((w) => elfBytes('arm-none-eabi-size', dir, m0Elf(dir, ['main.c', 'conv.c'], `m${w}.elf`, [`WHICH=${w}`])));
        const linked = { avr: avr[1]! - avr[0]!, m0: m0[1]! - m0[0]! };
        lines.push(`${JSON.stringify(f)}: AVR about ${filterBytes(f, 'avr')} / linked ${linked.avr}; M0 about ${filterBytes(f, 'm0')} / linked ${linked.m0}`);
        rel.push({ f, avr: Math.abs(filterBytes(f, 'avr') / linked.avr - 1), m0: Math.abs(filterBytes(f, 'm0') / linked.m0 - 1) });
      } finally {
        dir.dispose();
      }
    }
    console.log(lines.join('\n'));
    for (const r of rel) {
      expect(r.avr, JSON.stringify(r.f)).toBeLessThanOrEqual(0.15);
      expect(r.m0, JSON.stringify(r.f)).toBeLessThanOrEqual(0.15);
    }
  }, 300_000);
});
