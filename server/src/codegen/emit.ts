// C99 text for one channel. Integer-only unless the float variant is asked for; no libm ever.
// Every constant below comes from a design that was simulated exactly in TypeScript first.

import { GAIN_Q, GAIN_Q_MAX, GAIN_Q_MIN, type TrimDesign } from './calibration';
import { commentLines } from './names';
import { wrap } from '../report/caution';
import { filterDeclarations, filterDefinitions, type CodeFilter } from './filter';
import type { PolyDesign } from './polynomial';
import type { TableDesign } from './table';

export interface ChannelPlan {
  name: string;
  ident: string;
  bits: number;
  /** Extra bits of a decimated value (4^n readings summed, shifted right by n); 0 or absent: plain codes. */
  oversamplingBits?: number;
  low: number;
  high: number;
  scale: number;
  dir: 1 | -1;
  design: TableDesign | PolyDesign;
  trim: TrimDesign;
  outBits: 16 | 32;
  /** The trimmed output can leave the output type's range: clamp in C. */
  needClamp: boolean;
  /** Smallest and largest untrimmed value over the in-range codes (run-time trim setters bound the trims with them). */
  kernelMin: number;
  kernelMax: number;
  /** Internal fraction bits of the kernel: it works in 1/(scale * 2^fracBits) degC and rounds at the end. */
  fracBits: number;
  /** Untrimmed values at the low and high in-range codes. */
  kernelAtLow: number;
  kernelAtHigh: number;
  floatVariant: boolean;
  /** Final outputs at the low and high in-range codes (what a clamped code returns). */
  outAtLow: number;
  outAtHigh: number;
  /** Codes at or below / at or above these are a sensor fault (absent: no test on that side). */
  faultBelow?: number;
  faultAbove?: number;
  /** Smallest and largest degC spanned by one code over the range (NaN when unknown). */
  perCountC: { min: number; max: number };
  maxErrorC: number;
  errorTarget: number;
  /** A straight line asked for by the spec (`conversion = line`): its error is not held to the target. */
  line?: boolean;
  /** A firmware filter emitted beside the conversion (codegen/filter.ts). */
  filter?: CodeFilter;
  samplePeriodS?: number;
  note?: string;
  cautions?: readonly string[];
}

export const SHARED_STATUS = `#ifndef THSC_STATUS_CODES
#define THSC_STATUS_CODES 1
#define THSC_IN_RANGE      0u /* code inside the designed range */
#define THSC_CLAMPED_COLD  1u /* colder than the range: output pinned to the coldest end */
#define THSC_CLAMPED_HOT   2u /* hotter than the range: output pinned to the hottest end */
#endif
#ifndef THSC_SENSOR_FAULT
#define THSC_SENSOR_FAULT  3u /* open or shorted sensor or lead: not a temperature; make the load safe */
#endif`;

