// thermoscribe: the command-line face of the engine (check, report, gen, serve).
import { runCheck, CHECK_USAGE } from './commands/check';
import { runReport, REPORT_USAGE } from './commands/report';
import { runBudget, BUDGET_USAGE } from './commands/budget';
import { runPlot, PLOT_USAGE } from './commands/plot';
import { runGen, GEN_USAGE } from './commands/gen';
import { runCompare, COMPARE_USAGE } from './commands/compare';
import { runTrimBoards, TRIM_BOARDS_USAGE } from './commands/trim-boards';
import { EXIT, type CliIO } from './io';
import { VERSION } from './version';

const USAGE = `thermoscribe ${VERSION}: design checks for ADC temperature channels

usage:
  ${CHECK_USAGE}
  ${REPORT_USAGE}
  ${BUDGET_USAGE}
                                    error budget: worst case, Monte Carlo, calibration
  ${PLOT_USAGE}
                                    one channel's transfer curve, error bands and response as SVG
  ${GEN_USAGE}
                                    write the channels' C conversion code and header
  ${COMPARE_USAGE}
                                    alternative sensor designs of one measurement side by side
  ${TRIM_BOARDS_USAGE}
                                    each board's trims for the generated set_trim, from its calibration readings
  thermoscribe serve --stdio        start the language server on stdin/stdout
  thermoscribe --version
`;

export function main(argv: string[], io: CliIO): number | 'serving' {
  const [verb, ...rest] = argv;
  switch (verb) {
    case 'check':
      return runCheck(rest, io);
    case 'report':
      return runReport(rest, io);
    case 'compare':
      return runCompare(rest, io);
    case 'budget':
      // Asynchronous (long Monte Carlo runs yield, report progress, stop on Ctrl+C): it sets the exit code itself.
      void Promise.resolve(runBudget(rest, io)).then((code) => {
        process.exitCode = code;
      });
      return 'serving';
    case 'plot':
      // Asynchronous like budget (Monte Carlo, then the drawing): it sets the exit code itself.
      void Promise.resolve(runPlot(rest, io)).then((code) => {
        process.exitCode = code;
      });
      return 'serving';
    case 'gen':
      return runGen(rest, io);
    case 'trim-boards':
      return runTrimBoards(rest, io);
    case 'serve':
      // Loaded here, not with the CLI: the protocol library costs every other verb about 40 ms to load.
      import('../lsp/start').then(
        ({ startServer }) => startServer(),
        (err: unknown) => {
          io.err(`thermoscribe: internal error: the language server could not load: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
          process.exitCode = EXIT.unusable;
        },
      );
      return 'serving';
    case '--version':
      io.out(VERSION + '\n');
      return EXIT.clean;
    case undefined:
    case 'help':
    case '--help':
    case '-h':
      io.out(USAGE);
      return verb === undefined ? EXIT.unusable : EXIT.clean;
    default:
      io.err(`thermoscribe: unknown command '${verb}'\n${USAGE}`);
      return EXIT.unusable;
  }
}

/** Entry point of the bundled CLI. */
export function run(): void {
  // A reader that stops early (`thermoscribe report ... | head`) closes the pipe: finish quietly,
  // as other command-line tools do, instead of failing on the next write.
  for (const stream of [process.stdout, process.stderr]) {
    stream.on('error', (err: NodeJS.ErrnoException) => {
      if (err.code === 'EPIPE') process.exit(process.exitCode ?? 0);
      throw err;
    });
  }
  const io: CliIO = { out: (t) => process.stdout.write(t), err: (t) => process.stderr.write(t), cwd: process.cwd() };
  let code: number | 'serving';
  try {
    code = main(process.argv.slice(2), io);
  } catch (err) {
    io.err(`thermoscribe: internal error: ${err instanceof Error ? err.stack ?? err.message : String(err)}\n`);
    code = EXIT.unusable;
  }
  if (code !== 'serving') process.exitCode = code;
}
