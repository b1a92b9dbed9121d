// Code-generator benchmark: the invented 12-bit junction channel (-40..125 degC) converted by the
// generated integer C vs two float baselines, measured on real toolchains (avr-gcc + simavr,
// arm-none-eabi-gcc, host gcc). Prints figures and PASS/MISS against the targets; asserts
// nothing. Run alone with `npx tsx bench/codegen.ts`.

import { junctionChannel, loadOperatingPoint } from '../tests/fixtures/codegen/channels';
import { compareOnTargets, formatComparison } from '../tests/fixtures/codegen/measure';
import { toolVersion } from '../tests/fixtures/codegen/toolchain';

export async function benchCodegen(): Promise<void> {
  console.log('== codegen: 12-bit junction channel, -40..125 degC (invented parameters: IS 1e-14 A, N 1, BF 200, EG 1.11 eV, XTI 3, TNOM 300.15 K, RS 0; 50 uA; 2.5 V reference)');
  const op = await loadOperatingPoint();
  if (!op) {
    console.log('   skipped: server/src/physics/junction.ts (operatingPoint) is not present');
    return;
  }
  const t0 = Date.now();
  let r;
  try {
    r = compareOnTargets(junctionChannel(op));
  } catch (e) {
    console.log(`   failed to measure: ${(e as Error).message.split('\n')[0]}`);
    return;
  }
  console.log(formatComparison(r, true));
  console.log(`   toolchains: ${toolVersion('avr-gcc')}; ${toolVersion('arm-none-eabi-gcc')}; simavr at 16 MHz atmega328p; -Os`);
  console.log('   AVR/M0 bytes = linked .text+.data with one call minus without (library routines included);');
  console.log('   AVR cycles = Timer1 at prescaler 1 around one call, mean/max over every in-range code;');
  console.log('   max error = host gcc result vs the model at every in-range code.');
  console.log(`   (measured in ${((Date.now() - t0) / 1000).toFixed(1)} s)`);
}

if (require.main === module) {
  benchCodegen().catch((e: unknown) => {
    console.error(e);
    process.exitCode = 1;
  });
}
