// How fast a channel follows the medium, and the firmware filter chosen for it (the spec's
// time_constant, sample_period, settling, ramp_lag, noise_limit). Pure: figures from the channel's
// definition and the coarsest °C per count of its sweep; no sensor kind is named here.
//
// The sensor is a first-order lag of time constant τ (a bead or probe exchanging heat with the
// medium through one film). Its response to a step of the medium is 1 − e^(−t/τ), and to a ramp
// of rate r it follows, in steady state, r·τ behind (K. Ogata, Modern Control Engineering,
// "First-order systems": unit-step response, and unit-ramp response whose error tends to T).
// So the sensor alone settles to within ε of a step ΔT after τ·ln(ΔT/ε).
//
// The firmware samples it every T and filters the values with one of two integer filters:
// - recursive: y_n = y_(n−1) + α (x_n − y_(n−1)), α = 2^−k (a shift). Its step response after n
//   samples leaves (1 − α)^n = e^(−nT/τ_f) of the step, so its equivalent time constant is
//   τ_f = −T / ln(1 − α); a ramp makes it lag (1 − α)/α samples in steady state; white noise of
//   variance σ² comes out with variance σ² α²·Σ(1 − α)^(2j) = σ² α/(2 − α) (geometric series).
// - average of N = 2^m values: noise variance σ²/N (N independent values), ramp delay (N − 1)/2
//   samples, a step fully taken after N − 1 samples.
// The sensor and the filter in cascade: both have a positive impulse response, so the step
// response rises monotonically and the settling time is the first sample after which the
// remainder stays below ε/ΔT; it is computed below in closed form at each sample instant.
// Noise: the adc `noise` (input-referred, rms) plus the rounding of each value to a whole code,
// 1/12 LSB² for a rounding error spread evenly over one LSB (B. Widrow, I. Kollár, Quantization
// Noise, Cambridge 2008, from memory; holds once the noise spans a few tenths of an LSB), both
// filtered, plus the filter's own rounding of its output to a whole code (another 1/12 LSB²).
import type { ChannelResult } from './types';
import type { DynamicsSpec } from '../model/types';
import { trimNumber } from '../diagnostics/numbers';

export type FirmwareFilter =
  | { kind: 'none' }
  /** y += (x − y) / 2^shift. */
  | { kind: 'recursive'; shift: number }
  /** The mean of the last 2^log2n values. */
  | { kind: 'average'; log2n: number };

/** Largest shift of the recursive filter: its 32-bit state then holds any 16-bit input (codegen/filter.ts). */
export const MAX_RECURSIVE_SHIFT = 16;
/** Largest average: 64 values (128 bytes of RAM as 16-bit values). */
export const MAX_AVERAGE_LOG2 = 6;

/** Every filter the chooser considers, lightest first within each kind. */
export function filterCandidates(): FirmwareFilter[] {
  const out: FirmwareFilter[] = [{ kind: 'none' }];
  for (let k = 1; k <= MAX_RECURSIVE_SHIFT; k++) out.push({ kind: 'recursive', shift: k });
  for (let m = 1; m <= MAX_AVERAGE_LOG2; m++) out.push({ kind: 'average', log2n: m });
  return out;
}

/** Output noise variance over input noise variance. */
export function filterNoiseRatio(f: FirmwareFilter): number {
  if (f.kind === 'recursive') {
    const a = 2 ** -f.shift;
    return a / (2 - a);
  }
  return f.kind === 'average' ? 2 ** -f.log2n : 1;
}

/** Steady-state lag behind a ramp, in samples. */
export function filterDelaySamples(f: FirmwareFilter): number {
  if (f.kind === 'recursive') return 2 ** f.shift - 1; // (1 − α)/α with α = 2^−k
  return f.kind === 'average' ? (2 ** f.log2n - 1) / 2 : 0;
}

/** Equivalent first-order time constant of the recursive filter, s: −T / ln(1 − 2^−k). */
export function recursiveTimeConstant(shift: number, samplePeriodS: number): number {
  return -samplePeriodS / Math.log1p(-(2 ** -shift));
}

/** RAM the filter's state takes in the generated C, bytes. */
export function filterRamBytes(f: FirmwareFilter): number {
  if (f.kind === 'recursive') return 4;
  return f.kind === 'average' ? 2 * 2 ** f.log2n + 4 + 1 : 0;
}

