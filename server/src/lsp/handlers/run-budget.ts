// Custom request behind "Run Full Error Budget": the channel's whole Monte Carlo run (the spec's
// runs, or `runs`), off the keystroke path, in chunks (budget/budget.ts channelBudgetAsync):
//   thermoscribe/runBudget {uri, channel?, runs?, seed?}
//     -> {ok: true, budget} | {ok: false, message, channels}; error RequestCancelled when cancelled.
// Progress goes to the editor as LSP work-done progress: on the request's own workDoneToken when
// the client sends one, else on a progress the server creates (window/workDoneProgress/create),
// which carries a cancel button. Either cancellation ($/cancelRequest or the button) stops the run
// between chunks. Shapes follow the Language Server Protocol 3.17 specification.
import { ErrorCodes, LSPErrorCodes, ResponseError, type CancellationToken, type WorkDoneProgressReporter } from 'vscode-languageserver/node';
import { channelBudgetAsync } from '../../engine';
import { budgetSummaryJson } from '../../engine';
import type { ServerContext } from '../context';
import { channelOf } from './channel-of';
import { refuseAfterShutdown } from '../guard';

export const RUN_BUDGET = 'thermoscribe/runBudget';

export interface RunBudgetParams {
  uri: string;
  channel?: string;
  /** Monte Carlo runs, 10 .. 1000000 (default: the spec's, else 1000). */
  runs?: number;
  /** Seed, 0 .. 4294967295 (default: the spec's, else 1). */
  seed?: number;
  workDoneToken?: string | number;
}

export interface RunBudgetResult {
  ok: boolean;
  /** The budget summary (budget/json.ts budgetSummaryJson) with the channel's name. */
  budget?: { channel: string; notes: string[] } & ReturnType<typeof budgetSummaryJson>;
  message?: string;
  channels?: string[];
}

function wholeIn(v: unknown, lo: number, hi: number, what: string): number | undefined {
  if (v === undefined) return undefined;
  if (typeof v !== 'number' || !Number.isInteger(v) || v < lo || v > hi) {
    throw new ResponseError(ErrorCodes.InvalidParams, `thermoscribe/runBudget: ${what} must be a whole number from ${lo} to ${hi} (found ${String(v)})`);
  }
  return v;
}

function cancelled(): ResponseError<void> {
  return new ResponseError(LSPErrorCodes.RequestCancelled, 'the error budget run was cancelled');
}

export async function onRunBudget(ctx: ServerContext, params: RunBudgetParams, token: CancellationToken): Promise<RunBudgetResult> {
  if (typeof params?.uri !== 'string' || (params.channel !== undefined && typeof params.channel !== 'string')) {
    throw new ResponseError(ErrorCodes.InvalidParams, 'thermoscribe/runBudget needs {uri, channel}');
  }
  const runs = wholeIn(params.runs, 10, 1_000_000, 'runs');
  const seed = wholeIn(params.seed, 0, 4294967295, 'seed');
  const found = channelOf(ctx, params.uri, params.channel);
  if (!found.ok) return found;
  const r = found.result;
  const c = r.channel;
  const title = `Error budget of ${c.name}`;
  let progress: WorkDoneProgressReporter;
  let buttonToken: CancellationToken | undefined;
  if (params.workDoneToken !== undefined) {
    progress = ctx.connection.window.attachWorkDoneProgress(params.workDoneToken);
  } else {
    try {
      const created = await ctx.connection.window.createWorkDoneProgress();
      progress = created;
      buttonToken = created.token;
    } catch {
      // The client refused the progress: run without one (the request can still be cancelled).
      progress = ctx.connection.window.attachWorkDoneProgress(undefined);
    }
  }
  const stop = { get isCancellationRequested() { return token.isCancellationRequested || buttonToken?.isCancellationRequested === true; } };
  if (stop.isCancellationRequested) {
    progress.done();
    throw cancelled();
  }
  progress.begin(title, 0, 'worst case', true);
  try {
    let last = -1;
    const b = await channelBudgetAsync(c, { ...(runs !== undefined ? { runs } : {}), ...(seed !== undefined ? { seed } : {}) }, stop, (done, total) => {
      const pct = Math.floor((100 * done) / total);
      if (pct === last) return;
      last = pct;
      progress.report(pct, `${done} of ${total} Monte Carlo boards`);
    });
    if (b === null || stop.isCancellationRequested) throw cancelled();
    return { ok: true, budget: { channel: c.name, ...budgetSummaryJson(b), notes: b.notes } };
  } finally {
    progress.done();
  }
}

/**
 * The request handler: like guard() (lsp/guard.ts) for a promise. A ResponseError (bad params,
 * cancelled) goes to the client; anything else is logged and answered with a message.
 */
export function runBudgetHandler(ctx: ServerContext): (params: RunBudgetParams, token: CancellationToken) => Promise<RunBudgetResult> {
  return async (params, token) => {
    refuseAfterShutdown(ctx.connection, RUN_BUDGET);
    try {
      return await onRunBudget(ctx, params, token);
    } catch (err) {
      if (err instanceof ResponseError) throw err;
      ctx.connection.console.error(`thermoscribe: ${RUN_BUDGET} failed for ${params?.uri ?? 'no document'}: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
      return { ok: false, message: `the error budget failed: ${err instanceof Error ? err.message : String(err)}`, channels: [] };
    }
  };
}
