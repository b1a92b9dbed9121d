// Firmware-filter benchmark: flash bytes and cycles of the generated filter update
// (codegen/filter.ts) on the 8-bit target (avr-gcc -Os, atmega328p in simavr at 16 MHz), and the
// outputs simavr gives checked against the exact TypeScript simulation. Prints figures; asserts
// nothing. Run alone with `npx tsx bench/filter.ts`.
import type { CodeFilter } from '../server/src/codegen/filter';
import { filterRamBytes } from '../server/src/analysis/dynamics';
import { FILTER_INPUTS, filterOnAvr } from '../tests/fixtures/codegen/filter-avr';
import { missingTools, toolVersion } from '../tests/fixtures/codegen/toolchain';

const FILTERS: CodeFilter[] = [
  { kind: 'recursive', shift: 3 }, { kind: 'recursive', shift: 8 }, { kind: 'recursive', shift: 16 },
  { kind: 'average', log2n: 3 }, { kind: 'average', log2n: 5 }, { kind: 'average', log2n: 6 },
];

export function benchFilters(): void {
  console.log('== codegen: firmware filter update on the 8-bit target (atmega328p, avr-gcc -Os, simavr 16 MHz)');
  const missing = missingTools(['avr-gcc', 'avr-size', 'simavr']);
  if (missing.length > 0) {
    console.log(`   skipped: missing ${missing.join(', ')}`);
    return;
  }
  console.log('   filter                        RAM bytes   AVR flash bytes   AVR cycles mean/max   AVR != TS');
  for (const f of FILTERS) {
    const label = (f.kind === 'recursive' ? `recursive, 1/${2 ** f.shift}` : `average of ${2 ** f.log2n}`).padEnd(28);
    try {
      const m = filterOnAvr(f);
      const mismatches = m.expected.filter((y, i) => m.outputs[i] !== y).length;
      console.log(`   ${label}  ${String(filterRamBytes(f)).padStart(9)}   ${String(m.flashBytes).padStart(15)}   ${`${m.cyclesMean.toFixed(1)}/${m.cyclesMax}`.padStart(19)}   ${String(mismatches).padStart(9)}`);
    } catch (e) {
      console.log(`   ${label}  failed: ${(e as Error).message.split('\n')[0]}`);
    }
  }
  console.log(`   flash = linked .text+.data with a reset and an update minus without; cycles = Timer1 around one update over ${FILTER_INPUTS.length} inputs; ${toolVersion('avr-gcc')}`);
}

if (require.main === module) benchFilters();
