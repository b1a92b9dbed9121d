// The difference of two channels read by the same converter, as a comparison or a difference
// measurement uses it. On a built board both channels see one converter: one reference, one offset,
// one gain error and one INL curve. Drawn once per board, the part they cause alike cancels in the
// difference; drawn apart (as two separate budgets do) it would add. Each channel's own inputs and
// each reading's quantisation stay independent. Uncalibrated (calibration would trim each channel
// on its own), over the temperatures both ranges cover; every tolerance drawn uniform, 500 boards.
import type { ChannelDef } from '../model/types';
import { channelKey } from '../analysis/cache';
import { boardErrors, frameAt, makeFrame, type BudgetFrame } from './frame';
import { Xoshiro128 } from './prng';
import { InlProfile } from './inl-profile';
import { percentileSorted } from './monte-carlo';

/** Inputs of the converter itself (contributors.ts ids): one draw per board for both channels. */
export const CONVERTER_INPUTS = ['reference', 'offset', 'gain'] as const;

export interface PairedDifference {
  a: string;
  b: string;
  /** Temperatures both ranges cover, °C. */
  lowC: number;
  highC: number;
  /** Converter inputs drawn once per board (those both channels have; the INL curve besides when both count it). */
  shared: string[];
  /** Whether both channels count the converter's INL (one curve per board for both). */
  sharedInl: boolean;
  /** Largest |1st or 99th percentile| of (error of a) - (error of b) over the common range, K. */
  sharedK: number;
  /** The same with the converter's inputs drawn apart for each channel, K. */
  independentK: number;
  runs: number;
  seed: number;
}

const POINTS = 13;
const cache = new Map<string, PairedDifference | null>();

/** null when the channels use different converters or their ranges do not overlap. */
export function pairedDifference(a: ChannelDef, b: ChannelDef, runs = 500, seed = 1): PairedDifference | null {
  const key = `${runs}|${seed}|${channelKey(a)}|${channelKey(b)}`;
  if (cache.has(key)) return cache.get(key)!;
  const r = compute(a, b, runs, seed);
  if (cache.size > 500) cache.delete(cache.keys().next().value!);
  cache.set(key, r);
  return r;
}

function compute(a: ChannelDef, b: ChannelDef, runs: number, seed: number): PairedDifference | null {
  if (a.adc.name !== b.adc.name) return null;
  const lo = Math.max(a.lowK, b.lowK);
  const hi = Math.min(a.highK, b.highK);
  if (!(hi > lo)) return null;
  const grid = Array.from({ length: POINTS }, (_, i) => (i === POINTS - 1 ? hi : lo + ((hi - lo) * i) / (POINTS - 1)));
  const fa = frameAt(makeFrame(a, 2), grid);
  const fb = frameAt(makeFrame(b, 2), grid);
  const shared = CONVERTER_INPUTS.filter((id) => fa.board.some((k) => k.id === id) && fb.board.some((k) => k.id === id));
  const inl = (f: BudgetFrame) => f.reading.some((k) => k.id === 'inl');
  if (shared.length === 0 && !(inl(fa) && inl(fb))) return null; // nothing of the converter's to share
  const spread = (share: boolean) => {
    const s = simulate(fa, fb, shared, share, runs, seed);
    let worst = 0;
    for (const x of s) {
      x.sort();
      worst = Math.max(worst, Math.abs(percentileSorted(x, 1)), Math.abs(percentileSorted(x, 99)));
    }
    return worst;
  };
  return { a: a.name, b: b.name, lowC: lo - 273.15, highC: hi - 273.15, shared: [...shared], sharedInl: inl(fa) && inl(fb), sharedK: spread(true), independentK: spread(false), runs, seed };
}

/** Per grid temperature, the boards' (error of a) - (error of b), uncalibrated, K. */
function simulate(fa: BudgetFrame, fb: BudgetFrame, shared: readonly string[], share: boolean, runs: number, seed: number): Float64Array[] {
  const rng = new Xoshiro128(seed);
  const G = fa.gridK.length;
  const out = Array.from({ length: G }, () => new Float64Array(runs));
  const ua = new Float64Array(fa.board.length);
  const ub = new Float64Array(fb.board.length);
  const ea = new Float64Array(fa.evalK.length);
  const eb = new Float64Array(fb.evalK.length);
  const ca = new Float64Array(fa.evalK.length);
  const cb = new Float64Array(fb.evalK.length);
  const pa = new InlProfile();
  const pb = new InlProfile();
  const amount = (f: BudgetFrame, id: string) => f.reading.find((k) => k.id === id)?.amount ?? 0;
  const reading = (f: BudgetFrame, p: InlProfile, codes: Float64Array, t: number) =>
    (rng.symmetric() * amount(f, 'quantisation') + (amount(f, 'inl') > 0 ? p.at(codes[t]! / f.full) * amount(f, 'inl') : 0)) * f.kPerLsb[t]!;
  for (let n = 0; n < runs; n++) {
    for (let i = 0; i < ua.length; i++) ua[i] = rng.draw('uniform');
    for (let i = 0; i < ub.length; i++) ub[i] = rng.draw('uniform');
    // The same numbers are drawn either way (common random numbers), so that the two figures
    // differ by the sharing alone and not by sampling.
    if (share) {
      for (const id of shared) ub[fb.board.findIndex((k) => k.id === id)] = ua[fa.board.findIndex((k) => k.id === id)]!;
    }
    pa.draw(rng, 'uniform');
    pb.draw(rng, 'uniform');
    const qb = share ? pa : pb;
    boardErrors(fa, ua, ea, ca);
    boardErrors(fb, ub, eb, cb);
    for (let t = 0; t < G; t++) out[t]![n] = ea[t]! + reading(fa, pa, ca, t) - eb[t]! - reading(fb, qb, cb, t);
  }
  return out;
}
