// accuracy-unmet: the worst-case error after the stated calibration exceeds the accuracy target.
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { trimNumber } from './format';
import type { ModeBudget } from '../analysis/budget-types';
import { describeSetting } from '../budget/describe';

/** A channel that clips or cannot be biased has its real problem reported already. */
const DEFERS_TO = ['clip-high', 'clip-low', 'clip-tolerance', 'supply-too-low'];

export function checkAccuracy({ channel: c, result, sink, reported }: CheckContext): void {
  const b = result.worstCaseBudget;
  if (!b || c.accuracyK === null || DEFERS_TO.some((code) => reported.has(code))) return;
  // Same conditions as checks/clip.ts (which does not mark `reported`).
  const s0 = result.summary;
  const vref = c.adc.reference.value;
  if (s0.voltsMax >= vref * (1 - c.adc.reference.tolerance) || s0.voltsMin < 0) return;
  const s = b.stated;
  if (!(s.worstAbsK > c.accuracyK)) return;
  const order: Record<string, number> = { none: 0, 'one-point': 1, 'two-point': 2 };
  const better = b.modes
    .filter((m) => order[m.setting.mode]! > order[s.setting.mode]! && m.worstAbsK <= c.accuracyK!)
    .sort((x, y) => order[x.setting.mode]! - order[y.setting.mode]!)[0];
  const dom = s.dominant;
  const mc = s.mcP99AbsK !== null ? ` (Monte Carlo 1-99 %: ±${trimNumber(s.mcP99AbsK, 3)} K)` : '';
  const fix = better
    ? `${describeSetting(better.setting)} would meet it (worst case ±${trimNumber(better.worstAbsK, 3)} K)`
    : noneMeets(b.modes.find((m) => m.setting.mode === 'two-point') ?? s);
  sink.report('accuracy-unmet', c.file, fieldSpan(c, 'accuracy'),
    `worst-case error ±${trimNumber(s.worstAbsK, 3)} K at ${trimNumber(s.worstAtCelsius, 4)} °C with ${describeSetting(s.setting)}${mc} exceeds the ±${trimNumber(c.accuracyK, 3)} K target; ` +
      (dom ? `dominant: ${dom.label} (${trimNumber(dom.share * 100, 2)} % of the summed one-at-a-time swings); ` : '') + fix,
    { worstK: s.worstAbsK, dominant: dom?.id ?? null, ...(better ? { calibration: calibrationText(better) } : {}) });
}

/** When even the best calibration misses: what it leaves and what dominates then. */
function noneMeets(best: ModeBudget): string {
  const d = best.dominant;
  return `no calibration mode meets it (${describeSetting(best.setting)} leaves ±${trimNumber(best.worstAbsK, 3)} K${d ? `, mostly ${d.label}` : ''})` +
    (d ? `: ${advice(d.id, d.label)}` : '');
}

function advice(id: string, label: string): string {
  if (id === 'quantisation' || id === 'cal-quantisation') return 'more counts per kelvin are needed (resolution)';
  if (id === 'cal-reference') return 'calibrate against a better reference thermometer (cal_reference)';
  return `tighten the ${label.replace(/^calibration readings: /, '').replace(/ ±.*$/, '')}`;
}

/** Spec text of a calibration setting, for a quick fix. */
function calibrationText(m: ModeBudget): string {
  const c = (k: number) => `${trimNumber(k - 273.15, 4)} °C`;
  if (m.setting.mode === 'one-point') return `one point at ${c(m.setting.kelvins[0]!)}`;
  if (m.setting.mode === 'two-point') return `two points at ${c(m.setting.kelvins[0]!)} and ${c(m.setting.kelvins[1]!)}`;
  return 'none';
}