export const SHARED_IMPL = `#ifndef THSC_IMPL_HELPERS
#define THSC_IMPL_HELPERS 1
#ifdef __AVR__
#include <avr/pgmspace.h> /* tables stay in flash on 8-bit AVR */
#define THSC_ROM PROGMEM
#define THSC_RD16(p) ((int16_t)pgm_read_word(p))
#define THSC_RD32(p) ((int32_t)pgm_read_dword(p))
#else
#define THSC_ROM
#define THSC_RD16(p) (*(p))
#define THSC_RD32(p) (*(p))
#endif
/* floor(v / 2^k) for any int32 v and 1 <= k <= 31, without the implementation-defined right
   shift of a negative number (C99 6.5.7p5): bias into uint32, shift, remove the bias. The biased
   sum is cast back to uint32_t: where unsigned long is 64 bits it would otherwise not wrap. */
#define THSC_ASR32(v, k) ((int32_t)((uint32_t)((uint32_t)(v) + 0x80000000UL) >> (k)) - (int32_t)(0x80000000UL >> (k)))
/* floor((s * f + 128) / 256) for 16-bit s and 8-bit f. On an 8-bit AVR with a multiplier: two
   hardware multiplies inline, s_hi * f + (s_lo * f + 128) / 256, where bit 7 of the low product is
   the rounding carry (the compiler's own code for the 24-bit product took twice the cycles and
   three more registers). Without: avr-gcc's 24-bit integer (a GNU extension, hence __extension__),
   still no 32-bit library multiply. */
#if defined(__AVR__) && defined(__GNUC__) && defined(__AVR_HAVE_MUL__)
static inline __attribute__((always_inline)) uint16_t thsc_mul_hi8(uint16_t s, uint8_t f)
{
    uint16_t r;
    uint8_t z;
    __asm__ (
        "clr %[z]\\n\\t"
        "mul %B[s], %[f]\\n\\t"
        "movw %A[r], __tmp_reg__\\n\\t"
        "mul %A[s], %[f]\\n\\t"
        "lsl __tmp_reg__\\n\\t"
        "adc %A[r], __zero_reg__\\n\\t"
        "adc %B[r], %[z]\\n\\t"
        "clr __zero_reg__"
        : [r] "=&r" (r), [z] "=&r" (z)
        : [s] "r" (s), [f] "r" (f));
    return r;
}
#define THSC_MUL_HI8(s, f) thsc_mul_hi8((uint16_t)(s), (uint8_t)(f))
#elif defined(__AVR__) && defined(__GNUC__) && defined(__UINT24_MAX__)
#define THSC_MUL_HI8(s, f) ((uint16_t)((__extension__((__uint24)(s) * (uint8_t)(f) + 128u)) >> 8))
#else
#define THSC_MUL_HI8(s, f) ((uint16_t)(((uint32_t)(s) * (uint8_t)(f) + 128UL) >> 8))
#endif
#endif
#ifndef THSC_ASR16
/* floor(v / 2^k) for int16 v: GCC and Clang define >> of a negative number as an arithmetic
   shift (GCC manual, "Integers implementation"), one instruction pair per bit on an 8-bit AVR;
   elsewhere the biased form of THSC_ASR32 (C99 6.5.7p5 leaves it implementation-defined). */
#if defined(__GNUC__)
#define THSC_ASR16(v, k) ((int16_t)((int16_t)(v) >> (k)))
#else
#define THSC_ASR16(v, k) ((int16_t)((int16_t)((uint16_t)((uint16_t)(v) + 0x8000u) >> (k)) - (int16_t)(0x8000u >> (k))))
#endif
#endif
#ifndef THSC_SHL16
/* v << k for uint16_t v and a constant 1 <= k <= 7 (the byte-split table's code shift). avr-gcc at
   -Os shifts by 3 bits or more in a loop, about 5 cycles a bit; here 2 cycles a bit (lsl, rol),
   the tests on the constant k folded away once inlined. Elsewhere the plain shift. */
#if defined(__AVR__) && defined(__GNUC__)
static inline __attribute__((always_inline)) uint16_t thsc_shl16(uint16_t v, uint8_t k)
{
    if (k & 4u) __asm__ ("lsl %A0\\n\\trol %B0\\n\\tlsl %A0\\n\\trol %B0\\n\\tlsl %A0\\n\\trol %B0\\n\\tlsl %A0\\n\\trol %B0" : "+r" (v));
    if (k & 2u) __asm__ ("lsl %A0\\n\\trol %B0\\n\\tlsl %A0\\n\\trol %B0" : "+r" (v));
    if (k & 1u) __asm__ ("lsl %A0\\n\\trol %B0" : "+r" (v));
    return v;
}
#define THSC_SHL16(v, k) thsc_shl16((uint16_t)(v), (k))
#else
#define THSC_SHL16(v, k) ((uint16_t)((uint16_t)(v) << (k)))
#endif
#endif
#ifndef THSC_MULHI_HELPER
#define THSC_MULHI_HELPER 1
/* floor((u * g + 32768) / 65536) for unsigned 16-bit u and g: the two-point trim's multiply. On an
   8-bit AVR with a multiplier, four hardware multiplies inline (the partial products of the
   16 x 16-bit product, as in Atmel application note AVR201) instead of a 32-bit library call; the
   low byte of the product is not kept, as only its carry reaches the result, and bit 15 is the
   rounding carry. Always inlined: a call would cost more than the multiply. */
#if defined(__AVR__) && defined(__GNUC__) && defined(__AVR_HAVE_MUL__)
static inline __attribute__((always_inline)) uint16_t thsc_mul_hi16(uint16_t u, uint16_t g)
{
    uint16_t r;
    uint8_t t, z;
    __asm__ (
        "clr %[z]\\n\\t"
        "mul %A[u], %A[g]\\n\\t"
        "mov %[t], __zero_reg__\\n\\t"
        "mul %B[u], %B[g]\\n\\t"
        "movw %A[r], __tmp_reg__\\n\\t"
        "mul %B[u], %A[g]\\n\\t"
        "add %[t], __tmp_reg__\\n\\t"
        "adc %A[r], __zero_reg__\\n\\t"
        "adc %B[r], %[z]\\n\\t"
        "mul %A[u], %B[g]\\n\\t"
        "add %[t], __tmp_reg__\\n\\t"
        "adc %A[r], __zero_reg__\\n\\t"
        "adc %B[r], %[z]\\n\\t"
        "lsl %[t]\\n\\t"
        "adc %A[r], %[z]\\n\\t"
        "adc %B[r], %[z]\\n\\t"
        "clr __zero_reg__"
        : [r] "=&r" (r), [t] "=&r" (t), [z] "=&r" (z)
        : [u] "r" (u), [g] "r" (g));
    return r;
}
#define THSC_MUL_HI16(u, g) thsc_mul_hi16((u), (g))
#else
#define THSC_MUL_HI16(u, g) ((uint16_t)(((uint32_t)(u) * (uint16_t)(g) + 32768UL) >> 16))
#endif
#endif`;

/**
 * Helpers of the byte-split table when every span between neighbouring points is 0..255 (emitted
 * only by such a channel, so other files stay as they were): the span is the difference of the
 * points' low bytes (one flash read, not two), and a +- floor((span * f + 128) / 256) is one 8 x 8
 * hardware multiply whose product's bit 7 is the rounding carry, added into the point in place.
 * Same value as THSC_MUL_HI8 on a 16-bit span, so table.ts simulates both alike.
 */
