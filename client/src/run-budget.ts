// "Thermoscribe: Run Full Error Budget": the channel's whole Monte Carlo run, off the keystroke path.
// The server does the work (thermoscribe/runBudget) and drives the editor's progress notification
// itself (window/workDoneProgress/create), whose cancel button stops the run. The result goes to an
// output channel: worst case and Monte Carlo p99 per calibration mode.
import * as vscode from 'vscode';
import type { LanguageClient } from '../../node_modules/vscode-languageclient/lib/node/main';
import { specTarget } from './spec-target';

const COMMAND = 'thermoscribe.runBudget';
const REQUEST = 'thermoscribe/runBudget';
/** LSP RequestCancelled. */
const REQUEST_CANCELLED = -32800;

interface ModeSummary {
  mode: string;
  calibrationCelsius: number[];
  worstAbsK: number;
  worstAtCelsius: number;
  mcP99AbsK: number | null;
  dominant: string | null;
}
interface BudgetAnswer {
  ok: boolean;
  message?: string;
  channels?: string[];
  budget?: { channel: string; accuracyK: number | null; monteCarlo: { runs: number; seed: number; distribution: string } | null; modes: ModeSummary[]; notes: string[] };
}

let output: vscode.OutputChannel | undefined;

export function registerRunBudget(context: vscode.ExtensionContext, getClient: () => LanguageClient | undefined): void {
  context.subscriptions.push(vscode.commands.registerCommand(COMMAND, (uri?: unknown, channel?: unknown) => runBudget(context, getClient, uri, channel)));
}

async function runBudget(context: vscode.ExtensionContext, getClient: () => LanguageClient | undefined, uriArg?: unknown, channelArg?: unknown): Promise<void> {
  const target = specTarget(uriArg, getClient, 'run the error budget of one of its channels');
  if (!target) return;
  const { uri, client } = target;
  let channel = typeof channelArg === 'string' ? channelArg : undefined;
  try {
    if (!channel) {
      // No channel given (command palette): the server names the channels of the spec.
      const listing = await client.sendRequest<BudgetAnswer | null>(REQUEST, { uri });
      const names = listing && !listing.ok ? listing.channels ?? [] : [];
      if (names.length === 0) {
        void vscode.window.showWarningMessage('Thermoscribe: this spec has no channel to run the error budget for.');
        return;
      }
      channel = names.length === 1 ? names[0] : await vscode.window.showQuickPick(names, { title: 'Run the full error budget of which channel?', placeHolder: 'channel name' });
      if (!channel) return;
    }
    const answer = await client.sendRequest<BudgetAnswer | null>(REQUEST, { uri, channel });
    if (!answer?.ok || !answer.budget) {
      void vscode.window.showWarningMessage(`Thermoscribe: ${answer?.message ?? 'no answer from the language server'}`);
      return;
    }
    show(context, answer.budget);
  } catch (err) {
    if ((err as { code?: number })?.code === REQUEST_CANCELLED) {
      void vscode.window.showInformationMessage(`Thermoscribe: error budget of ${channel ?? 'the channel'} cancelled.`);
      return;
    }
    void vscode.window.showErrorMessage(`Thermoscribe: ${err instanceof Error ? err.message : String(err)}`);
  }
}

const k = (x: number) => `${x.toPrecision(3)} K`;

function show(context: vscode.ExtensionContext, b: NonNullable<BudgetAnswer['budget']>): void {
  if (!output) {
    output = vscode.window.createOutputChannel('Thermoscribe Error Budget');
    context.subscriptions.push(output);
  }
  const mc = b.monteCarlo;
  const lines = [
    `Error budget of ${b.channel}` + (mc ? ` (Monte Carlo: ${mc.runs} boards, seed ${mc.seed}, ${mc.distribution})` : ' (no Monte Carlo)') + (b.accuracyK !== null ? `; target ± ${k(b.accuracyK)}` : ''),
    ...b.modes.map((m, i) => {
      const at = m.calibrationCelsius.length ? ` at ${m.calibrationCelsius.map((c) => `${c} °C`).join(' and ')}` : '';
      return `  ${m.mode}${at}${i === 0 ? ' (the spec)' : ''}: worst case ± ${k(m.worstAbsK)} at ${m.worstAtCelsius.toFixed(1)} °C, Monte Carlo p99 ${m.mcP99AbsK === null ? 'n/a' : `± ${k(m.mcP99AbsK)}`}${m.dominant ? `, largest swing ${m.dominant}` : ''}`;
    }),
    ...b.notes.map((n) => `  note: ${n}`),
    '  Caution: a design estimate; verify against a calibrated reference and follow local codes and the applicable safety standards.',
    '',
  ];
  output.append(lines.join('\n'));
  output.show(true);
  const s = b.modes[0];
  if (s) void vscode.window.showInformationMessage(`Thermoscribe: ${b.channel} (${s.mode}): worst case ± ${k(s.worstAbsK)}, Monte Carlo p99 ${s.mcP99AbsK === null ? 'n/a' : `± ${k(s.mcP99AbsK)}`}. Details in the output.`);
}
