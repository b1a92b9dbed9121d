// The firmware filter chosen for a channel (analysis/dynamics.ts), as integer C beside the channel's
// conversion, and its arithmetic simulated exactly here (the tests run both on the same inputs).
// The filter takes what the conversion takes (a code, or a decimated value: 16 bits at most) and
// gives a value of the same kind, so the conversion needs no change.
//
// Recursive, α = 2^−k (1 <= k <= 16): `acc` holds 2^k times the filtered value;
//   acc' = acc − floor(acc / 2^k) + x, output floor(acc' / 2^k).
// No overflow for any input sequence. Claim: acc <= 2^k·M + 2^k − 1 with M = 65535 (any uint16_t
// input), i.e. floor(acc / 2^k) <= M. It holds after reset (acc = x·2^k) and for the zeroed
// struct. Step: write acc = 2^k·q + r, 0 <= r < 2^k, q <= M; then
//   acc' = (2^k − 1)·q + r + x <= (2^k − 1)·M + (2^k − 1) + M = 2^k·M + 2^k − 1.
// So acc < 2^(k+16) <= 2^32: it fits uint32_t, and the output floor(acc / 2^k) <= M fits uint16_t.
// A constant input x is a fixed point exactly when floor(acc / 2^k) = x, reached from any state
// (each step moves floor(acc / 2^k) toward x by at least one unit of acc): no steady-state error.
//
// Average of N = 2^m values (1 <= m <= 6): a ring of the last N inputs and their sum;
//   sum' = sum − oldest + x, output floor((sum' + N/2) / N).
// The sum always equals the ring's total (after reset and for the zeroed struct, and each step
// keeps it so), hence 0 <= sum <= N·M < 2^22, and the output <= floor(M + 1/2) = M fits uint16_t.
import type { FirmwareFilter } from '../analysis/dynamics';

export type CodeFilter = Exclude<FirmwareFilter, { kind: 'none' }>;

/** Largest input: any uint16_t. */
const M = 65535;

export interface FilterState {
  acc: number;
  ring: number[];
  next: number;
}

/** The state after `<ch>_filter_reset(f, code)`. */
export function filterReset(f: CodeFilter, code: number): FilterState {
  if (f.kind === 'recursive') return { acc: code * 2 ** f.shift, ring: [], next: 0 };
  const n = 2 ** f.log2n;
  return { acc: code * n, ring: new Array<number>(n).fill(code), next: 0 };
}

/** The zeroed struct (a static one before any reset). */
export function filterZero(f: CodeFilter): FilterState {
  return filterReset(f, 0);
}

/** One `<ch>_filter_update(f, code)`: mutates the state, returns the output; throws if a bound of the proof above fails. */
export function filterUpdate(f: CodeFilter, s: FilterState, code: number): number {
  if (!Number.isInteger(code) || code < 0 || code > M) throw new RangeError(`filter input ${code} is not a uint16_t`);
  if (f.kind === 'recursive') {
    const k = f.shift;
    s.acc = s.acc - Math.floor(s.acc / 2 ** k) + code;
    if (s.acc > 2 ** k * M + 2 ** k - 1 || s.acc >= 2 ** 32) throw new RangeError(`filter state ${s.acc} beyond its bound`);
    return Math.floor(s.acc / 2 ** k);
  }
  const n = 2 ** f.log2n;
  const i = s.next & (n - 1);
  s.acc = s.acc - s.ring[i]! + code;
  s.ring[i] = code;
  s.next = (i + 1) & (n - 1);
  if (s.acc < 0 || s.acc > n * M) throw new RangeError(`filter sum ${s.acc} beyond its bound`);
  return Math.floor((s.acc + n / 2) / n);
}

/** The largest value the state reaches for any input sequence (the proof's bound), for the comment and the tests. */
export function filterStateBound(f: CodeFilter): number {
  return f.kind === 'recursive' ? 2 ** (f.shift + 16) - 1 : 2 ** f.log2n * M;
}

/** C names of a channel's filter. */
export function filterNames(ident: string): { type: string; reset: string; update: string } {
  return { type: `${ident}_filter_t`, reset: `${ident}_filter_reset`, update: `${ident}_filter_update` };
}

function describe(f: CodeFilter, samplePeriodS: number | undefined): string {
  const every = samplePeriodS === undefined ? '' : ` (one value every ${+samplePeriodS.toPrecision(4)} s)`;
  return f.kind === 'recursive'
    ? `first-order recursive filter, y += (x - y) / ${2 ** f.shift}${every}`
    : `moving average of the last ${2 ** f.log2n} values${every}`;
}

/** Header part: the state type and the two prototypes. */
export function filterDeclarations(ident: string, f: CodeFilter, samplePeriodS?: number): string {
  const n = filterNames(ident);
  const state =
    f.kind === 'recursive'
      ? `typedef struct { uint32_t acc; } ${n.type}; /* 2^${f.shift} times the filtered value */`
      : `typedef struct { uint16_t ring[${2 ** f.log2n}]; uint32_t sum; uint8_t next; } ${n.type};`;
  return [
    `/* Firmware filter: ${describe(f, samplePeriodS)}.`,
    `   Call ${n.reset}() once with the first value, then pass each new value`,
    `   through ${n.update}() and convert what it returns. Not reentrant: one state per channel. */`,
    state,
    `void ${n.reset}(${n.type} *f, uint16_t value);`,
    `uint16_t ${n.update}(${n.type} *f, uint16_t value);`,
  ].join('\n');
}

/** Source part: the two functions, integer only, with the overflow bound in a comment. */
export function filterDefinitions(ident: string, f: CodeFilter): string {
  const n = filterNames(ident);
  if (f.kind === 'recursive') {
    const k = f.shift;
    return [
      `void ${n.reset}(${n.type} *f, uint16_t value)`,
      '{',
      `    f->acc = (uint32_t)value << ${k};`,
      '}',
      `uint16_t ${n.update}(${n.type} *f, uint16_t value)`,
      '{',
      `    /* acc <= 2^${k} * 65535 + 2^${k} - 1 = ${filterStateBound(f)} for any input sequence from a reset or`,
      `       zeroed state: with acc = 2^${k} q + r (q <= 65535, r < 2^${k}) the new acc is (2^${k} - 1) q + r + value. */`,
      `    f->acc = f->acc - (f->acc >> ${k}) + value;`,
      `    return (uint16_t)(f->acc >> ${k});`,
      '}',
    ].join('\n');
  }
  const N = 2 ** f.log2n;
  return [
    `void ${n.reset}(${n.type} *f, uint16_t value)`,
    '{',
    '    uint8_t i;',
    `    for (i = 0u; i < ${N}u; i++) f->ring[i] = value;`,
    `    f->sum = (uint32_t)value << ${f.log2n};`,
    '    f->next = 0u;',
    '}',
    `uint16_t ${n.update}(${n.type} *f, uint16_t value)`,
    '{',
    `    uint8_t i = (uint8_t)(f->next & ${N - 1}u);`,
    `    /* sum is the ring's total, so 0 <= sum <= ${N} * 65535 = ${filterStateBound(f)}; the rounded mean <= 65535. */`,
    '    f->sum = f->sum - (uint32_t)f->ring[i] + value;',
    '    f->ring[i] = value;',
    `    f->next = (uint8_t)((i + 1u) & ${N - 1}u);`,
    `    return (uint16_t)((f->sum + ${N / 2}u) >> ${f.log2n});`,
    '}',
  ].join('\n');
}
