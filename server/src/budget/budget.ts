// The error budget of one channel: worst case and Monte Carlo per temperature, for the spec's
// calibration and the other modes, with each contributor's share. The error is the temperature the
// firmware reports (nominal model inverse, then the calibration trim) minus the true temperature.
import type { ChannelDef } from '../model/types';
import { ZERO_CELSIUS_K } from '../physics/constants';
import { makeFrame, type BudgetFrame } from './frame';
import { REFINE, worstCase, type WorstCase } from './worst-case';
import { monteCarlo, monteCarloAsync, percentileSorted, type McSamples } from './monte-carlo';
import type { BudgetOptions, BudgetResult, CancellationToken, ContributorShare, ModeBudget, Progress } from '../analysis/budget-types';
import { effectiveOversamplingBits, noiseSuffices } from './oversampling';
import { trimNumber } from '../model/read-value';

export const DEFAULT_RUNS = 1000;
export const DEFAULT_SEED = 1;
/** Runs done on the keystroke path (language server, `check`); larger runs go to `budget`. */
export const LIVE_RUNS = 2000;

interface Plan {
  frame: BudgetFrame;
  runs: number;
  requestedRuns: number;
  seed: number;
  distribution: 'uniform' | 'normal';
  maxCorners: number;
}

function plan(c: ChannelDef, o: BudgetOptions): Plan {
  const requestedRuns = o.runs ?? c.monteCarlo?.runs ?? DEFAULT_RUNS;
  return {
    frame: makeFrame(c, o.points ?? 49),
    runs: requestedRuns,
    requestedRuns,
    seed: o.seed ?? c.monteCarlo?.seed ?? DEFAULT_SEED,
    distribution: c.monteCarlo?.distribution ?? 'uniform',
    maxCorners: o.maxCornerContributors ?? 12,
  };
}

/** Synchronous budget (for the keystroke path keep runs at or below LIVE_RUNS). */
export function channelBudget(c: ChannelDef, o: BudgetOptions = {}): BudgetResult {
  const p = plan(c, o);
  const wc = worstCase(p.frame, p.maxCorners);
  const mc = p.runs > 0 ? monteCarlo(p.frame, p.runs, p.seed, p.distribution, worstGridIndex(wc)) : null;
  return summarise(c, p, wc, mc);
}

/** The budget run by `analyse()`: the spec's runs up to LIVE_RUNS. */
export function liveBudget(c: ChannelDef): BudgetResult {
  const requested = c.monteCarlo?.runs ?? DEFAULT_RUNS;
  const r = channelBudget(c, { runs: Math.min(requested, LIVE_RUNS) });
  if (requested > LIVE_RUNS && r.monteCarlo) {
    r.monteCarlo.requestedRuns = requested;
    r.notes.push(`Monte Carlo ran ${LIVE_RUNS} of the ${requested} runs asked for while editing; \`thermoscribe budget\` runs them all.`);
  }
  return r;
}

/** Chunked budget for long runs: progress callback, cancellation (resolves null when cancelled). */
export async function channelBudgetAsync(c: ChannelDef, o: BudgetOptions = {}, token?: CancellationToken, progress?: Progress): Promise<BudgetResult | null> {
  const p = plan(c, o);
  const wc = worstCase(p.frame, p.maxCorners);
  if (token?.isCancellationRequested) return null;
  const mc = p.runs > 0 ? await monteCarloAsync(p.frame, p.runs, p.seed, p.distribution, token, progress, undefined, worstGridIndex(wc)) : null;
  if (p.runs > 0 && mc === null) return null;
  return summarise(c, p, wc, mc);
}

/** Per mode, the grid index of the largest worst-case |error| (where the shares are taken). */
function worstGridIndex(wc: WorstCase): number[] {
  return wc.low.map((lo, m) => {
    let best = -1;
    let at = 0;
    for (let t = 0; t < lo.length; t++) {
      const a = Math.max(Math.abs(lo[t]!), Math.abs(wc.high[m]![t]!));
      if (a > best) (best = a), (at = t);
    }
    return at;
  });
}