export const SHARED_NARROW = `#ifndef THSC_NARROW_HELPERS
#define THSC_NARROW_HELPERS 1
#ifdef __AVR__
#define THSC_RD16LO(p) ((uint8_t)pgm_read_byte((const uint8_t *)(p))) /* little-endian: the low byte */
#else
#define THSC_RD16LO(p) ((uint8_t)*(p))
#endif
#if defined(__AVR__) && defined(__GNUC__) && defined(__AVR_HAVE_MUL__)
static inline __attribute__((always_inline)) int16_t thsc_add_mul8(int16_t a, uint8_t s, uint8_t f)
{
    __asm__ ("mul %[s], %[f]\\n\\tlsl __tmp_reg__\\n\\tadc %A[a], __zero_reg__\\n\\tclr __zero_reg__\\n\\tadc %B[a], __zero_reg__"
             : [a] "+r" (a) : [s] "r" (s), [f] "r" (f));
    return a;
}
static inline __attribute__((always_inline)) int16_t thsc_sub_mul8(int16_t a, uint8_t s, uint8_t f)
{
    __asm__ ("mul %[s], %[f]\\n\\tlsl __tmp_reg__\\n\\tsbc %A[a], __zero_reg__\\n\\tclr __zero_reg__\\n\\tsbc %B[a], __zero_reg__"
             : [a] "+r" (a) : [s] "r" (s), [f] "r" (f));
    return a;
}
#define THSC_ADD_MUL8(a, s, f) thsc_add_mul8((a), (uint8_t)(s), (uint8_t)(f))
#define THSC_SUB_MUL8(a, s, f) thsc_sub_mul8((a), (uint8_t)(s), (uint8_t)(f))
#else
#define THSC_ADD_MUL8(a, s, f) ((int16_t)((a) + (int16_t)(((uint16_t)(uint8_t)(s) * (uint8_t)(f) + 128u) >> 8)))
#define THSC_SUB_MUL8(a, s, f) ((int16_t)((a) - (int16_t)(((uint16_t)(uint8_t)(s) * (uint8_t)(f) + 128u) >> 8)))
#endif
#endif`;

/** The shared helpers a plan's kernel needs beyond SHARED_IMPL. */
export function kernelHelpers(p: ChannelPlan): string[] {
  return splitTable(p.design, p.high) && narrowSpans(p.design) ? [SHARED_NARROW] : [];
}

/** Every span between neighbouring points fits a byte: the byte-split table reads and multiplies 8 bits. */
export function narrowSpans(d: TableDesign | PolyDesign): boolean {
  return d.kind === 'table' && d.shift > 0 && d.spanMax <= 255;
}

/**
 * The byte-split table (an interpolating 16-bit table whose point index fits the high byte of the
 * code shifted left by 8 - shift): the one test of that form for the emitter and the size and cycle
 * models (design.ts formOf, cyclesEstimate).
 */
export function splitTable(d: TableDesign | PolyDesign, high: number): boolean {
  return roundsByShift(d) && d.shift <= 8 && high < 2 ** (8 + d.shift);
}

export const CAUTION_LINES = [
  'CAUTION: generated from a design model, not from measurements of your hardware. Not for',
  'safety-critical use on its own (heaters, cold chains, batteries, mains). Verify the whole',
  'channel against a calibrated reference thermometer over the full range, and follow the',
  'applicable safety standards, local codes and licensed engineering practice.',
];

/** A block comment's closing cautions: the general one, then the sensor kind's own (mains isolation, say). */
function cautionLines(kindCautions: readonly string[] | undefined): string[] {
  const out = ['Caution: verify against a calibrated reference thermometer; see the file header.'];
  for (const c of kindCautions ?? []) out.push(...commentLines(wrap(c, 92), 12));
  return out;
}

export function lit32(v: number): string {
  return v === -2147483648 ? '(-2147483647L - 1)' : `${v}L`;
}

function lit(v: number, bits: 16 | 32): string {
  return bits === 32 ? lit32(v) : `${v}`;
}

function rows(values: string[], perRow: number, indent: string): string {
  const out: string[] = [];
  for (let i = 0; i < values.length; i += perRow) out.push(indent + values.slice(i, i + perRow).join(', '));
  return out.join(',\n');
}

export function names(p: ChannelPlan) {
  const id = p.ident;
  return {
    id,
    up: id.toUpperCase(),
    fn: `${id}_code_to_temp`,
    fnF: `${id}_code_to_celsius_f`,
    setter: `${id}_set_trim`,
    type: `${id}_temp_t`,
    data: p.design.kind === 'table' ? `${id}_points` : `${id}_coefs`,
    trims: `${id}_trims`,
  };
}

function describe(p: ChannelPlan): string[] {
  const d = p.design;
  const what =
    d.kind === 'table'
      ? d.shift === 0
        ? `direct table of ${d.entries.length} int${d.entryBits} values, one per code`
        : `table of ${d.entries.length} int${d.entryBits} points every ${2 ** d.shift} codes, linear interpolation`
      : `piecewise quadratic, ${d.coefs.length} segment(s) of ${2 ** d.shift} codes, int32 coefficients`;
  const trim =
    p.trim.mode === 'none'
      ? 'no trim'
      : p.trim.mode === 'offset'
        ? `offset trim ${p.trim.offsetScaled}/${p.scale} degC${p.trim.runtime ? ' (settable at run time)' : ''}`
        : `two-point trim: gain ${p.trim.gainQ}/2^${GAIN_Q}, offset ${p.trim.offsetScaled}/${p.scale} degC${p.trim.runtime ? ' (settable at run time)' : ''}, out = round(gain * untrimmed) + offset`;
  return [
    `Channel ${commentLines(p.name, 1)[0] ?? ''}: ${p.bits}-bit ${p.oversamplingBits ? 'decimated value' : 'ADC code'} -> temperature in 1/${p.scale} degC.`,
    ...(p.oversamplingBits
      ? [
          `Oversampled: pass the sum of ${4 ** p.oversamplingBits} readings of the ${p.bits - p.oversamplingBits}-bit ADC shifted right by ${p.oversamplingBits}`,
          `(0..${2 ** p.bits - 1}), not one reading; the readings need noise of at least 0.5 LSB rms to dither.`,
        ]
      : []),
    `In range: codes ${p.low}..${p.high} (temperature ${p.dir > 0 ? 'rises' : 'falls'} with the code). A code stands for the centre`,
    `of its step (code + 0.5 LSB)${perCountText(p)}.`,
    `Method: ${what}; ${trim}.`,
    p.line
      ? `Straight line (conversion = line in the spec), not held to a code error target: max error vs the model over every in-range code ${p.maxErrorC.toFixed(4)} degC,`
      : `Max error vs the model over every in-range code: ${p.maxErrorC.toFixed(4)} degC (target ${p.errorTarget} degC),`,
    'from an exact simulation of this integer arithmetic; the quantisation of the code comes on top.',
    `${names(p).fn}() returns THSC_IN_RANGE, or THSC_CLAMPED_COLD / THSC_CLAMPED_HOT when the code is`,
    'outside the range; the output is then pinned to the nearest range end (never wrapped):',
    ...clampedText(p),
    ...faultText(p),
    ...(p.trim.runtime
      ? [
          `${names(p).setter}() writes ${p.trim.mode === 'offset' ? 'a 16-bit field' : 'two fields (32 and 16 bits)'}: not atomic on an 8-bit core. When conversions run in an`,
          'interrupt, call it with that interrupt disabled (on AVR: ATOMIC_BLOCK(ATOMIC_RESTORESTATE) of',
          '<util/atomic.h>), or call it from the same context that converts.',
        ]
      : []),
  ];
}

