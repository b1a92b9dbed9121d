// The "Error budget" section of a channel's hover: worst-case error before and after each
// calibration mode, the Monte Carlo 1-99 % figure, the top contributors' shares and the dominant one.
import type { BudgetResult } from '../analysis/budget-types';
import { describeSetting } from '../budget/describe';
import * as f from '../analysis/figures';
import { SHARES_EXPLAINED } from '../budget/describe';

const TOP = 5;

export function budgetHoverSection(b: BudgetResult): string {
  const mc = b.monteCarlo;
  const target = b.accuracyK;
  const verdict = (k: number) => (target === null ? '' : k <= target ? ' ✓' : ' ✗');
  const order = ['none', 'one-point', 'two-point'];
  const modes = [...b.modes].sort((x, y) => order.indexOf(x.setting.mode) - order.indexOf(y.setting.mode));
  const rows = modes.map((m) => `| ${describeSetting(m.setting)}${m === b.stated ? ' (stated)' : ''} | ±${f.kelvinDelta(m.worstAbsK)}${verdict(m.worstAbsK)} at ${f.celsius(m.worstAtCelsius)} | ${m.mcP99AbsK !== null ? `±${f.kelvinDelta(m.mcP99AbsK)}` : '-'} |`);
  const s = b.stated;
  const top = [...s.shares].filter((x) => x.swingAtWorstK > 0).sort((x, y) => y.swingAtWorstK - x.swingAtWorstK).slice(0, TOP);
  const shares = top.map((x) => `| ${x.label} | ${f.kelvinDelta(x.swingAtWorstK)} | ${f.percent(x.share)} | ${x.varianceShare === null ? '-' : f.percent(x.varianceShare)} |`);
  return [
    `**Error budget** (${b.method === 'corners' ? `worst case over ${b.corners} corner${b.corners === 1 ? '' : 's'}` : 'worst case by summed sensitivities'}; ` +
      `${mc ? `Monte Carlo ${mc.runs} boards, seed ${mc.seed}` : 'no Monte Carlo'}${target !== null ? `; target ±${f.kelvinDelta(target)}` : ''})`,
    `| calibration | worst case | Monte Carlo 1–99 % |\n|---|---:|---:|\n${rows.join('\n')}`,
    top.length
      ? `Largest contributors (${describeSetting(s.setting)}, at ${f.celsius(s.sharesAtCelsius)}):\n\n| input | swing | share of swings | variance share |\n|---|---:|---:|---:|\n${shares.join('\n')}\n\n` +
        `${SHARES_EXPLAINED}`
      : 'No contributor moves the reading.',
    s.dominant ? `Dominant: **${s.dominant.label}** (${f.percent(s.dominant.share)} of the summed swings)` : '',
  ].filter(Boolean).join('\n\n');
}
