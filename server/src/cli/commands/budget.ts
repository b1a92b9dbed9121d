// thermoscribe budget FILE [--channel NAME] [--runs N] [--seed S] [--format text|json] [--root DIR]
// Error budget per channel: worst case and Monte Carlo per calibration mode, contributor shares.
// Long runs report progress on stderr and stop cleanly on Ctrl+C (exit 130).
import { DiskHost } from '../io';
import { CHANNEL_OPTION, defineVerb, ROOT_OPTION, RUNS_OPTION, SEED_OPTION, shown, usageLine, type Outcome, type VerbSpec } from '../verb';
import { residualReport } from '../residuals';
import { table } from '../text';
import { analyseOne } from './check';
import { channelBudgetAsync } from '../../engine';
import { budgetJson } from '../../engine';
import { describeSetting, SHARES_EXPLAINED } from '../../engine';
import type { BudgetResult } from '../../engine';
import { trimNumber } from '../../engine';
import { fitMeasured } from '../../engine';
import type { ChannelDef } from '../../engine';
import { cautionFor } from '../../engine';

export const BUDGET: VerbSpec = {
  name: 'budget',
  files: 'one',
  options: { channel: CHANNEL_OPTION, runs: RUNS_OPTION, seed: SEED_OPTION, format: { kind: 'choice', values: ['text', 'json'] }, root: ROOT_OPTION },
};
export const BUDGET_USAGE = usageLine(BUDGET);

export const runBudget = defineVerb(BUDGET, async (args, io): Promise<Outcome> => {
  const format = args.text('format');
  const runs = args.whole('runs');
  const seed = args.whole('seed');
  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'string') return { unusable: a };
  const only = args.text('channel');
  const spec = { diagnostics: a.diagnostics, unprinted: { index: (f: string) => host.index(f) } };
  // An unknown name is unusable input, unless the spec has errors (which can be what hides it).
  if (only !== undefined && !a.model.channels.some((c) => c.name === only) && !a.diagnostics.some((d) => d.severity === 'error')) {
    return { unusable: `no channel named ${shown(only)}; channels: ${a.model.channels.map((c) => c.name).join(', ') || '(none)'}` };
  }
  // Only channels that were analysed: a channel with errors has no sound model to draw boards from.
  const analysed = new Set(a.channels.map((r) => r.channel.name));
  const channels = a.model.channels.filter((c) => (only === undefined || c.name === only) && analysed.has(c.name));
  if (channels.length === 0) {
    return { ...spec, failed: only !== undefined ? `channel ${shown(only)} could not be analysed; run \`thermoscribe check\` for the reasons` : 'the file has no channel that could be analysed' };
  }
  const token = { isCancellationRequested: false };
  const onSigint = () => (token.isCancellationRequested = true);
  process.once('SIGINT', onSigint);
  const results: { channel: ChannelDef; budget: BudgetResult }[] = [];
  try {
    for (const c of channels) {
      const b = await channelBudgetAsync(c, { ...(runs !== undefined ? { runs } : {}), ...(seed !== undefined ? { seed } : {}) }, token, (done, total) => {
        if (total >= 5000) io.err(`\r${c.name}: ${done} of ${total} boards`);
      });
      if (b === null) return { cancelled: true };
      results.push({ channel: c, budget: b });
    }
  } catch (err) {
    return { ...spec, failed: `cannot compute the budget: ${err instanceof Error ? err.message : String(err)}` };
  } finally {
    process.removeListener('SIGINT', onSigint);
  }
  if (format === 'json') io.out(JSON.stringify({ channels: results.map((r) => ({ ...budgetJson(r.budget), fit: fitJson(r.channel) })) }, null, 2) + '\n');
  else for (const r of results) io.out(budgetText(r.budget, r.channel) + '\n\n');
  if (format === 'text') io.out(cautionFor(results.map((r) => r.channel)) + '\n');
  return spec;
});

function fitJson(c: ChannelDef) {
  const f = fitMeasured(c);
  return f ? { parameters: f.parameters, rmsK: f.rmsK, points: f.points, outlier: f.outlier } : null;
}

const k3 = (x: number) => trimNumber(x, 3);

export function budgetText(b: BudgetResult, c: ChannelDef): string {
  const out: string[] = [];
  const mc = b.monteCarlo;
  out.push(`Error budget of channel ${b.channel}: ${b.method === 'corners' ? `all ${b.corners} corners` : 'sensitivity sum (over 12 inputs)'}` +
    (mc ? `, Monte Carlo ${mc.runs} boards (seed ${mc.seed}, ${mc.distribution})` : ', no Monte Carlo') +
    (b.accuracyK !== null ? `; target ±${k3(b.accuracyK)} K` : ''));
  out.push('');
  out.push(table(['mode', 'worst case K', 'at °C', 'MC 1-99 % K', 'dominant'], b.modes.map((m) => [
    describeSetting(m.setting) + (m === b.stated ? ' (stated)' : ''),
    `±${k3(m.worstAbsK)}`,
    trimNumber(m.worstAtCelsius, 4),
    m.mcP99AbsK !== null ? `±${k3(m.mcP99AbsK)}` : '-',
    m.dominant ? m.dominant.label : '-',
  ])));
  out.push('');
  out.push(`Contributors (${describeSetting(b.stated.setting)}; swing at ${trimNumber(b.stated.sharesAtCelsius, 4)} °C and its shares):`);
  const pc = (x: number | null) => (x === null ? '-' : `${trimNumber(x * 100, 3)} %`);
  out.push(table(['input', 'swing K', 'share of swings', 'variance share', 'max swing K'], b.stated.shares.map((s) => [s.label, k3(s.swingAtWorstK), pc(s.share), pc(s.varianceShare), k3(s.maxSwingK)])));
  out.push(SHARES_EXPLAINED);
  out.push('');
  const s = b.stated;
  const rows = b.celsius.map((t, i) => [trimNumber(t, 4), k3(s.worstLow[i]!), k3(s.worstHigh[i]!), ...(s.mc ? [k3(s.mc.p1[i]!), k3(s.mc.p50[i]!), k3(s.mc.p99[i]!)] : [])]);
  out.push(table(['°C', 'worst low', 'worst high', ...(s.mc ? ['MC 1 %', 'MC 50 %', 'MC 99 %'] : [])], rows));
  const residuals = residualReport(c);
  if (residuals) out.push(residuals.replace(/^\n\n/, '\n'));
  for (const n of b.notes) out.push(`Note: ${n}`);
  return out.join('\n');
}