function outText(p: ChannelPlan, v: number): string {
  return `${v} (${+(v / p.scale).toFixed(6)} degC)`;
}

function perCountText(p: ChannelPlan): string {
  const { min, max } = p.perCountC;
  if (!Number.isFinite(min) || !Number.isFinite(max)) return '';
  const fmt = (x: number) => (x >= 0.01 ? x.toFixed(3) : x.toPrecision(2));
  return min === max || fmt(min) === fmt(max) ? `; one count spans ${fmt(max)} degC` : `; one count spans ${fmt(min)} to ${fmt(max)} degC over the range`;
}

/** The exact outputs of a clamped code (none with run-time trims: they follow the trim). */
function clampedText(p: ChannelPlan): string[] {
  const [cold, hot] = p.dir > 0 ? [p.outAtLow, p.outAtHigh] : [p.outAtHigh, p.outAtLow];
  if (p.trim.runtime) return ['  the range end\'s value with the trims in force at the time.'];
  return [`  THSC_CLAMPED_COLD gives exactly ${outText(p, cold)}, THSC_CLAMPED_HOT ${outText(p, hot)}.`];
}

function faultText(p: ChannelPlan): string[] {
  const tests = [
    ...(p.faultBelow !== undefined ? [`${p.faultBelow === 0 ? 'code 0' : `codes <= ${p.faultBelow}`}`] : []),
    ...(p.faultAbove !== undefined ? [`${p.faultAbove === 2 ** p.bits - 1 ? `code ${p.faultAbove}` : `codes >= ${p.faultAbove}`}`] : []),
  ];
  if (tests.length === 0) {
    return [
      'No code of this channel is set apart as a sensor fault (an open or shorted sensor gives an',
      'in-range code, or none was computed): detect faults another way before acting on the value.',
    ];
  }
  return [
    `THSC_SENSOR_FAULT: ${tests.join(' and ')}, the codes nearer an open or shorted sensor's code than the`,
    'range (the output is then pinned to the nearest range end and is not a temperature).',
    'SAFETY: on THSC_SENSOR_FAULT put the load in its safe state (heater off, alarm raised);',
    'do not act on the value. Treat repeated clamped readings the same way.',
  ];
}

/** A channel block's head comment: its lines, then the spec's note and the caution. */
export function blockComment(lines: string[], note: string | undefined, cautions: readonly string[] | undefined): string {
  if (note) {
    lines.push('Note from the spec:');
    for (const l of commentLines(note)) lines.push(`  ${l}`);
  }
  lines.push(...cautionLines(cautions));
  return `/*\n${lines.map((l) => (l ? ` * ${l}` : ' *')).join('\n')}\n */`;
}

function declarations(p: ChannelPlan): string {
  const n = names(p);
  const out = [
    `#define ${n.up}_SCALE ${p.scale} /* output units per degC */`,
    `typedef int${p.outBits}_t ${n.type};`,
    `uint8_t ${n.fn}(uint16_t code, ${n.type} *out);`,
  ];
  if (p.trim.runtime) {
    out.push(
      p.trim.mode === 'offset'
        ? `void ${n.setter}(int16_t offset_units); /* offset in 1/${p.scale} degC */`
        : `${TWO_POINT_FORMULA}\n` +
          `void ${n.setter}(int16_t offset_units, uint16_t gain_q${GAIN_Q}); /* offset in 1/${p.scale} degC, gain * 2^${GAIN_Q} */`,
    );
  }
  if (p.floatVariant) out.push(`uint8_t ${n.fnF}(uint16_t code, float *celsius);`);
  if (p.filter) out.push(filterDeclarations(p.ident, p.filter, p.samplePeriodS));
  // Guarded: a self-contained block and the header may meet in one translation unit, and a
  // typedef given twice is an error before C11.
  return [`#ifndef ${n.up}_DECLARED`, `#define ${n.up}_DECLARED 1`, ...out, '#endif'].join('\n');
}

export function emitHeaderBody(p: ChannelPlan): string {
  return `${blockComment(describe(p), p.note, p.cautions)}\n#include <stdint.h>\n${SHARED_STATUS}\n${declarations(p)}\n`;
}

