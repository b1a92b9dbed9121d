// Protocol tests of thermoscribe/runBudget (the editor's "Run Full Error Budget"), through the real
// server process: work-done progress (window/workDoneProgress/create, $/progress begin/report/end),
// cancellation by $/cancelRequest and by the progress's cancel button (window/workDoneProgress/cancel),
// both answered with the error RequestCancelled (-32800). Message shapes and codes follow the
// Language Server Protocol 3.17 specification (microsoft.github.io/language-server-protocol). The
// Monte Carlo figures are compared with the engine's synchronous budget for the same seed and runs
// (a self-consistency check of the chunked run; the budget's own figures are checked against
// published equations in tests/unit/budget). The spec is the invented greenhouse sample.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { CancellationTokenSource } from 'vscode-jsonrpc/node';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { channelBudget } from '../../server/src/budget/budget';
import { budgetSummaryJson } from '../../server/src/budget/json';
import { DiskHost } from '../../server/src/cli/io';
import { analyse } from '../../server/src/engine';
import { ensureBuilt, ROOT, TestClient } from './client';

interface Progress {
  token: string | number;
  value: { kind: 'begin' | 'report' | 'end'; title?: string; percentage?: number; message?: string; cancellable?: boolean };
}
interface Answer {
  ok: boolean;
  message?: string;
  channels?: string[];
  budget?: { channel: string; monteCarlo: { runs: number; seed: number } | null; modes: { mode: string; worstAbsK: number; mcP99AbsK: number | null }[] };
}

let dir: string;
let file: string;
let client: TestClient;
let uri: string;
const created: (string | number)[] = [];
const progress: Progress[] = [];
let onProgress: ((p: Progress) => void) | undefined;

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-run-budget-'));
  fs.cpSync(path.join(ROOT, 'samples'), dir, { recursive: true });
  client = await TestClient.start({ rootDir: dir, settings: { debounceMs: 0 }, workDoneProgress: true });
  client.conn.onRequest('window/workDoneProgress/create', (p: { token: string | number }) => {
    created.push(p.token);
    return null;
  });
  client.conn.onUnhandledProgress((p) => {
    const q = p as Progress;
    progress.push(q);
    onProgress?.(q);
  });
  file = path.join(dir, 'greenhouse.tsense');
  uri = client.open(file);
  await client.diagnostics(uri);
});

afterAll(async () => {
  await client.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

const of = (token: string | number) => progress.filter((p) => p.token === token).map((p) => p.value);

/** Sends a long run and cancels it at its first progress report with `cancel(token)`; returns the error. */
async function cancelAtFirstReport(cancel: (token: string | number, source: CancellationTokenSource) => void): Promise<{ error: { code?: number; message?: string }; token: string | number }> {
  const source = new CancellationTokenSource();
  let token: string | number | undefined;
  onProgress = (p) => {
    if (p.value.kind === 'report' && token === undefined) {
      token = p.token;
      onProgress = undefined;
      cancel(p.token, source);
    }
  };
  const error = await client.conn.sendRequest('thermoscribe/runBudget', { uri, channel: 'bench_air', runs: 1_000_000 }, source.token).then(
    () => ({}),
    (e: { code?: number; message?: string }) => e,
  );
  return { error, token: token! };
}

describe('thermoscribe/runBudget', () => {
  it('reports work-done progress and returns the same figures as the synchronous budget for the seed and runs', async () => {
    const before = created.length;
    const r = await client.request<Answer>('thermoscribe/runBudget', { uri, channel: 'bench_air', runs: 3000, seed: 11 });
    expect(r.ok).toBe(true);
    expect(created.length).toBe(before + 1);
    const token = created[created.length - 1]!;
    const values = of(token);
    // LSP 3.17 work-done progress: one begin, reports, one end, in that order.
    expect(values[0]!.kind).toBe('begin');
    expect(values[0]!.cancellable).toBe(true);
    expect(values[0]!.title).toMatch(/bench_air/);
    expect(values[values.length - 1]!.kind).toBe('end');
    const reports = values.filter((v) => v.kind === 'report');
    expect(reports.length).toBeGreaterThanOrEqual(2);
    const pct = reports.map((v) => v.percentage!);
    expect([...pct].sort((a, b) => a - b)).toEqual(pct);
    expect(pct[pct.length - 1]).toBe(100);
    expect(reports[reports.length - 1]!.message).toMatch(/3000 of 3000/);

    const a = analyse({ path: file, text: fs.readFileSync(file, 'utf8'), root: dir, host: new DiskHost() });
    const c = a.channels.find((x) => x.channel.name === 'bench_air')!.channel;
    const want = budgetSummaryJson(channelBudget(c, { runs: 3000, seed: 11 }));
    expect(r.budget!.monteCarlo).toEqual(want.monteCarlo);
    expect(r.budget!.modes).toEqual(want.modes);
    expect(r.budget!.modes.map((m) => m.mode).sort()).toEqual(['none', 'one-point', 'two-point']);
  });

  it('stops on $/cancelRequest: the request ends with RequestCancelled and the progress ends', async () => {
    const { error, token } = await cancelAtFirstReport((_t, source) => source.cancel());
    expect(error.code).toBe(-32800);
    const values = of(token);
    expect(values[values.length - 1]!.kind).toBe('end');
    // Stopped long before the million boards: the last report is far from 100 %.
    const last = values.filter((v) => v.kind === 'report').pop()!;
    expect(last.percentage!).toBeLessThan(50);
  });

  it("stops on the progress's cancel button (window/workDoneProgress/cancel)", async () => {
    const { error, token } = await cancelAtFirstReport((t) => void client.conn.sendNotification('window/workDoneProgress/cancel', { token: t }));
    expect(error.code).toBe(-32800);
    expect(of(token).pop()!.kind).toBe('end');
  });

  it('keeps serving after a cancelled run, names the channels, and refuses bad runs with the range', async () => {
    const r = await client.request<Answer>('thermoscribe/runBudget', { uri });
    expect(r.ok).toBe(false);
    expect(r.channels).toEqual(['bench_air', 'soil', 'heat_mat', 'canopy']);
    const unknown = await client.request<Answer>('thermoscribe/runBudget', { uri, channel: 'attic' });
    expect(unknown.message).toMatch(/no channel named 'attic'/);
    const bad = await client.request('thermoscribe/runBudget', { uri, channel: 'soil', runs: 5 }).then(
      () => null,
      (e: { code: number; message: string }) => e,
    );
    expect(bad?.code).toBe(-32602);
    expect(bad?.message).toMatch(/runs must be a whole number from 10 to 1000000 \(found 5\)/);
    const ok = await client.request<Answer>('thermoscribe/runBudget', { uri, channel: 'soil', runs: 200 });
    expect(ok.ok).toBe(true);
    expect(ok.budget!.monteCarlo!.runs).toBe(200);
  });
});