/** The filter in words: "recursive, 1/8 per sample", "average of 16 values", "none". */
export function filterWords(f: FirmwareFilter): string {
  if (f.kind === 'recursive') return `recursive, 1/${2 ** f.shift} per sample`;
  return f.kind === 'average' ? `average of ${2 ** f.log2n} values` : 'none';
}

/** First-order sensor: steady-state lag behind a ramp, K (Ogata, unit-ramp response). */
export function firstOrderRampLag(rampKPerS: number, tauS: number): number {
  return rampKPerS * tauS;
}

/** First-order sensor: time to within ε of a step ΔT, s: τ·ln(ΔT/ε), 0 when ε ≥ ΔT (Ogata, unit-step response). */
export function firstOrderSettling(tauS: number, stepK: number, epsK: number): number {
  return epsK >= stepK ? 0 : tauS * Math.log(stepK / epsK);
}

/**
 * (e^(na) − e^(nb)) / (e^a − e^b) for a, b < 0 (a sum of n terms e^(ja + (n−1−j)b)), symmetric in a
 * and b: with h the larger and d = min − max <= 0 it is e^((n−1)h)·expm1(n d)/expm1(d), free of the
 * cancellation of the plain difference when a and b are close; n·e^((n−1)a) when they are equal.
 */
function powerDifference(a: number, b: number, n: number): number {
  const h = Math.max(a, b);
  const d = Math.min(a, b) - h;
  if (n === 0) return 0;
  if (d === 0) return n * Math.exp((n - 1) * h);
  return Math.exp((n - 1) * h) * (Math.expm1(n * d) / Math.expm1(d));
}

/**
 * Fraction of a unit step still missing from the filtered reading at sample n (n = 0 is the step's
 * instant, the sensor then still at the old value), for a sensor of time constant τ sampled every T.
 * Recursive (q = 1 − α, p = e^(−T/τ)): r_n = q^n + α p (q^n − p^n)/(q − p) (the filter's sum of the
 * sampled sensor 1 − p^k, k = 1..n, summed as geometric series). Average of N: the mean of the
 * sensor's remainders p^k over the last N samples, 1 for samples before the step.
 */
export function stepRemainder(f: FirmwareFilter, tauS: number, samplePeriodS: number, n: number): number {
  const lnp = -samplePeriodS / tauS;
  if (f.kind === 'none') return Math.exp(n * lnp);
  if (f.kind === 'recursive') {
    const a = 2 ** -f.shift;
    const lnq = Math.log1p(-a);
    return Math.exp(n * lnq) + a * Math.exp(lnp) * powerDifference(lnq, lnp, n);
  }
  const N = 2 ** f.log2n;
  const before = Math.max(0, N - n); // samples of the window at or before the step: remainder 1 each (k = 0 gives p^0 = 1 too)
  const first = Math.max(1, n - N + 1);
  // Σ_{k=first}^{n} p^k = p^first (1 − p^(n−first+1)) / (1 − p)
  const count = n - first + 1;
  const sum = count > 0 ? (Math.exp(first * lnp) * -Math.expm1(count * lnp)) / -Math.expm1(lnp) : 0;
  return (Math.min(before, N) + sum) / N;
}

/** First sample from which the remainder stays at or below `frac` (the remainder falls monotonically). */
export function settlingSamples(f: FirmwareFilter, tauS: number, samplePeriodS: number, frac: number): number {
  if (stepRemainder(f, tauS, samplePeriodS, 0) <= frac) return 0;
  let hi = 1;
  while (stepRemainder(f, tauS, samplePeriodS, hi) > frac) {
    hi *= 2;
    if (hi > 2 ** 52) return Infinity;
  }
  let lo = hi / 2; // remainder(lo) > frac (or lo = 0.5 → 0)
  lo = Math.floor(lo);
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (stepRemainder(f, tauS, samplePeriodS, mid) > frac) lo = mid;
    else hi = mid;
  }
  return hi;
}

/**
 * Lag behind a ramp of unit rate (K per K/s, i.e. seconds) at sample n after the ramp starts from
 * rest. Recursive: T(q/α)(1 − q^n) + τ(1 − q^n) − τ α p (q^n − p^n)/(q − p), tending to T(1 − α)/α + τ;
 * average: the mean over the window of the sensor's lag τ(1 − p^k) plus the window's delay.
 */
