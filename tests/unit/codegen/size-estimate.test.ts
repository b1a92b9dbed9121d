// The generator's "about N bytes" (issue #13 item 7) against the LINKED size on both targets: each
// channel built into a program that calls its functions (conversion, trim setter, float variant),
// .text + .data of the ELF minus the same program without the calls, library routines included
// (avr-size / arm-none-eabi-size of the real toolchains). Over the sample channels with the
// methods and output units a spec can ask for. Skips when a toolchain is missing.
import { describe, expect, it } from 'vitest';
import { generateC, planChannels } from '../../../server/src/codegen/generate';
import type { ConversionInput } from '../../../server/src/codegen/types';
import { sampleChannelInputs } from '../../fixtures/codegen/samples';
import { WorkDir, avrElf, elfBytes, m0Elf, missingTools } from '../../fixtures/codegen/toolchain';

const missing = missingTools(['avr-gcc', 'avr-size', 'arm-none-eabi-gcc', 'arm-none-eabi-size']);

function program(id: string, outBits: number, trim: 'offset' | 'two-point' | undefined, float: boolean): string {
  return `#include <stdint.h>
#include "conv.h"
volatile uint16_t in_code;
volatile uint8_t sink;
volatile int16_t in_offset;
volatile uint16_t in_gain;
int${outBits}_t reading;
float reading_f;
int main(void)
{
#if WHICH == 1
    sink = ${id}_code_to_temp(in_code, &reading);
${trim === 'offset' ? `    ${id}_set_trim(in_offset);\n` : trim === 'two-point' ? `    ${id}_set_trim(in_offset, in_gain);\n` : ''}${float ? `    sink = ${id}_code_to_celsius_f(in_code, &reading_f);\n` : ''}#endif
    for (;;) {
    }
}
`;
}

describe.skipIf(missing.length > 0)('size estimates against linked sizes', () => {
  it('are within 10 % on an 8-bit AVR and (figures printed) on a Cortex-M0', () => {
    const variants: [string, Partial<ConversionInput>][] = [
      ['auto', {}],
      ['0.1 degC', { outputScale: 10, errorTarget: 0.08 }],
      ['polynomial', { method: 'polynomial' }],
      ['run-time two-point', { calibration: { mode: 'two-point', offset: 0, gain: 1, runtime: true } }],
      ['float variant', { floatVariant: true }],
    ];
    const dir = new WorkDir();
    const worst = { avr: 0, m0: 0 };
    const lines: string[] = [];
    try {
      let empty: { avr: number; m0: number } | undefined;
      for (const base of sampleChannelInputs()) {
        for (const [name, over] of variants) {
          const c = { ...base, ...over } as ConversionInput;
          let gen;
          try {
            gen = generateC([c], { fileStem: 'conv' });
          } catch {
            continue; // a target this channel cannot meet: nothing to size
          }
          const p = planChannels([c]).plans[0]!;
          const ch = gen.channels[0]!;
          dir.write('conv.c', gen.text);
          dir.write('conv.h', generateC([c], { fileStem: 'conv', header: true }).text);
          dir.write('main.c', program(ch.identifier, p.outBits, p.trim.runtime ? (p.trim.mode as 'offset' | 'two-point') : undefined, c.floatVariant));
          const build = (w: number) => ({
            avr: elfBytes('avr-size', dir, avrElf(dir, ['main.c', 'conv.c'], `a${w}.elf`, [`WHICH=${w}`])),
            m0: elfBytes('arm-none-eabi-size', dir, m0Elf(dir, ['main.c', 'conv.c'], `m${w}.elf`, [`WHICH=${w}`])),
          });
          empty ??= build(0);
          const full = build(1);
          const linked = { avr: full.avr - empty.avr, m0: full.m0 - empty.m0 };
          const rel = { avr: ch.bytesEstimate / linked.avr - 1, m0: ch.bytesEstimateM0 / linked.m0 - 1 };
          worst.avr = Math.max(worst.avr, Math.abs(rel.avr));
          worst.m0 = Math.max(worst.m0, Math.abs(rel.m0));
          lines.push(`${c.channelName} (${name}, ${ch.method} ${ch.entries}): AVR about ${ch.bytesEstimate} / linked ${linked.avr} (${(100 * rel.avr).toFixed(1)} %); M0 about ${ch.bytesEstimateM0} / linked ${linked.m0} (${(100 * rel.m0).toFixed(1)} %)`);
          expect(Math.abs(rel.avr), lines[lines.length - 1]).toBeLessThanOrEqual(0.1);
        }
      }
    } finally {
      dir.dispose();
      console.log(`${lines.join('\n')}\nworst: AVR ${(100 * worst.avr).toFixed(1)} %, M0 ${(100 * worst.m0).toFixed(1)} %`);
    }
    expect(lines.length).toBeGreaterThan(30);
    // Cortex-M0: not yet within 10 % for every channel (literal pools and alignment; see the figures).
    expect(worst.m0).toBeLessThanOrEqual(0.4);
  }, 900_000); // links two programs per channel and variant on two targets: generous on a shared machine
});
