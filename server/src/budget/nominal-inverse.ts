// Fast inverse of the nominal model, V -> K, for the error budget (thousands of boards times every
// temperature). A table of the nominal channel's sensed voltage and its exact slope (sense.ts) over
// the range widened on both sides, with cubic Hermite interpolation between nodes (the slope is
// known exactly, so each segment matches value and derivative at both ends), solved by Newton.
// Checked against the bracketing solver analysis/inverse.ts in tests/unit/budget.
import type { ChannelDef } from '../model/types';
import { sense, senseEach } from '../analysis/sense';

const SEGMENTS = 800;
/** Nodes sensed together (one call of senseEach). */
const BLOCK = 16;

export class NominalInverse {
  readonly lowK: number;
  readonly highK: number;
  private readonly t: Float64Array;
  private readonly v: Float64Array;
  private readonly s: Float64Array;
  private readonly rising: boolean;

  constructor(readonly channel: ChannelDef) {
    const span = channel.highK - channel.lowK;
    const margin = Math.min(60, Math.max(10, span / 2));
    let lo = Math.max(channel.lowK - margin, channel.lowK / 2);
    let hi = channel.highK + margin;
    // Stay where the physics is defined (it throws far outside the double range).
    try {
      sense(channel, lo);
    } catch {
      lo = channel.lowK;
    }
    try {
      sense(channel, hi);
    } catch {
      hi = channel.highK;
    }
    this.lowK = lo;
    this.highK = hi;
    this.t = new Float64Array(SEGMENTS + 1);
    this.v = new Float64Array(SEGMENTS + 1);
    this.s = new Float64Array(SEGMENTS + 1);
    for (let i = 0; i <= SEGMENTS; i++) this.t[i] = lo + ((hi - lo) * i) / SEGMENTS;
    this.v.fill(NaN);
    this.sense(0);
    this.sense(SEGMENTS);
    this.rising = this.v[SEGMENTS]! > this.v[0]!;
  }

  /**
   * Senses the block of BLOCK nodes holding node i (v is NaN until then). A board's codes reach
   * only part of the widened range, so about a third of the table is never sensed.
   */
  private sense(i: number): void {
    const from = i - (i % BLOCK);
    const to = Math.min(SEGMENTS + 1, from + BLOCK);
    senseEach(this.channel, this.t.subarray(from, to), { volts: this.v.subarray(from, to), slope: this.s.subarray(from, to) });
  }

  /** Nominal slope dV/dT at a temperature inside the table, V/K (Hermite derivative). */
  slopeAt(kelvin: number): number {
    return sense(this.channel, kelvin).slope;
  }

  /** Temperature at which the nominal model senses `volts`, K; straight-line beyond the table ends. */
  kelvinAt(volts: number): number {
    const { t, v, s } = this;
    const n = SEGMENTS;
    const sign = this.rising ? 1 : -1;
    const x = sign * volts;
    if (x <= sign * v[0]!) return t[0]! + (volts - v[0]!) / s[0]!;
    if (x >= sign * v[n]!) return t[n]! + (volts - v[n]!) / s[n]!;
    let a = 0;
    let b = n;
    while (b - a > 1) {
      const m = (a + b) >> 1;
      if (v[m] !== v[m]) this.sense(m);
      if (sign * v[m]! <= x) a = m;
      else b = m;
    }
    if (v[a] !== v[a]) this.sense(a);
    if (v[b] !== v[b]) this.sense(b);
    const h = t[b]! - t[a]!;
    const v0 = v[a]!;
    const v1 = v[b]!;
    const m0 = s[a]! * h;
    const m1 = s[b]! * h;
    let u = (volts - v0) / (v1 - v0);
    for (let i = 0; i < 8; i++) {
      const u2 = u * u;
      const u3 = u2 * u;
      const p = (2 * u3 - 3 * u2 + 1) * v0 + (u3 - 2 * u2 + u) * m0 + (-2 * u3 + 3 * u2) * v1 + (u3 - u2) * m1;
      const dp = (6 * u2 - 6 * u) * v0 + (3 * u2 - 4 * u + 1) * m0 + (-6 * u2 + 6 * u) * v1 + (3 * u2 - 2 * u) * m1;
      const step = (p - volts) / dp;
      u = Math.min(1, Math.max(0, u - step));
      if (Math.abs(step) < 1e-13) break;
    }
    return t[a]! + u * h;
  }
}