export function rampLagAt(f: FirmwareFilter, tauS: number, samplePeriodS: number, n: number): number {
  const T = samplePeriodS;
  const lnp = -T / tauS;
  const sensorLag = (k: number) => (k <= 0 ? 0 : tauS * -Math.expm1(k * lnp)); // medium at kT minus the sensor then
  if (f.kind === 'none') return sensorLag(n);
  if (f.kind === 'recursive') {
    const a = 2 ** -f.shift;
    const lnq = Math.log1p(-a);
    const qn = Math.exp(n * lnq);
    return T * ((1 - a) / a) * (1 - qn) + tauS * (1 - qn) - tauS * a * Math.exp(lnp) * powerDifference(lnq, lnp, n);
  }
  const N = 2 ** f.log2n;
  let sum = 0;
  for (let j = 0; j < N; j++) {
    const k = n - j;
    // Reading kT of the medium minus what the sensor shows then (0 before the ramp): j·T + lag(k).
    sum += k <= 0 ? n * T : j * T + sensorLag(k);
  }
  return sum / N;
}

export interface FilterFigures {
  filter: FirmwareFilter;
  /** Steady-state lag at the stated ramp, K (slowest sensor); null when no ramp is stated. */
  lagK: number | null;
  /** Time to settle to within the accuracy after the stated step, s (slowest sensor); null when not asked. */
  settleS: number | null;
  /** Noise of the filtered reading, K rms; null when the adc noise is unknown. */
  noiseK: number | null;
}

export interface DynamicsResult {
  spec: DynamicsSpec;
  /** What is missing for the figures asked for, as the spec's words (empty when nothing). */
  missing: string[];
  tauS: number;
  /** The slowest sensor: τ (1 + tolerance). */
  tauWorstS: number;
  samplePeriodS: number | null;
  /** Step of `settling` (default the range) and the accuracy it settles to, K. */
  stepK: number;
  epsK: number | null;
  /** Temperature per unit of the filter's input (a code, or a decimated value), coarsest over the range, K. */
  kPerUnit: number;
  /** Noise of one value at the filter's input, in its units, rms (adc noise and rounding); null when unknown. */
  inputNoiseUnits: number | null;
  /** The sensor alone (no filter, sampled when a period is given). */
  sensor: FilterFigures;
  /** The filter chosen, with its figures. */
  chosen: FilterFigures;
  /** Which targets the chosen filter meets (null: no such target). */
  meets: { settling: boolean | null; ramp: boolean | null; noise: boolean | null };
  /** Why no filter meets every target, and what to relax; null when one does. */
  shortfall: { kind: 'response' | 'noise'; message: string } | null;
}

const memo = new WeakMap<ChannelResult, DynamicsResult | null>();

/** The dynamics of an analysed channel; null when it states none of the dynamics fields. */
export function channelDynamics(r: ChannelResult): DynamicsResult | null {
  let d = memo.get(r);
  if (d === undefined) memo.set(r, (d = computeDynamics(r)));
  return d;
}

const fmt = (x: number) => trimNumber(x, 3);