function clampCode(p: ChannelPlan, early = false): string[] {
  const below = p.dir > 0 ? 'THSC_CLAMPED_COLD' : 'THSC_CLAMPED_HOT';
  const above = p.dir > 0 ? 'THSC_CLAMPED_HOT' : 'THSC_CLAMPED_COLD';
  const out: string[] = [];
  // Comparisons that can never be true are left out (-Wtype-limits under -Wextra).
  const lowTest = p.low > 0 ? `code < ${p.low}u` : undefined;
  const highTest = p.high < 65535 ? `code > ${p.high}u` : undefined;
  // Fault tests come first: a fault code lies beyond the range on its side.
  const faultLow = p.faultBelow === undefined ? undefined : p.faultBelow === 0 ? 'code == 0u' : `code <= ${p.faultBelow}u`;
  const faultHigh = p.faultAbove === undefined ? undefined : p.faultAbove === 65535 ? 'code == 65535u' : `code >= ${p.faultAbove}u`;
  if (early) {
    // Without run-time trims the output at a range end is a constant: a clamped code returns it
    // at once, and the in-range path carries no status (fewer live registers on an 8-bit MCU).
    // One unsigned comparison tests both ends (the wrap-around puts codes below the range high).
    // Inside, one store a side with the status chosen by the fault test: avr-gcc 5.4 -Os gave
    // 4 to 24 B less than a store and return per status on every sample channel (2026-12-03), and
    // no longer laid out the same code by the constants' values (4 B between 0.1 and 0.01 degC).
    const outT = `int${p.outBits}_t`;
    const put = (v: number, fault: string | undefined, st: string) => `*out = (${outT})${lit(v, p.outBits)}; return ${fault ? `${fault} ? THSC_SENSOR_FAULT : ${st}` : st};`;
    // A side without its range test (the range reaches the converter's end) keeps its fault test alone.
    const side = (test: string | undefined, v: number, fault: string | undefined, st: string) =>
      test ? [`if (${test}) { ${put(v, fault, st)} }`] : fault ? [`if (${fault}) { ${put(v, undefined, 'THSC_SENSOR_FAULT')} }`] : [];
    if (lowTest && highTest) {
      out.push(`    if ((uint16_t)(code - ${p.low}u) > ${p.high - p.low}u) {`);
      out.push(`        if (${lowTest}) { ${put(p.outAtLow, faultLow, below)} }`);
      out.push(`        ${put(p.outAtHigh, faultHigh, above)}`);
      out.push('    }');
    } else for (const l of [...side(lowTest, p.outAtLow, faultLow, below), ...side(highTest, p.outAtHigh, faultHigh, above)]) out.push(`    ${l}`);
    return out;
  }
  const tests: [string, number, string][] = [
    ...(faultLow ? [[faultLow, p.low, 'THSC_SENSOR_FAULT'] as [string, number, string]] : []),
    ...(lowTest ? [[lowTest, p.low, below] as [string, number, string]] : []),
    ...(faultHigh ? [[faultHigh, p.high, 'THSC_SENSOR_FAULT'] as [string, number, string]] : []),
    ...(highTest ? [[highTest, p.high, above] as [string, number, string]] : []),
  ];
  tests.forEach(([test, code, st], i) => out.push(`    ${i > 0 ? 'else ' : ''}if (${test}) { code = ${code}u; status = ${st}; }`));
  return out;
}

/**
 * Statements computing `kernel` (type int16_t or int32_t named by the return) from the uint16_t
 * variable `code` (or the one named by `input`: the kernel is a function of any integer input over
 * a range, not only of an ADC code).
 */
