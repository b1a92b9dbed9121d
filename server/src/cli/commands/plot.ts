// thermoscribe plot FILE --channel NAME --out FILE.svg [--chart both|transfer|error|dynamics|residuals] [--runs N] [--seed S] [--root DIR]
// Writes one channel's charts as an SVG file (atomically): the transfer curve, the error against
// temperature per calibration mode, and (when the channel states its dynamics) the step response
// and the ramp lag with the chosen firmware filter, and (when it has measured points) their
// residuals against the fitted model with the outlier rule's limits. Exit status: the one rule of cli/verb.ts (a failed drawing or write is 1).
import * as path from 'node:path';
import { DiskHost } from '../io';
import { writeFilesTogether } from '../write-files';
import { defineVerb, ROOT_OPTION, RUNS_OPTION, SEED_OPTION, shown, usageLine, type Outcome, type VerbSpec } from '../verb';
import { analyseOne } from './check';
import { channelBudgetAsync } from '../../engine';
import { CHART_KINDS, plotData, plotProblem, type ChartKind } from '../../engine';
import { plotSpec } from '../../engine';
import { renderSvg } from '../../engine';
import type { Analysis, Diagnostic } from '../../engine';

export const PLOT: VerbSpec = {
  name: 'plot',
  files: 'one',
  options: {
    channel: { kind: 'name', meta: 'NAME', required: true },
    out: { kind: 'output', meta: 'FILE.svg', required: true },
    chart: { kind: 'choice', values: CHART_KINDS },
    runs: RUNS_OPTION,
    seed: SEED_OPTION,
    root: ROOT_OPTION,
  },
};
export const PLOT_USAGE = usageLine(PLOT);

export const runPlot = defineVerb(PLOT, async (args, io): Promise<Outcome> => {
  const channel = args.text('channel')!;
  const out = args.text('out')!;
  const chart = args.text('chart') as ChartKind;
  const runs = args.whole('runs');
  const seed = args.whole('seed');
  const outAbs = path.resolve(io.cwd, out);

  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'string') return { unusable: a };
  const spec = { diagnostics: a.diagnostics, unprinted: { index: (f: string) => host.index(f) } };
  // As with gen: nothing is drawn from a spec with errors (a figure people act on). First, as an
  // error can be what hides the channel.
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length > 0) return { ...spec, failed: `${blockedBy(a, channel, errors)}; fix ${errors.length === 1 ? 'it' : 'them'} first (nothing was written)` };
  if (!a.model.channels.some((c) => c.name === channel)) return { unusable: `no channel named ${shown(channel)}; channels: ${a.model.channels.map((c) => c.name).join(', ') || '(none)'}` };
  const result = a.channels.find((r) => r.channel.name === channel);
  if (!result) return { ...spec, failed: `channel ${shown(channel)} cannot be analysed; run \`thermoscribe check\` for the reason (nothing was written)` };

  let budget = null;
  if (chart === 'both' || chart === 'error') {
    const token = { isCancellationRequested: false };
    const onSigint = () => (token.isCancellationRequested = true);
    process.once('SIGINT', onSigint);
    try {
      budget = await channelBudgetAsync(result.channel, { ...(runs !== undefined ? { runs } : {}), ...(seed !== undefined ? { seed } : {}) }, token, (done, total) => {
        if (total >= 5000) io.err(`\r${channel}: ${done} of ${total} boards`);
      });
      if (budget === null) return { cancelled: true };
    } catch (err) {
      return { ...spec, failed: `cannot compute the error budget of ${shown(channel)}: ${err instanceof Error ? err.message : String(err)} (nothing was written)` };
    } finally {
      process.removeListener('SIGINT', onSigint);
    }
  }

  const data = plotData(result, budget);
  const problem = plotProblem(data, chart);
  if (problem) return { ...spec, failed: `${problem} (nothing was written)` };
  let svg: string;
  try {
    svg = await renderSvg(plotSpec(data, { chart }));
  } catch (err) {
    return { ...spec, failed: `drawing failed: ${err instanceof Error ? err.message : String(err)} (nothing was written)` };
  }
  const failed = writeFilesTogether([{ file: outAbs, text: svg.endsWith('\n') ? svg : svg + '\n' }]);
  if (failed) return { ...spec, failed: `cannot write ${out}: ${failed}` };
  const drawn = chart === 'both'
    ? ['transfer curve', 'error budget', ...(data.dynamics ? ['response'] : []), ...(data.residuals ? ['residuals'] : [])]
    : [{ transfer: 'transfer curve', error: 'error budget', dynamics: 'step response and ramp lag', residuals: 'residuals of the measured points' }[chart]];
  io.out(`wrote ${path.relative(io.cwd, outAbs) || outAbs} (${drawn.slice(0, -1).join(', ')}${drawn.length > 1 ? ' and ' : ''}${drawn.at(-1)} of channel ${channel})\n`);
  return spec;
});

/** Which errors keep the channel from being drawn: its own block's first, then the rest of the spec's (all printed above). */
function blockedBy(a: Analysis, channel: string, errors: readonly Diagnostic[]): string {
  const block = a.files[0]?.parse.tree.items.find((b) => b.kind === 'block' && b.keyword.text === 'channel' && b.name.text === channel);
  const own = block ? errors.filter((d) => d.file === a.path && d.span.start >= block.span.start && d.span.start < block.span.end).length : 0;
  const total = `${errors.length} error${errors.length === 1 ? '' : 's'}`;
  if (own === errors.length) return `channel ${shown(channel)} has ${total} (listed above)`;
  if (own > 0) return `channel ${shown(channel)} has ${own} of the spec's ${total} (listed above)`;
  return `the spec has ${total} (listed above), none in channel ${shown(channel)}'s block, and a spec with errors is not drawn`;
}