function summarise(c: ChannelDef, p: Plan, wc: WorstCase, mc: McSamples | null): BudgetResult {
  const f = p.frame;
  const G = f.gridK.length;
  const contributors = [...f.board, ...f.reading, ...f.calibration];
  const worstAt = worstGridIndex(wc);
  let outside = 0;
  const modes: ModeBudget[] = f.modes.map((setting, m) => {
    const low = [...wc.low[m]!];
    const high = [...wc.high[m]!];
    const worstT = worstAt[m]!;
    const swings = wc.swings[m]!;
    const total = swings.reduce((s, sw) => s + sw[worstT]!, 0);
    const shares: ContributorShare[] = contributors.map((k, i) => ({
      id: k.id,
      label: k.label,
      maxSwingK: Math.max(0, ...swings[i]!),
      swingAtWorstK: swings[i]![worstT]!,
      share: total > 0 ? swings[i]![worstT]! / total : 0,
      varianceShare: mc?.varianceShares?.[m]?.[i] ?? null,
    }));
    const dominant = shares.length ? shares.reduce((a, b) => (b.swingAtWorstK > a.swingAtWorstK ? b : a)) : null;
    let band: ModeBudget['mc'] = null;
    let mcP99AbsK: number | null = null;
    if (mc) {
      band = { p1: [], p5: [], p50: [], p95: [], p99: [], min: [], max: [] };
      mcP99AbsK = 0;
      for (let t = 0; t < G; t++) {
        const s = Float64Array.from(mc.samples[m]![t]!).sort();
        band.p1.push(percentileSorted(s, 1));
        band.p5.push(percentileSorted(s, 5));
        band.p50.push(percentileSorted(s, 50));
        band.p95.push(percentileSorted(s, 95));
        band.p99.push(percentileSorted(s, 99));
        band.min.push(s[0]!);
        band.max.push(s[s.length - 1]!);
        mcP99AbsK = Math.max(mcP99AbsK, Math.abs(band.p1[t]!), Math.abs(band.p99[t]!));
        const slack = 1e-9 * (1 + Math.abs(high[t]!) + Math.abs(low[t]!));
        for (const x of s) if (x > high[t]! + slack || x < low[t]! - slack) outside++;
      }
    }
    const r = wc.refined[m]!;
    return {
      setting,
      worstLow: low,
      worstHigh: high,
      mc: band,
      worstAbsK: r.absK,
      worstAtCelsius: r.atK - ZERO_CELSIUS_K,
      sharesAtCelsius: f.gridK[worstT]! - ZERO_CELSIUS_K,
      mcP99AbsK,
      shares,
      dominant: dominant && dominant.swingAtWorstK > 0 ? dominant : null,
    };
  });
  const notes: string[] = [];
  if ((c.oversamplingBits ?? 0) > 0 && effectiveOversamplingBits(c) === 0) {
    notes.push(noiseSuffices(c) === null ? 'Oversampling is not credited: the adc states no noise.' : 'Oversampling is not credited: the stated noise is below 0.5 LSB rms.');
  }
  const rail = Math.max(c.adc.reference.tolerance, c.bias.kind === 'current' ? 0 : c.bias.supply.tolerance);
  if (c.ratiometric && rail > 0) notes.push(`Ratiometric reading: the rail's tolerance (± ${trimNumber(rail * 100, 3)} %) feeds the divider and the converter's reference alike and cancels in the code, so it is not counted.`);
  notes.push('Input noise is not in the budget; ADC offset, gain and INL are taken as the bounds stated for the converter (the Monte Carlo draws one smooth INL curve per board within that bound).');
  if (f.modes.some((m) => m.kelvins.length > 0)) {
    notes.push(c.calReferenceK ? 'The calibration readings count their quantisation, the converter\'s INL and the reference thermometer (`cal_reference`).' : 'The calibration readings count their quantisation and the converter\'s INL; the reference thermometer is taken as exact (state `cal_reference`).');
  }
  if (G > 1) notes.push(`Worst case on ${G} temperatures ${trimNumber(f.gridK[1]! - f.gridK[0]!, 3)} K apart, refined between the neighbours of each worst point (${REFINE} more temperatures there).`);
  notes.push('Shares: each input\'s one-at-a-time swing over the sum of all swings at the grid\'s worst temperature (linear shares of the worst case); variance shares: the Monte Carlo\'s squared correlation of the error with each input there.');
  if (wc.method === 'corners' && outside > 0) notes.push(`${outside} Monte Carlo samples fall outside the corner band: the error is not monotonic in some input there.`);
  return {
    channel: c.name,
    celsius: f.gridK.map((k) => k - ZERO_CELSIUS_K),
    contributors,
    method: wc.method,
    corners: wc.corners,
    monteCarlo: mc ? { runs: mc.runs, seed: p.seed, distribution: p.distribution, requestedRuns: p.requestedRuns } : null,
    modes,
    stated: modes[0]!,
    accuracyK: c.accuracyK,
    samplesOutsideWorstCase: outside,
    notes,
  };
}