export function kernelCode(p: ChannelPlan, n: ReturnType<typeof names>, input = 'code'): { decl: string[]; body: string[]; wide: boolean } {
  const d = p.design;
  if (d.kind === 'polynomial') {
    const h = 2 ** d.shift;
    return {
      wide: true,
      decl: ['    uint16_t off, idx;', '    int32_t x, c1, c2, acc, kernel;'],
      body: [
        `    off = (uint16_t)(${input} - ${p.low}u);`,
        `    idx = (uint16_t)(off >> ${d.shift});`,
        `    x = (int32_t)(off & ${h - 1}u);`,
        `    c1 = THSC_RD32(&${n.data}[idx][1]);`,
        `    c2 = THSC_RD32(&${n.data}[idx][2]);`,
        `    acc = c1 + THSC_ASR32(c2 * x, ${d.k2});`,
        `    kernel = THSC_RD32(&${n.data}[idx][0]) + THSC_ASR32(x * acc + ${lit32(2 ** (d.k1 - 1))}, ${d.k1});`,
      ],
    };
  }
  const rd = d.entryBits === 16 ? 'THSC_RD16' : 'THSC_RD32';
  if (d.shift === 0) {
    const wide = d.entryBits === 32;
    return {
      wide,
      decl: [`    ${wide ? 'int32_t' : 'int16_t'} kernel;`],
      body: [`    kernel = ${rd}(&${n.data}[${input} - ${p.low}u]);`],
    };
  }
  const h = 2 ** d.shift;
  const wide = d.entryBits === 32 || d.spanMax > 32767;
  if (splitTable(d, p.high)) {
    // Byte-split form for 8-bit MCUs: w = code << (8 - shift) holds the point index in its high
    // byte and the fraction (scaled to /256) in its low byte, so neither needs a shift of its own;
    // the first point sits at a multiple of 2^shift, so the index offset folds into the address.
    // floor((span * f + 128) / 256) with f = frac * 2^(8 - shift) equals
    // floor((span * frac + 2^(shift-1)) / 2^shift), which table.ts simulates.
    const up = 8 - d.shift;
    const first = d.base / h;
    const head = [up > 0 ? `    w = THSC_SHL16(${input}, ${up}u);` : `    w = ${input};`, '    f = (uint8_t)(w & 0xFFu);', `    p = &${n.data}[(w >> 8)${first > 0 ? ` - ${first}u` : ''}];`, `    a = ${rd}(p);`];
    if (narrowSpans(d)) {
      return {
        wide,
        decl: ['    uint16_t w;', '    uint8_t f, span;', '    const int16_t *p;', '    int16_t a, kernel;'],
        body: [
          ...head,
          `    span = (uint8_t)(${p.dir > 0 ? 'THSC_RD16LO(p + 1) - (uint8_t)a' : '(uint8_t)a - THSC_RD16LO(p + 1)'}); /* 0..255: the points are monotonic, no span wider */`,
          `    kernel = ${p.dir > 0 ? 'THSC_ADD_MUL8' : 'THSC_SUB_MUL8'}(a, span, f);`,
        ],
      };
    }
    return {
      wide,
      decl: ['    uint16_t w, span, step;', '    uint8_t f;', `    const int16_t *p;`, '    int16_t a, kernel;'],
      body: [
        ...head,
        `    span = (uint16_t)(${p.dir > 0 ? `${rd}(p + 1) - a` : `a - ${rd}(p + 1)`}); /* >= 0: the points are monotonic */`,
        '    step = THSC_MUL_HI8(span, f);',
        `    kernel = (int16_t)(a ${p.dir > 0 ? '+' : '-'} (int16_t)step);`,
      ],
    };
  }
  const S = wide ? 'int32_t' : 'int16_t';
  const U = wide ? 'uint32_t' : 'uint16_t';
  const mul =
    d.mulBits === 16 && !wide
      ? `(uint16_t)((uint16_t)(span * frac + ${h / 2}u) >> ${d.shift})`
      : `(${U})(((uint32_t)span * frac + ${h / 2}UL) >> ${d.shift})`;
  const spanExpr = p.dir > 0 ? `(${U})(${rd}(&${n.data}[idx + 1u]) - a)` : `(${U})(a - ${rd}(&${n.data}[idx + 1u]))`;
  return {
    wide,
    decl: ['    uint16_t off, idx, frac;', `    ${U} span, step;`, `    ${S} a, kernel;`],
    body: [
      `    off = (uint16_t)(${input} - ${d.base}u);`,
      `    idx = (uint16_t)(off >> ${d.shift});`,
      `    frac = (uint16_t)(off & ${h - 1}u);`,
      `    a = ${rd}(&${n.data}[idx]);`,
      `    span = ${spanExpr}; /* >= 0: the points are monotonic */`,
      `    step = ${mul};`,
      `    kernel = (${S})(a ${p.dir > 0 ? '+' : '-'} (${S})step);`,
    ],
  };
}

/** The two-point trim's formula (calibration.ts) as the header states it. */
const TWO_POINT_FORMULA = [
  '/* Two-point trim: out = floor((u * g + 32768) / 65536) + c = round(gain * y / 2) + offset_units,',
  '   with y the untrimmed value in half output units, u = y + 32768 (unsigned), g = 2 * gain_q14 (the',
  '   gain in 1/32768) and c = offset_units - gain_q14 (the bias of u taken back); the setter computes',
  `   g and c. gain_q${GAIN_Q} = gain * 2^${GAIN_Q}, held to ${GAIN_Q_MIN}..${GAIN_Q_MAX} (0.5 .. 1.5). */`,
].join('\n');

/** The two-point trim's product of the kernel (an int16 in half output units) and g. */
function mulHiExpr(value: string, g: string): string {
  return `THSC_MUL_HI16((uint16_t)((uint16_t)${value} ^ 0x8000u), ${g})`;
}

function trimExpr(p: ChannelPlan, n: ReturnType<typeof names>, value: string): string {
  if (p.trim.mode === 'offset') return `(int32_t)${value} + ${p.trim.runtime ? `(int32_t)${n.trims}.offset` : lit32(p.trim.offsetScaled)}`;
  // floor((u * g + 2^15) / 2^16) + c (calibration.ts): one unsigned 16 x 16 multiply.
  if (p.trim.runtime) return `(int32_t)${mulHiExpr(value, `${n.trims}.gain`)} + ${n.trims}.add`;
  return `(int32_t)${mulHiExpr(value, `${p.trim.gainG}u`)} + ${lit32(p.trim.addC)}`;
}

