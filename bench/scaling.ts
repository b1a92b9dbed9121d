// Scaling: every CLI verb and the language server's open and edit paths on the generated specs of
// 25 to 3,200 channels, with the growth exponent of each (least-squares slope of log time against
// log channels; 1 is linear). Each figure is timed in a fresh node process (a CLI verb: the verb's
// own run inside the process, without node's start-up; the server: a process per size), so one
// figure's garbage never lands in another's collections. Printed, never asserted.
//   BENCH_SCALING_MAX=400       caps every size (default 3200)
//   BENCH_SCALING_HEAVY_MAX=N   caps gen, budget and compare (default 400: their work per channel
//                               is a design search or a Monte Carlo, about 50-60 ms a channel at
//                               100 channels; 3200 runs them all, the bench's longest run)
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { SERVER_NODE_FLAGS } from '../client/src/server-flags';
import { runCheck } from '../server/src/cli/commands/check';
import { runReport } from '../server/src/cli/commands/report';
import { runBudget } from '../server/src/cli/commands/budget';
import { runGen } from '../server/src/cli/commands/gen';
import { runCompare } from '../server/src/cli/commands/compare';
import { runPlot } from '../server/src/cli/commands/plot';
import { ensureBuilt, TestClient, type Position } from '../tests/protocol/client';
import { generateSpec } from './generate';
import { analyse } from '../server/src/engine';
import { median } from './stats';

export const SIZES = [25, 100, 400, 1600, 3200] as const;
const TARGET_EXPONENT = 1.1;
const HEAVY = new Set(['gen', 'budget', 'compare']);
const VERBS = ['check', 'report', 'budget', 'gen', 'compare', 'plot'] as const;
type Verb = (typeof VERBS)[number];

function envSize(name: string, fallback: number): number {
  const v = Number(process.env[name]);
  return Number.isFinite(v) && v > 0 ? v : fallback;
}

/** Least-squares slope of log(time) against log(channels). */
export function growthExponent(points: readonly { n: number; ms: number }[]): number {
  const p = points.filter((x) => x.ms > 0);
  if (p.length < 2) return NaN;
  const xs = p.map((x) => Math.log(x.n));
  const ys = p.map((x) => Math.log(x.ms));
  const mx = xs.reduce((a, b) => a + b, 0) / xs.length;
  const my = ys.reduce((a, b) => a + b, 0) / ys.length;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < xs.length; i++) {
    sxy += (xs[i]! - mx) * (ys[i]! - my);
    sxx += (xs[i]! - mx) ** 2;
  }
  return sxy / sxx;
}

/** The verb's arguments on a spec file (budget with its default 1000 boards; plot of the last channel). */
function verbArgs(verb: Verb, file: string, channels: number, out: string): string[] {
  switch (verb) {
    case 'gen':
      return [file, '--out', path.join(out, 'conv.c')];
    case 'plot':
      return [file, '--channel', `probe_${channels - 1}`, '--out', path.join(out, 'plot.svg')];
    default:
      return [file];
  }
}

const RUN: Record<Verb, (argv: string[], io: { out(t: string): void; err(t: string): void; cwd: string }) => number | Promise<number>> = {
  check: runCheck,
  report: runReport,
  budget: runBudget,
  gen: runGen,
  compare: runCompare,
  plot: runPlot,
};

const ONE = '--scale-verb=';

/** In a child process: runs one verb once and prints its wall and CPU time. */
export async function runScaleChildIfAsked(): Promise<boolean> {
  const arg = process.argv.find((a) => a.startsWith(ONE));
  if (!arg) return false;
  const [verb, file, n, out] = arg.slice(ONE.length).split('|') as [Verb, string, string, string];
  let bytes = 0;
  const io = { out: (t: string) => void (bytes += t.length), err: (t: string) => void (bytes += t.length), cwd: path.dirname(file) };
  const cpu0 = process.cpuUsage();
  const t0 = process.hrtime.bigint();
  const code = await RUN[verb](verbArgs(verb, file, Number(n), out), io);
  const wall = Number(process.hrtime.bigint() - t0) / 1e6;
  const cpu = process.cpuUsage(cpu0);
  console.log(`scale ${wall} ${(cpu.user + cpu.system) / 1000} ${code} ${bytes}`);
  return true;
}

interface Figure {
  n: number;
  ms: number;
  cpu?: number;
}

function timeVerb(verb: Verb, file: string, n: number, out: string): Figure | string {
  const child = spawnSync(process.execPath, [...process.execArgv, process.argv[1]!, `${ONE}${verb}|${file}|${n}|${out}`], { encoding: 'utf8', maxBuffer: 1 << 26 });
  const m = /^scale ([\d.]+) ([\d.]+) (\d+)/m.exec(child.stdout);
  if (!m) return (child.stderr || child.error?.message || 'no output').trim().split('\n')[0]!;
  return { n, ms: Number(m[1]), cpu: Number(m[2]) };
}