function computeDynamics(r: ChannelResult): DynamicsResult | null {
  const c = r.channel;
  const spec = c.dynamics;
  if (!spec) return null;
  const missing: string[] = [];
  if (!spec.timeConstant) missing.push('time_constant (the sensor\'s thermal time constant in its mounting)');
  if (spec.settling && c.accuracyK === null) missing.push('accuracy (settling is to within it)');
  if (spec.noiseLimitK !== undefined && spec.samplePeriodS === undefined) missing.push('sample_period (a filter needs it)');
  if (spec.noiseLimitK !== undefined && (c.adc.noiseLsbRms === null || c.adc.noiseLsbRms === undefined)) missing.push(`noise on adc '${c.adc.name}' (noise_limit is met from it)`);
  const n = c.oversamplingBits ?? 0;
  const kPerUnit = r.summary.worst.celsiusPerCount / 2 ** n;
  if (spec.noiseLimitK !== undefined && !(Number.isFinite(kPerUnit) && kPerUnit > 0)) missing.push('a channel whose code changes with temperature over the whole range');
  const tauS = spec.timeConstant?.seconds ?? NaN;
  const tauWorstS = tauS * (1 + (spec.timeConstant?.tolerance ?? 0));
  const T = spec.samplePeriodS ?? null;
  const stepK = spec.settling?.stepK ?? c.highK - c.lowK;
  const epsK = c.accuracyK;
  const sigma = c.adc.noiseLsbRms;
  const inputNoiseUnits = sigma === null || sigma === undefined || !(Number.isFinite(kPerUnit) && kPerUnit > 0) ? null : Math.sqrt(sigma * sigma + 1 / 12);
  const figures = (f: FirmwareFilter): FilterFigures => {
    const ramp = spec.rampLag;
    const lagK = !ramp || !spec.timeConstant ? null : ramp.rampKPerS * (tauWorstS + (T === null ? 0 : filterDelaySamples(f) * T));
    let settleS: number | null = null;
    if (spec.settling && spec.timeConstant && epsK !== null) {
      settleS = T === null ? firstOrderSettling(tauWorstS, stepK, epsK) : T * settlingSamples(f, tauWorstS, T, epsK / stepK);
    }
    const noiseK = inputNoiseUnits === null ? null : kPerUnit * Math.sqrt(inputNoiseUnits ** 2 * filterNoiseRatio(f) + (f.kind === 'none' ? 0 : 1 / 12));
    return { filter: f, lagK, settleS, noiseK };
  };
  const base = { spec, missing, tauS, tauWorstS, samplePeriodS: T, stepK, epsK, kPerUnit, inputNoiseUnits };
  const none = figures({ kind: 'none' });
  const meetsOf = (x: FilterFigures) => ({
    settling: spec.settling && x.settleS !== null ? x.settleS <= spec.settling.seconds * (1 + 1e-12) : null,
    ramp: spec.rampLag && x.lagK !== null ? x.lagK <= spec.rampLag.lagK * (1 + 1e-12) : null,
    noise: spec.noiseLimitK !== undefined && x.noiseK !== null ? x.noiseK <= spec.noiseLimitK * (1 + 1e-12) : null,
  });
  const responseOk = (x: FilterFigures) => {
    const m = meetsOf(x);
    return m.settling !== false && m.ramp !== false;
  };
  if (missing.length > 0 || !spec.timeConstant) return { ...base, sensor: none, chosen: none, meets: meetsOf(none), shortfall: null };

  // The sensor alone misses the response: no filter can help.
  if (!responseOk(none)) {
    return { ...base, sensor: none, chosen: none, meets: meetsOf(none), shortfall: { kind: 'response', message: responseShortfall(none, spec, tauWorstS, T, stepK, epsK) } };
  }
  if (spec.noiseLimitK === undefined || T === null || none.noiseK === null) return { ...base, sensor: none, chosen: none, meets: meetsOf(none), shortfall: null };

  const all = filterCandidates().map(figures);
  const limit = spec.noiseLimitK;
  // Lightest filter meeting both: the least RAM, then the least lag (the weakest filter meeting the noise).
  const both = all.filter((x) => responseOk(x) && x.noiseK! <= limit * (1 + 1e-12));
  if (both.length > 0) {
    const best = both.reduce((a, b) => (filterRamBytes(b.filter) < filterRamBytes(a.filter) || (filterRamBytes(b.filter) === filterRamBytes(a.filter) && filterNoiseRatio(b.filter) > filterNoiseRatio(a.filter)) ? b : a));
    return { ...base, sensor: none, chosen: best, meets: meetsOf(best), shortfall: null };
  }
  // None meets both: keep the response (what the reading is acted on) and take the least noise it allows.
  const responsive = all.filter(responseOk);
  const quietest = responsive.reduce((a, b) => (b.noiseK! < a.noiseK! ? b : a));
  const quiet = all.filter((x) => x.noiseK! <= limit * (1 + 1e-12));
  const options = [`relax noise_limit to ${fmt(quietest.noiseK!)} K rms (${filterWords(quietest.filter)}, the least noise that keeps the response)`];
  if (quiet.length > 0) {
    // The response the quietest-enough filter needs: the least lag / settling among those meeting the noise.
    const fastest = quiet.reduce((a, b) => (responseCost(b, spec) < responseCost(a, spec) ? b : a));
    const parts: string[] = [];
    if (spec.rampLag && fastest.lagK !== null && fastest.lagK > spec.rampLag.lagK) parts.push(`ramp_lag to ${fmt(fastest.lagK)} K`);
    if (spec.settling && fastest.settleS !== null && fastest.settleS > spec.settling.seconds) parts.push(`settling to ${fmt(fastest.settleS)} s`);
    options.push(`relax ${parts.join(' and ')} (${filterWords(fastest.filter)} meets the noise)`);
  } else {
    const floor = all.reduce((a, b) => (b.noiseK! < a.noiseK! ? b : a));
    options.push(`no filter here goes below ${fmt(floor.noiseK!)} K rms (${filterWords(floor.filter)}; the rounding of each value to a whole code sets the floor): add oversampling bits or a finer ADC step`);
  }
  return {
    ...base,
    sensor: none,
    chosen: quietest,
    meets: meetsOf(quietest),
    shortfall: {
      kind: 'noise',
      message: `no firmware filter meets noise_limit ${fmt(limit)} K rms without missing the response: the noise of one reading is ${fmt(none.noiseK!)} K rms; ${options.join(', or ')}`,
    },
  };
}