/** The setter of run-time trims; it bounds them so that every in-range output fits the output type. */
function trimRuntimeSetter(p: ChannelPlan, n: ReturnType<typeof names>): string {
  const bounded = p.outBits === 16;
  const kmin = lit32(p.kernelMin);
  const kmax = lit32(p.kernelMax);
  if (p.trim.mode === 'offset') {
    if (!bounded) return `void ${n.setter}(int16_t offset_units)\n{\n    ${n.trims}.offset = offset_units;\n}`;
    return [
      `void ${n.setter}(int16_t offset_units)`,
      '{',
      '    /* Held so that no in-range output leaves int16_t: the conversion then needs no clamp. */',
      // A side whose bound lies outside int16_t needs no test (-Wtype-limits).
      ...(32767 - p.kernelMax < 32767 ? [`    if (offset_units > ${32767 - p.kernelMax}) offset_units = ${32767 - p.kernelMax};`] : []),
      ...(-32768 - p.kernelMin > -32768 ? [`    if (offset_units < ${-32768 - p.kernelMin}) offset_units = ${-32768 - p.kernelMin};`] : []),
      `    ${n.trims}.offset = offset_units;`,
      '}',
    ].join('\n');
  }
  const gq = `gain_q${GAIN_Q}`;
  // The trimmed value rises with the gain's product; its extremes are at the kernel's extremes.
  const at = (k: number) => `(int32_t)THSC_MUL_HI16(${(k + 32768) >>> 0}u, g) - (int32_t)${gq}`;
  return [
    `void ${n.setter}(int16_t offset_units, uint16_t ${gq})`,
    '{',
    '    int32_t lo, hi, off;',
    '    uint16_t g;',
    `    /* The gain is held to ${GAIN_Q_MIN}..${GAIN_Q_MAX} (0.5 .. 1.5) and stored as g = 2 * gain_q${GAIN_Q}; the offset is`,
    '       held so that no in-range output leaves int16_t (the conversion needs no clamp), and stored',
    `       with the bias as c = offset - gain_q${GAIN_Q}. */`,
    `    if (${gq} < ${GAIN_Q_MIN}u) ${gq} = ${GAIN_Q_MIN}u;`,
    `    else if (${gq} > ${GAIN_Q_MAX}u) ${gq} = ${GAIN_Q_MAX}u;`,
    `    g = (uint16_t)(${gq} * 2u);`,
    `    lo = ${at(p.kernelMin)}; /* untrimmed ${kmin} */`,
    `    hi = ${at(p.kernelMax)}; /* untrimmed ${kmax} */`,
    '    off = offset_units;',
    '    if (off > 32767L - hi) off = 32767L - hi;',
    '    if (off < -32768L - lo) off = -32768L - lo;',
    `    ${n.trims}.add = off - (int32_t)${gq};`,
    `    ${n.trims}.gain = g;`,
    '}',
  ].join('\n');
}

/**
 * What the emitted table points carry on top of the design's: 2^(F-1) when a 16-bit table kernel
 * rounds F fraction bits at the end, so the rounding is one arithmetic shift (the kernel is a
 * point plus or minus a step, so every point moving by a constant moves it by the same).
 */
function foldedBias(p: ChannelPlan): number {
  if (p.fracBits === 0 || p.trim.mode === 'two-point') return 0;
  return roundsByShift(p.design) ? 2 ** (p.fracBits - 1) : 0;
}

/** An interpolating table with a 16-bit kernel: its fraction bits go with one arithmetic shift (foldedBias). */
export function roundsByShift(d: TableDesign | PolyDesign): boolean {
  return d.kind === 'table' && d.shift > 0 && d.entryBits === 16 && d.spanMax <= 32767;
}

export function dataCode(p: ChannelPlan, n: ReturnType<typeof names>): string {
  const d = p.design;
  if (d.kind === 'table') {
    const t = d.entryBits === 16 ? 'int16_t' : 'int32_t';
    const bias = foldedBias(p);
    const vals = d.entries.map((v) => lit(v + bias, d.entryBits));
    return `static const ${t} ${n.data}[${vals.length}] THSC_ROM = {\n${rows(vals, 8, '    ')}\n};`;
  }
  const segs = d.coefs.map((c) => `{ ${c.map(lit32).join(', ')} }`);
  return `static const int32_t ${n.data}[${segs.length}][3] THSC_ROM = {\n${rows(segs, 2, '    ')}\n};`;
}

/**
 * The channel's definitions. With `header` (the file's own header name) the block includes it for
 * the types, prototypes and status codes and does not repeat them (a typedef given twice is an
 * error before C11, a warning under -pedantic); without, the block declares them itself.
 */
export function emitSourceBody(p: ChannelPlan, header?: string): string {
  const n = names(p);
  const k = kernelCode(p, n);
  const own = header ? [`#include "${header}" /* this channel's types, prototypes and status codes */`] : ['#include <stdint.h>', SHARED_STATUS, declarations(p)];
  const parts: string[] = [blockComment(describe(p), p.note, p.cautions), ...own, SHARED_IMPL, ...kernelHelpers(p), dataCode(p, n)];
  if (p.trim.runtime) {
    const fields = p.trim.mode === 'offset' ? 'int16_t offset;' : 'int32_t add; uint16_t gain;';
    const init = p.trim.mode === 'offset' ? `${p.trim.offsetScaled}` : `${lit32(p.trim.addC)}, ${p.trim.gainG}u`;
    parts.push(`static struct { ${fields} } ${n.trims} = { ${init} };`);
    parts.push(trimRuntimeSetter(p, n));
  }
  if (p.trim.runtime && p.outBits === 16) {
    // Run-time trims on a 16-bit output: the untrimmed conversion (with its early returns at the
    // range ends) and the trim applied once to whatever it gives; the compiler inlines the first.
    // The inner function returns the kernel as the trim takes it (a two-point trim rounds it itself).
    const inner: ChannelPlan = { ...p, trim: { ...p.trim, mode: 'none', runtime: false }, outAtLow: p.kernelAtLow, outAtHigh: p.kernelAtHigh, fracBits: p.trim.mode === 'two-point' ? 0 : p.fracBits };
    parts.push(conversionFunction(inner, n, kernelCode(inner, n), `static uint8_t ${n.id}_untrimmed(uint16_t code, int16_t *out)`));
    const apply =
      p.trim.mode === 'offset'
        ? [`    *out = (int16_t)(kernel + ${n.trims}.offset);`]
        : [`    *out = (int16_t)(${trimExpr(p, n, 'kernel')});`];
    parts.push([`uint8_t ${n.fn}(uint16_t code, ${n.type} *out)`, '{', '    int16_t kernel;', `    uint8_t status = ${n.id}_untrimmed(code, &kernel);`, ...apply, '    return status;', '}'].join('\n'));
  } else {
    parts.push(conversionFunction(p, n, k, `uint8_t ${n.fn}(uint16_t code, ${n.type} *out)`));
  }
  if (p.floatVariant) parts.push(floatVariant(p, n));
  if (p.filter) parts.push(filterDefinitions(p.ident, p.filter));
  return `${parts.join('\n')}\n`;
}

