// The budget in the machine-readable report (check --format json, budget --format json).
import type { BudgetResult } from './types';

const r6 = (x: number) => Number(x.toPrecision(6));
const arr = (a: number[]) => a.map(r6);

export function budgetJson(b: BudgetResult) {
  return {
    channel: b.channel,
    units: 'temperatures in °C, errors in K (reported minus true)',
    method: b.method,
    corners: b.corners,
    monteCarlo: b.monteCarlo,
    accuracyK: b.accuracyK,
    celsius: arr(b.celsius),
    contributors: b.contributors,
    modes: b.modes.map((m) => ({
      ...modeFigures(m),
      shares: m.shares.map((s) => ({ id: s.id, label: s.label, swingAtWorstK: r6(s.swingAtWorstK), share: r6(s.share), maxSwingK: r6(s.maxSwingK) })),
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
      shares: m.shares.map((s) => ({ id: s.id, share: r6(s.share) })),
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
    mcP99AbsK: m.mcP99AbsK === null ? null : r6(m.mcP99AbsK),
    dominant: m.dominant ? m.dominant.id : null,
  };
}
