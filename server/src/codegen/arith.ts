// Exact TypeScript mirrors of the integer operations the emitted C performs.
// JavaScript numbers hold integers exactly below 2^53; every C intermediate is checked to fit its
// C type (int32/uint16) before a design is accepted, so these mirrors equal the C results.

export const INT16_MIN = -32768;
export const INT16_MAX = 32767;
export const INT32_MIN = -2147483648;
export const INT32_MAX = 2147483647;

/** floor(v / 2^k): what the emitted THSC_ASR32 macro computes for any int32 v. */
export function asr(v: number, k: number): number {
  return Math.floor(v / 2 ** k);
}

export function fitsInt16(v: number): boolean {
  return Number.isInteger(v) && v >= INT16_MIN && v <= INT16_MAX;
}

export function fitsInt32(v: number): boolean {
  return Number.isInteger(v) && v >= INT32_MIN && v <= INT32_MAX;
}

export function clamp(v: number, lo: number, hi: number): number {
  return v < lo ? lo : v > hi ? hi : v;
}