/** How far a filter's response is over the targets, relative (for ranking the ones meeting the noise). */
function responseCost(x: FilterFigures, spec: DynamicsSpec): number {
  let cost = 0;
  if (spec.rampLag && x.lagK !== null) cost = Math.max(cost, x.lagK / spec.rampLag.lagK);
  if (spec.settling && x.settleS !== null) cost = Math.max(cost, x.settleS / spec.settling.seconds);
  return cost;
}

function responseShortfall(none: FilterFigures, spec: DynamicsSpec, tauWorstS: number, T: number | null, stepK: number, epsK: number | null): string {
  const parts: string[] = [];
  const sampled = T === null ? '' : ` sampled every ${fmt(T)} s`;
  if (spec.rampLag && none.lagK !== null && none.lagK > spec.rampLag.lagK) {
    const perMin = spec.rampLag.rampKPerS * 60;
    const tauMax = spec.rampLag.lagK / spec.rampLag.rampKPerS;
    parts.push(`at ${fmt(perMin)} K/min the sensor alone${sampled} lags ${fmt(none.lagK)} K (ramp_lag allows ${fmt(spec.rampLag.lagK)} K): relax ramp_lag to ${fmt(none.lagK)} K, or mount the sensor for a time constant of at most ${fmt(tauMax)} s (worst case ${fmt(tauWorstS)} s now)`);
  }
  if (spec.settling && none.settleS !== null && epsK !== null && none.settleS > spec.settling.seconds) {
    const tauMax = spec.settling.seconds / Math.log(stepK / epsK);
    parts.push(`after a ${fmt(stepK)} K step the sensor alone${sampled} takes ${fmt(none.settleS)} s to come within ${fmt(epsK)} K (settling allows ${fmt(spec.settling.seconds)} s): relax settling to ${fmt(none.settleS)} s, or mount the sensor for a time constant of at most ${fmt(tauMax)} s (worst case ${fmt(tauWorstS)} s now)`);
  }
  return `${parts.join('; ')}; no firmware filter can make the reading faster`;
}

/** The channel hover's one line on the response: lag, settling, the chosen filter and its noise. */
export function dynamicsLine(d: DynamicsResult): string {
  if (d.missing.length > 0 || !d.spec.timeConstant) return `Response: not worked out; it also needs ${d.missing.join('; ')}`;
  const c = d.chosen;
  const parts: string[] = [];
  if (d.spec.rampLag && c.lagK !== null) parts.push(`lag **${fmt(c.lagK)} K** at ${fmt(d.spec.rampLag.rampKPerS * 60)} K/min (ramp_lag ${fmt(d.spec.rampLag.lagK)} K)`);
  if (d.spec.settling && c.settleS !== null && d.epsK !== null) parts.push(`within ±${fmt(d.epsK)} K **${fmt(c.settleS)} s** after a ${fmt(d.stepK)} K step (settling ${fmt(d.spec.settling.seconds)} s)`);
  const noise = c.noiseK === null ? '' : `, noise ${fmt(c.noiseK)} K rms${d.spec.noiseLimitK !== undefined ? ` (noise_limit ${fmt(d.spec.noiseLimitK)} K)` : ''}`;
  parts.push(`filter: ${filterWords(c.filter)}${noise}`);
  return `Response (time constant ${fmt(d.tauWorstS)} s at its slowest${d.samplePeriodS !== null ? `, sampled every ${fmt(d.samplePeriodS)} s` : ''}): ${parts.join('; ')}${d.shortfall ? ' — misses a target (see the problems list)' : ''}`;
}
