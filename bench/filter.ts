// Firmware-filter benchmark: flash bytes and cycles of the generated filter update
// (codegen/filter.ts) on the 8-bit target (avr-gcc -Os, atmega328p in simavr at 16 MHz), and the
// outputs simavr gives checked against the exact TypeScript simulation. Prints figures; asserts
// nothing. Run alone with `npx tsx bench/filter.ts`.
import { generateC } from '../server/src/codegen';
import { filterReset, filterUpdate, type CodeFilter } from '../server/src/codegen/filter';
import { filterRamBytes } from '../server/src/analysis/dynamics';
import { syntheticDiodeChannel } from '../tests/fixtures/codegen/channels';
import { WorkDir, avrElf, elfBytes, missingTools, simavrLines, toolVersion } from '../tests/fixtures/codegen/toolchain';

const FILTERS: CodeFilter[] = [
  { kind: 'recursive', shift: 3 }, { kind: 'recursive', shift: 8 }, { kind: 'recursive', shift: 16 },
  { kind: 'average', log2n: 3 }, { kind: 'average', log2n: 5 }, { kind: 'average', log2n: 6 },
];

/** Inputs of the cycle run: a rising ramp with some noise-like wobble (invented). */
const INPUTS = Array.from({ length: 200 }, (_, i) => (1000 + i * 13 + ((i * 7919) % 23)) & 0xffff);

const SIZE_MAIN = (id: string) => `#include <stdint.h>
#include "conv.h"
volatile uint16_t sink_in, sink_out;
int main(void)
{
#if WHICH == 1
    static ${id}_filter_t f;
    ${id}_filter_reset(&f, sink_in);
    sink_out = ${id}_filter_update(&f, sink_in);
#endif
    for (;;) {
    }
}
`;

const CYCLES_MAIN = (id: string) => `#include <stdint.h>
#include <avr/io.h>
#include <avr/interrupt.h>
#include <avr/sleep.h>
#include "conv.h"
static const uint16_t inputs[${INPUTS.length}] = {${INPUTS.join(',')}};
static volatile uint16_t ovf;
ISR(TIMER1_OVF_vect) { ovf++; }
static void tx(char c) { while (!(UCSR0A & (1 << UDRE0))) {} UDR0 = (uint8_t)c; }
static void hex(uint32_t v, uint8_t digits) { while (digits--) tx("0123456789abcdef"[(v >> (4u * digits)) & 15u]); }
static uint16_t t0, t1, o, overhead;
#define START() do { cli(); ovf = 0; TIFR1 = (1 << TOV1); TCNT1 = 0; sei(); t0 = TCNT1; } while (0)
#define STOP() do { cli(); t1 = TCNT1; o = ovf; if ((TIFR1 & (1 << TOV1)) && t1 < 0x8000u) o++; sei(); } while (0)
static uint32_t elapsed(void) { return ((uint32_t)o << 16) + t1 - t0 - overhead; }
int main(void)
{
    static ${id}_filter_t f;
    uint16_t i, y;
    UBRR0H = 0; UBRR0L = 0; UCSR0A = (1 << U2X0); UCSR0B = (1 << TXEN0); UCSR0C = (3 << UCSZ00);
    TCCR1A = 0; TCCR1B = 1; TIMSK1 = (1 << TOIE1);
    overhead = 0;
    START();
    STOP();
    overhead = (uint16_t)elapsed();
    ${id}_filter_reset(&f, inputs[0]);
    for (i = 0; i < ${INPUTS.length}u; i++) {
        START();
        y = ${id}_filter_update(&f, inputs[i]);
        STOP();
        tx('F'); tx(' '); hex(y, 4); tx(' '); hex(elapsed(), 8); tx('\\n');
    }
    tx('E'); tx('N'); tx('D'); tx('\\n');
    cli();
    sleep_enable();
    sleep_cpu();
    for (;;) {
    }
}
`;

export function benchFilters(): void {
  console.log('== codegen: firmware filter update on the 8-bit target (atmega328p, avr-gcc -Os, simavr 16 MHz)');
  const missing = missingTools(['avr-gcc', 'avr-size', 'simavr']);
  if (missing.length > 0) {
    console.log(`   skipped: missing ${missing.join(', ')}`);
    return;
  }
  console.log('   filter                        RAM bytes   AVR flash bytes   AVR cycles mean/max   AVR != TS');
  for (const f of FILTERS) {
    const input = syntheticDiodeChannel({ channelName: 'bench filter', filter: f });
    const id = 'bench_filter';
    const dir = new WorkDir();
    const label = (f.kind === 'recursive' ? `recursive, 1/${2 ** f.shift}` : `average of ${2 ** f.log2n}`).padEnd(28);
    try {
      dir.write('conv.c', generateC([input], { fileStem: 'conv' }).text);
      dir.write('conv.h', generateC([input], { fileStem: 'conv', header: true }).text);
      dir.write('size.c', SIZE_MAIN(id));
      const sizes = [0, 1].map((w) => elfBytes('avr-size', dir, avrElf(dir, ['size.c', 'conv.c'], `s${w}.elf`, [`WHICH=${w}`])));
      dir.write('cyc.c', CYCLES_MAIN(id));
      avrElf(dir, ['cyc.c', 'conv.c'], 'cyc.elf');
      const lines = simavrLines(dir, 'cyc.elf');
      if (!lines.includes('END')) throw new Error('simavr run did not finish');
      const st = filterReset(f, INPUTS[0]!);
      const want = INPUTS.map((x) => filterUpdate(f, st, x));
      const cycles: number[] = [];
      let mismatches = 0;
      for (const l of lines) {
        const m = /^F ([0-9a-f]{4}) ([0-9a-f]{8})$/.exec(l);
        if (!m) continue;
        if (parseInt(m[1]!, 16) !== want[cycles.length]) mismatches++;
        cycles.push(parseInt(m[2]!, 16));
      }
      const mean = cycles.reduce((a, b) => a + b, 0) / cycles.length;
      console.log(`   ${label}  ${String(filterRamBytes(f)).padStart(9)}   ${String(sizes[1]! - sizes[0]!).padStart(15)}   ${`${mean.toFixed(1)}/${Math.max(...cycles)}`.padStart(19)}   ${String(mismatches).padStart(9)}`);
    } catch (e) {
      console.log(`   ${label}  failed: ${(e as Error).message.split('\n')[0]}`);
    } finally {
      dir.dispose();
    }
  }
  console.log(`   flash = linked .text+.data with a reset and an update minus without; cycles = Timer1 around one update over ${INPUTS.length} inputs; ${toolVersion('avr-gcc')}`);
}

if (require.main === module) benchFilters();
