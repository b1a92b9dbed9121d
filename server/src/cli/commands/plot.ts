// thermoscribe plot FILE --channel NAME --out FILE.svg [--chart both|transfer|error] [--runs N] [--seed S] [--root DIR]
// Writes one channel's charts as an SVG file (atomically): the transfer curve and the error against
// temperature per calibration mode. Exit 0 written, 1 the budget or the drawing failed, 2 unusable input.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { parseArgs, wholeNumberOption } from '../args';
import { DiskHost, EXIT, type CliIO } from '../io';
import { writeFilesTogether } from '../write-files';
import { analyseOne } from './check';
import { channelBudgetAsync } from '../../budget/budget';
import { plotData } from '../../plot/data';
import { plotSpec, type ChartKind } from '../../plot/spec';
import { renderSvg } from '../../plot/render';

export const PLOT_USAGE = 'thermoscribe plot FILE --channel NAME --out FILE.svg [--chart both|transfer|error] [--runs N] [--seed S] [--root DIR]';

const CHARTS: ChartKind[] = ['both', 'transfer', 'error'];

export async function runPlot(argv: string[], io: CliIO): Promise<number> {
  const args = parseArgs(argv, ['channel', 'out', 'chart', 'runs', 'seed', 'root']);
  const fail = (m: string) => (io.err(`thermoscribe plot: ${m}\nusage: ${PLOT_USAGE}\n`), EXIT.unusable);
  if (typeof args === 'string') return fail(args);
  if (args.positional.length !== 1) return fail('name exactly one .tsense file');
  const channel = args.options.get('channel');
  if (typeof channel !== 'string' || channel === '') return fail('--channel NAME is required');
  const out = args.options.get('out');
  if (typeof out !== 'string' || out === '') return fail('--out FILE.svg is required');
  const chart = String(args.options.get('chart') ?? 'both') as ChartKind;
  if (!CHARTS.includes(chart)) return fail(`--chart takes ${CHARTS.join(', ')} (got '${chart}')`);
  const runs = wholeNumberOption(args, 'runs', 0, 1_000_000);
  const seed = wholeNumberOption(args, 'seed', 0, 4294967295);
  if (typeof runs === 'string') return fail(runs);
  if (typeof seed === 'string') return fail(seed);
  const outAbs = path.resolve(io.cwd, out);
  if (!fs.existsSync(path.dirname(outAbs))) return fail(`the folder of --out does not exist: ${path.dirname(outAbs)}`);

  const host = new DiskHost();
  const a = analyseOne(args, io, host);
  if (typeof a === 'number') return a;
  const result = a.channels.find((r) => r.channel.name === channel);
  if (!result) {
    const defined = a.model.channels.find((c) => c.name === channel);
    const names = a.channels.map((r) => r.channel.name);
    return fail(defined
      ? `channel '${channel}' cannot be analysed (run \`thermoscribe check\` for the reason); channels that can: ${names.join(', ') || '(none)'}`
      : `no channel named '${channel}'; channels: ${a.model.channels.map((c) => c.name).join(', ') || '(none)'}`);
  }

  let budget = null;
  if (chart !== 'transfer') {
    const token = { isCancellationRequested: false };
    const onSigint = () => (token.isCancellationRequested = true);
    process.once('SIGINT', onSigint);
    try {
      budget = await channelBudgetAsync(result.channel, { ...(runs !== undefined ? { runs } : {}), ...(seed !== undefined ? { seed } : {}) }, token, (done, total) => {
        if (total >= 5000) io.err(`\r${channel}: ${done} of ${total} boards`);
      });
      if (budget === null) return (io.err('\nthermoscribe plot: cancelled\n'), 130);
    } catch (err) {
      io.err(`thermoscribe plot: cannot compute the error budget of '${channel}': ${err instanceof Error ? err.message : String(err)}\n`);
      return EXIT.errors;
    } finally {
      process.removeListener('SIGINT', onSigint);
    }
  }

  let svg: string;
  try {
    svg = await renderSvg(plotSpec(plotData(result, budget), { chart }));
  } catch (err) {
    io.err(`thermoscribe plot: drawing failed: ${err instanceof Error ? err.message : String(err)}\n`);
    return EXIT.errors;
  }
  const failed = writeFilesTogether([{ file: outAbs, text: svg.endsWith('\n') ? svg : svg + '\n' }]);
  if (failed) return (io.err(`thermoscribe plot: cannot write ${out}: ${failed}\n`), EXIT.errors);
  io.out(`wrote ${path.relative(io.cwd, outAbs) || outAbs} (${chart === 'both' ? 'transfer curve and error budget' : chart === 'transfer' ? 'transfer curve' : 'error budget'} of channel ${channel})\n`);
  return EXIT.clean;
}