function positionOf(text: string, offset: number): Position {
  const before = text.slice(0, offset);
  const line = before.split('\n').length - 1;
  return { line, character: offset - (before.lastIndexOf('\n') + 1) };
}

/** Open → first diagnostics, and the median of 9 one-number edits → their diagnostics, in one server process per size (debounce 0). */
async function timeServer(file: string, text: string, n: number): Promise<{ open: Figure; edit: Figure } | string> {
  const client = await TestClient.start({ rootDir: path.dirname(file), initializationOptions: { debounceMs: 0 }, settings: { debounceMs: 0 } });
  try {
    let t0 = process.hrtime.bigint();
    const uri = client.open(file, text);
    await client.diagnostics(uri, 1);
    const open = Number(process.hrtime.bigint() - t0) / 1e6;
    // Edits start once the open's diagnostics are complete (the budgets the server computes after
    // its first publish included), as the engine gives them: what a keystroke costs alone.
    const codes = (d: { code?: string | number }[]) => d.map((x) => x.code).join();
    const full = codes(analyse({ path: file, text }).diagnostics);
    await client.diagnosticsWhere(uri, (d) => codes(d) === full);
    // Retype the upper end of the middle channel's range, each version a number no earlier one had.
    const at = text.indexOf('.. 125 °C', Math.floor(text.length / 2)) + 3;
    const start = positionOf(text, at);
    let current = '125';
    const edits: number[] = [];
    for (let i = 0; i < 12; i++) {
      const next = String(124 - i);
      t0 = process.hrtime.bigint();
      const v = client.edit(uri, { start, end: { line: start.line, character: start.character + current.length } }, next);
      await client.diagnostics(uri, v);
      if (i >= 3) edits.push(Number(process.hrtime.bigint() - t0) / 1e6);
      current = next;
    }
    return { open: { n, ms: open }, edit: { n, ms: median(edits) } };
  } catch (e) {
    return (e as Error).message;
  } finally {
    await client.stop();
  }
}

function row(label: string, figures: (Figure | string | undefined)[], key: 'ms' | 'cpu' = 'ms'): string {
  const cells = figures.map((f) => (f === undefined ? '—' : typeof f === 'string' ? 'failed' : (f[key] ?? f.ms).toFixed(f.ms < 100 ? 1 : 0)));
  const ok = figures.filter((f): f is Figure => typeof f === 'object').map((f) => ({ n: f.n, ms: f[key] ?? f.ms }));
  const k = growthExponent(ok);
  const verdict = Number.isFinite(k) ? `${k.toFixed(2)}  ${k <= TARGET_EXPONENT ? 'PASS' : 'MISS'}` : 'n/a';
  return `  ${label.padEnd(26)}${cells.map((c) => c.padStart(10)).join('')}   ${verdict}`;
}

export async function benchScaling(): Promise<void> {
  const max = envSize('BENCH_SCALING_MAX', 3200);
  const heavyMax = Math.min(max, envSize('BENCH_SCALING_HEAVY_MAX', 400));
  const sizes = SIZES.filter((n) => n <= max);
  ensureBuilt();
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thermoscribe-scale-'));
  console.log(`\n== scaling: generated specs of ${sizes.join(', ')} channels (gen, budget, compare up to ${heavyMax}); ms per run, exponent = slope of log time on log channels (target <= ${TARGET_EXPONENT})`);
  console.log(`   CLI verbs: the verb's run in a fresh node process (CPU time, user + system; wall time beside); server: ${SERVER_NODE_FLAGS.join(' ')}, debounce 0, wall time`);
  console.log(`  ${'figure'.padEnd(26)}${sizes.map((n) => String(n).padStart(10)).join('')}   exponent`);
  const texts = new Map<number, string>();
  for (const n of sizes) {
    const text = generateSpec(n);
    texts.set(n, text);
    fs.writeFileSync(path.join(dir, `rig-${n}.tsense`), text);
  }
  try {
    for (const verb of VERBS) {
      const figs = sizes.map((n) => (HEAVY.has(verb) && n > heavyMax ? undefined : timeVerb(verb, path.join(dir, `rig-${n}.tsense`), n, dir)));
      console.log(row(`${verb} (CPU)`, figs, 'cpu'));
      console.log(row(`${verb} (wall)`, figs, 'ms'));
      const failed = figs.find((f) => typeof f === 'string');
      if (failed) console.log(`    ${verb} failed: ${failed}`);
    }
    const open: (Figure | string)[] = [];
    const edit: (Figure | string)[] = [];
    for (const n of sizes) {
      const r = await timeServer(path.join(dir, `rig-${n}.tsense`), texts.get(n)!, n);
      open.push(typeof r === 'string' ? r : r.open);
      edit.push(typeof r === 'string' ? r : r.edit);
    }
    console.log(row('server open -> diagnostics', open));
    console.log(row('server edit -> diagnostics', edit));
  } finally {
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

if (require.main === module) void runScaleChildIfAsked().then((child) => (child ? undefined : benchScaling()));
