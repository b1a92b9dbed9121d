// Code-generator benchmark: the invented 12-bit junction channel (-40..125 degC) converted by the
// generated integer C vs two float baselines, measured on real toolchains (avr-gcc + simavr,
// arm-none-eabi-gcc, host gcc). Prints figures and PASS/MISS against the issue's targets; asserts
// nothing. Run alone with `npx tsx bench/codegen.ts`.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { analyse } from '../server/src/engine';
import { DiskHost } from '../server/src/cli/io';
import { conversionInput, generatableResults } from '../server/src/codegen/channel-input';
import { junctionChannel, loadOperatingPoint } from '../tests/fixtures/codegen/channels';
import { compareOnTargets, formatComparison } from '../tests/fixtures/codegen/measure';
import { toolVersion } from '../tests/fixtures/codegen/toolchain';
import { benchFilters } from './filter';
import type { ConversionInput } from '../server/src/codegen/types';
import { planCompensated, simulateCompensated } from '../server/src/codegen/compensated';
import { thermocoupleConversionInput } from '../server/src/sensors/thermocouple/codegen';
import { avrRows } from '../tests/fixtures/codegen/compensated';
import { TC_CASES } from '../tests/fixtures/codegen/thermocouples';

export async function benchCodegen(): Promise<void> {
  console.log('== codegen: 12-bit junction channel, -40..125 degC (invented parameters: IS 1e-14 A, N 1, BF 200, EG 1.11 eV, XTI 3, TNOM 300.15 K, RS 0; 50 uA; 2.5 V reference)');
  const op = await loadOperatingPoint();
  if (!op) {
    console.log('   skipped: server/src/sensors/junction/physics.ts (operatingPoint) is not present');
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
  benchVariants(junctionChannel(op));
  benchSamples();
  benchThermocouples();
  benchFilters();
}

/** The same channel at 0.01 °C and 0.1 °C output, and with run-time trims: bytes and cycles. */
export function benchVariants(base: ConversionInput): void {
  console.log('== codegen: output unit and run-time trims, same 12-bit junction channel');
  console.log('   variant                                     method (entries)   max err degC   AVR bytes   AVR cycles mean/max   M0 bytes');
  const variants: [string, Partial<ConversionInput>][] = [
    ['0.01 °C output, 0.02 °C target', { outputScale: 100, errorTarget: 0.02 }],
    ['0.1 °C output, 0.08 °C target', { outputScale: 10, errorTarget: 0.08 }],
    ['0.01 °C, run-time offset trim', { calibration: { mode: 'offset', offset: 0.3, runtime: true } }],
    ['0.01 °C, run-time two-point, neutral start', { calibration: { mode: 'two-point', offset: 0, gain: 1, runtime: true } }],
    ['0.01 °C, run-time two-point, gain 1.013', { calibration: { mode: 'two-point', offset: 0.3, gain: 1.013, runtime: true } }],
  ];
  let untrimmed: number | undefined;
  for (const [name, over] of variants) {
    try {
      const c = compareOnTargets({ ...base, ...over }, { baselines: false });
      const o = c.ours;
      const n = (v: number | undefined, d = 0) => (v === undefined ? 'n/a' : v.toFixed(d));
      if (untrimmed === undefined) untrimmed = o.avrCyclesMean;
      const added = over.calibration && o.avrCyclesMean !== undefined && untrimmed !== undefined ? `  (untrimmed ${n(untrimmed, 1)}, trim +${n(o.avrCyclesMean - untrimmed, 1)})` : '';
      console.log(`   ${name.padEnd(42)}  ${`${c.method} (${c.entries})`.padEnd(17)}  ${n(o.maxErrorC, 4).padStart(12)}   ${n(o.avrBytes).padStart(9)}   ${`${n(o.avrCyclesMean, 1)}/${n(o.avrCyclesMax)}`.padStart(19)}   ${n(o.m0Bytes).padStart(8)}${added}`);
    } catch (e) {
      console.log(`   ${name.padEnd(42)}  failed: ${(e as Error).message.split('\n')[0]}`);
    }
  }
  console.log('   max error of trimmed variants is against the untrimmed model (the trims move it on purpose);');
  console.log('   a starting gain away from 1 can need a denser table to hold the target, which costs cycles of its own.');
}

/** The same figures for every channel of samples/*.tsense that the engine analyses. */
function benchSamples(): void {
  const dir = path.resolve(__dirname, '../samples');
  const specs = fs.readdirSync(dir).filter((f) => f.endsWith('.tsense')).sort();
  console.log(`== codegen: every analysed channel of samples/*.tsense (${specs.join(', ')}), options from each channel (defaults 0.01 °C output, 0.02 °C target)`);
  console.log('   spec / channel                       codes  method (entries)   max err degC (target)   AVR bytes   AVR cycles mean/max   M0 bytes   AVR != TS');
  const t0 = Date.now();
  for (const spec of specs) {
    const file = path.join(dir, spec);
    const host = new DiskHost();
    const a = analyse({ path: file, text: host.read(file) ?? '', root: dir, host });
    const ok = generatableResults(a.channels, a.diagnostics);
    for (const r of a.channels) {
      if (r.channel.file !== file) continue;
      const label = `${spec.replace(/\.tsense$/, '')} / ${r.channel.name}`.padEnd(36);
      if (!ok.includes(r)) {
        console.log(`   ${label} not generated: the channel has error diagnostics (or an ADC above 16 bits)`);
        continue;
      }
      try {
        const input = conversionInput(r, file);
        const c = compareOnTargets(input, { baselines: false });
        const o = c.ours;
        const n = (v: number | undefined, d = 0) => (v === undefined ? 'n/a' : v.toFixed(d));
        console.log(`   ${label} ${String(c.codes).padStart(6)}  ${`${c.method} (${c.entries})`.padEnd(17)}  ${`${n(o.maxErrorC, 4)} (${input.errorTarget})`.padStart(21)}   ${n(o.avrBytes).padStart(9)}   ${`${n(o.avrCyclesMean, 1)}/${n(o.avrCyclesMax)}`.padStart(19)}   ${n(o.m0Bytes).padStart(8)}   ${n(c.avrMismatches).padStart(9)}${c.skipped.length ? `  (skipped: ${c.skipped.join('; ')})` : ''}`);
      } catch (e) {
        console.log(`   ${label} not generated: ${(e as Error).message.split('\n')[0]}`);
      }
    }
  }
  console.log('   max error = host gcc result vs the engine\'s exact model inverse at every in-range code; AVR != TS = simavr results differing from the TypeScript simulation.');
  console.log(`   (measured in ${((Date.now() - t0) / 1000).toFixed(1)} s)`);
}

if (require.main === module) {
  benchCodegen().catch((e: unknown) => {
    console.error(e);
    process.exitCode = 1;
  });
}

/** Thermocouple channels (code + cold junction -> hot junction): bytes and cycles on the 8-bit target. */
export function benchThermocouples(): void {
  console.log('== codegen: thermocouple channels, ADC code + cold-junction temperature -> hot junction (invented channels of tests/fixtures/codegen/thermocouples.ts)');
  console.log('   channel (type, hot range, ADC)            cold part / hot part         claimed err degC (target)   AVR bytes   AVR cycles mean/max   AVR != TS');
  const t0 = Date.now();
  for (const t of TC_CASES) {
    const label = `${t.channelName} (${t.type}, ${t.hotLowC}..${t.hotHighC} degC, ${t.adcBits}-bit)`.padEnd(42);
    try {
      const input = thermocoupleConversionInput(t);
      const p = planCompensated(input, t.channelName.replace(/\W+/g, '_').toLowerCase());
      const size = (d: typeof p.hot.plan.design) => `${d.kind} (${d.kind === 'table' ? d.entries.length : d.coefs.length})`;
      const top = 2 ** t.adcBits - 1;
      // 12-bit: every code at the middle cold-junction value; 16-bit: every 61st code.
      const { rows, bytes } = avrRows(input, { plan: p, refs: [Math.round((p.ref.low + p.ref.high) / 2)], stride: t.adcBits > 12 ? 61 : 1 });
      const cyc = rows.filter((r) => r.status === 0).map((r) => r.cycles!);
      const mismatches = rows.filter((r) => { const e = simulateCompensated(p, r.code, r.ref); return e.status !== r.status || e.value !== r.value; }).length;
      const mean = cyc.reduce((a, b) => a + b, 0) / Math.max(1, cyc.length);
      console.log(`   ${label} ${`${size(p.ref.plan.design)} / ${size(p.hot.plan.design)}`.padEnd(28)} ${`${p.maxErrorC.toFixed(4)} (${t.errorTarget})`.padStart(26)}   ${String(bytes).padStart(9)}   ${`${mean.toFixed(1)}/${Math.max(...cyc)}`.padStart(19)}   ${String(mismatches).padStart(9)}${top > 4095 ? '  (every 61st code)' : ''}`);
    } catch (e) {
      console.log(`   ${label} not measured: ${(e as Error).message.split('\n')[0]}`);
    }
  }
  console.log('   AVR bytes = linked .text+.data with one call minus without (library routines included); cycles: simavr, atmega328p, -Os, in-range calls.');
  console.log(`   (measured in ${((Date.now() - t0) / 1000).toFixed(1)} s)`);
}