/**
 * The kernel's internal fraction bits rounded off: floor((kernel + 2^(F-1)) / 2^F). 16-bit: biased
 * into uint16 and shifted (no right shift of a negative number, C99 6.5.7p5); the design keeps
 * kernel + 2^(F-1) inside int16.
 */
export function roundFraction(p: ChannelPlan, wide: boolean): string[] {
  const f = p.fracBits;
  // A two-point trim takes the kernel with its fraction bit and rounds it itself.
  if (f === 0 || p.trim.mode === 'two-point') return [];
  // The table points carry the rounding's 2^(F-1) already (foldedBias).
  if (foldedBias(p) > 0) return [`    kernel = THSC_ASR16(kernel, ${f}); /* to 1/${p.scale} degC, rounded */`];
  if (wide) return [`    kernel = THSC_ASR32(kernel + ${2 ** (f - 1)}L, ${f}); /* to 1/${p.scale} degC, rounded */`];
  return [`    kernel = (int16_t)((int16_t)((uint16_t)((uint16_t)kernel + ${0x8000 + 2 ** (f - 1)}u) >> ${f}) - ${0x8000 >> f}); /* to 1/${p.scale} degC, rounded */`];
}

/** The conversion function with the given signature (early returns unless trims are set at run time). */
function conversionFunction(p: ChannelPlan, n: ReturnType<typeof names>, k: ReturnType<typeof kernelCode>, signature: string): string {
  const outT = `int${p.outBits}_t`;
  const early = !p.trim.runtime;
  const lines: string[] = [signature, '{'];
  if (!early) lines.push('    uint8_t status = THSC_IN_RANGE;');
  lines.push(...k.decl);
  if (p.trim.mode !== 'none') lines.push('    int32_t trimmed;');
  lines.push(...clampCode(p, early), ...k.body, ...roundFraction(p, k.wide));
  if (p.trim.mode === 'none') {
    lines.push(`    *out = (${outT})kernel;`);
  } else {
    lines.push(`    trimmed = ${trimExpr(p, n, 'kernel')};`);
    if (p.needClamp && p.outBits === 16) {
      lines.push('    if (trimmed > 32767L) trimmed = 32767L; /* never wrap */');
      lines.push('    else if (trimmed < -32768L) trimmed = -32768L;');
    }
    lines.push(`    *out = (${outT})trimmed;`);
  }
  lines.push(early ? '    return THSC_IN_RANGE;' : '    return status;', '}');
  return lines.join('\n');
}

/** Same points, float interpolation without the integer rounding; no libm. */
function floatVariant(p: ChannelPlan, n: ReturnType<typeof names>): string {
  const d = p.design;
  const lines = [`uint8_t ${n.fnF}(uint16_t code, float *celsius)`, '{', '    uint8_t status = THSC_IN_RANGE;'];
  if (d.kind === 'table' && d.shift > 0) {
    lines.push('    uint16_t off, idx;', '    float a, b, y;');
  } else if (d.kind === 'polynomial') {
    lines.push(`    ${n.type} v;`);
  } else {
    lines.push('    float y;');
  }
  lines.push(...clampCode(p));
  const rd = d.kind === 'table' && d.entryBits === 16 ? 'THSC_RD16' : 'THSC_RD32';
  if (d.kind === 'table' && d.shift > 0) {
    lines.push(
      `    off = (uint16_t)(code - ${d.base}u);`,
      `    idx = (uint16_t)(off >> ${d.shift});`,
      `    a = (float)${rd}(&${n.data}[idx]);`,
      `    b = (float)${rd}(&${n.data}[idx + 1u]);`,
      `    y = a + (b - a) * ((float)(off & ${2 ** d.shift - 1}u) / ${2 ** d.shift}.0f);`,
    );
    if (p.fracBits > 0) lines.push(`    y = ${foldedBias(p) > 0 ? `(y - ${foldedBias(p)}.0f)` : 'y'} / ${2 ** p.fracBits}.0f; /* to 1/${p.scale} degC */`);
  } else if (d.kind === 'table') {
    lines.push(`    y = (float)${rd}(&${n.data}[code - ${p.low}u]);`);
  } else {
    // The polynomial's integer result already carries the trim; convert and return.
    lines.push(`    (void)${n.fn}(code, &v);`, `    *celsius = (float)v / ${p.scale}.0f;`, '    return status;', '}');
    return lines.join('\n');
  }
  if (p.trim.mode === 'offset') {
    lines.push(`    y += (float)${p.trim.runtime ? `${n.trims}.offset` : p.trim.offsetScaled};`);
  } else if (p.trim.mode === 'two-point') {
    // gain = g / 32768 and offset = c + g / 2 (calibration.ts).
    const [g, c] = p.trim.runtime ? [`(float)${n.trims}.gain`, `(float)${n.trims}.add`] : [`${p.trim.gainG}.0f`, `${p.trim.addC}.0f`];
    lines.push(`    y = y * (${g} / 32768.0f) + (${c} + ${g} / 2.0f);`);
  }
  lines.push(`    *celsius = y / ${p.scale}.0f;`, '    return status;', '}');
  return lines.join('\n');
}
