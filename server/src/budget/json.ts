// The budget in the machine-readable report (check --format json, budget --format json).
import type { BudgetResult } from '../analysis/budget-types';

const r6 = (x: number) => Number(x.toPrecision(6));

/** What the figures of a share are (also in the JSON, so that a reader of the file knows). */
export const SHARE_DEFINITIONS = {
  swingAtWorstK: 'error moved by this input alone at either end of its tolerance, at sharesAtCelsius (the grid temperature of the largest worst-case error)',
  share: 'swingAtWorstK over the sum of every input\'s swingAtWorstK: a linear share of the worst case, not of the variance',
  varianceShare: 'Monte Carlo: squared correlation of the boards\' error at sharesAtCelsius with this input\'s draw or contribution; null without Monte Carlo or where not separable (the calibration readings\' INL is one curve per board with the reading\'s, under inl)',
  worstAtCelsius: 'temperature of the largest worst-case error, refined between grid temperatures',
};
const arr = (a: number[]) => a.map(r6);

export function budgetJson(b: BudgetResult) {
  return {
    channel: b.channel,
    units: 'temperatures in °C, errors in K (reported minus true)',
    shareDefinitions: SHARE_DEFINITIONS,
    method: b.method,
    corners: b.corners,
    monteCarlo: b.monteCarlo,
    accuracyK: b.accuracyK,
    celsius: arr(b.celsius),
    contributors: b.contributors,
    modes: b.modes.map((m) => ({
      ...modeFigures(m),
      shares: m.shares.map((s) => ({ id: s.id, label: s.label, swingAtWorstK: r6(s.swingAtWorstK), share: r6(s.share), varianceShare: s.varianceShare === null ? null : r6(s.varianceShare), maxSwingK: r6(s.maxSwingK) })),
      worstLow: arr(m.worstLow),
      worstHigh: arr(m.worstHigh),
      mc: m.mc ? { p1: arr(m.mc.p1), p5: arr(m.mc.p5), p50: arr(m.mc.p50), p95: arr(m.mc.p95), p99: arr(m.mc.p99), min: arr(m.mc.min), max: arr(m.mc.max) } : null,
    })),
    samplesOutsideWorstCase: b.samplesOutsideWorstCase,
    notes: b.notes,
  };
}

/** The short summary put in each channel of `check --format json`. */
export function budgetSummaryJson(b: BudgetResult) {
  return {
    method: b.method,
    monteCarlo: b.monteCarlo,
    accuracyK: b.accuracyK,
    modes: b.modes.map((m) => ({
      ...modeFigures(m),
      shares: m.shares.map((s) => ({ id: s.id, share: r6(s.share), varianceShare: s.varianceShare === null ? null : r6(s.varianceShare) })),
    })),
  };
}

/** The figures of one calibration mode that both renderings carry. */
function modeFigures(m: BudgetResult['modes'][number]) {
  return {
    mode: m.setting.mode,
    calibrationCelsius: m.setting.kelvins.map((k) => r6(k - 273.15)),
    worstAbsK: r6(m.worstAbsK),
    worstAtCelsius: r6(m.worstAtCelsius),
    sharesAtCelsius: r6(m.sharesAtCelsius),
    mcP99AbsK: m.mcP99AbsK === null ? null : r6(m.mcP99AbsK),
    dominant: m.dominant ? m.dominant.id : null,
  };
}
