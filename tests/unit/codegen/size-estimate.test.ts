// The generator's "about N bytes" (issue #13 item 7) against the LINKED size on the 8-bit AVR: each
// channel built into a program that calls its functions (conversion, trim setter, float variant),
// .text + .data of the ELF minus the same program without the calls, library routines included
// (avr-size of the real toolchain). Over the sample channels with the methods and output units a
// spec can ask for (tests/fixtures/codegen/size-cases.ts). The Cortex-M0: size-estimate-m0.test.ts.
// Skips when a toolchain is missing.
import { describe, expect, it } from 'vitest';
import { forEachSizeCase } from '../../fixtures/codegen/size-cases';
import { WorkDir, avrElf, elfBytes, missingTools } from '../../fixtures/codegen/toolchain';

const missing = missingTools(['avr-gcc', 'avr-size']);

describe.skipIf(missing.length > 0)('size estimates against linked sizes', () => {
  it('are within 10 % on an 8-bit AVR', () => {
    const dir = new WorkDir();
    let worst = 0;
    const lines: string[] = [];
    try {
      let empty: number | undefined;
      const build = (w: number) => elfBytes('avr-size', dir, avrElf(dir, ['main.c', 'conv.c'], `a${w}.elf`, [`WHICH=${w}`]));
      const n = forEachSizeCase(dir, (k) => {
        empty ??= build(0);
        const linked = build(1) - empty;
        const rel = k.estimate.avr / linked - 1;
        worst = Math.max(worst, Math.abs(rel));
        lines.push(`${k.label}: AVR about ${k.estimate.avr} / linked ${linked} (${(100 * rel).toFixed(1)} %)`);
        expect(Math.abs(rel), lines[lines.length - 1]).toBeLessThanOrEqual(0.1);
      });
      expect(n).toBeGreaterThan(30);
    } finally {
      dir.dispose();
      console.log(`${lines.join('\n')}\nworst: AVR ${(100 * worst).toFixed(1)} %`);
    }
  }, 900_000); // links two programs per channel and variant: generous on a shared machine
});
