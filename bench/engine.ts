// Engine benchmark: parse+analyse time for the samples and a 200-channel spec, and
// operating-point solves per second. Prints medians; asserts nothing.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { SERVER_NODE_FLAGS } from '../client/src/server-flags';
import { analyse, DocumentState } from '../server/src/engine';
import { parse } from '../server/src/syntax/parse';
import { DiskHost } from '../server/src/cli/io';
import { junctionAtTemperature, operatingPointAt, solveResistorBiasAmps } from '../server/src/sensors/junction/physics';
import { generateSpec } from './generate';
import { median, timeRuns, timeRunsOn, verdict } from './stats';

const ROOT = path.resolve(__dirname, '..');

export async function benchEngine(): Promise<void> {
  console.log('== engine: parse + analyse (median of repeated runs)');
  const host = new DiskHost();
  for (const f of fs.readdirSync(path.join(ROOT, 'samples')).filter((x) => x.endsWith('.tsense'))) {
    const p = path.join(ROOT, 'samples', f);
    const text = host.read(p)!;
    const t = median(timeRuns(() => analyse({ path: p, text, host }), 30));
    console.log(`  samples/${f.padEnd(34)} ${t.toFixed(2)} ms`);
  }
  const big = generateSpec(200);
  const lines = big.split('\n').length;
  const channels = analyse({ path: '/bench/big.tsense', text: big }).channels.length;
  console.log(`  generated spec: ${channels} channels, ${lines} lines (every run below uses a spec no cache has seen)`);
  // Each cold figure in a node process of its own, so that one figure's garbage never lands in the
  // next one's collections; the analysis also as the editor starts the language server.
  const parseMs = coldInChild('parse', []);
  const analyseMs = coldInChild('analyse', []);
  const asServer = coldInChild('analyse', SERVER_NODE_FLAGS);
  const budgetMs = coldInChild('budget', SERVER_NODE_FLAGS);
  const ms = (v: number | string) => (typeof v === 'number' ? `${v.toFixed(2)} ms` : `not measured (${v})`);
  console.log(`    parse alone                                             ${ms(parseMs)}`);
  console.log(`    parse + analyse (every check but accuracy-unmet)        ${ms(analyseMs)}  (a node process with default options)`);
  console.log(`      the same as the language server runs (${SERVER_NODE_FLAGS.join(' ')}): ${ms(asServer)}${typeof asServer === 'number' ? `  (target <= 20 ms: ${verdict(asServer <= 20)})` : ''}`);
  console.log(`    parse + analyse with the worst-case error budget        ${ms(budgetMs)}  (all checks; as the server runs)`);
  // The language server keeps a DocumentState per document: after an edit only the blocks it
  // touched are read again. Retype the first channel's upper range end, each version new
  // (124, 123, ... 85 °C: from 99 on the edit also moves every block below it).
  const state = new DocumentState();
  const endAt = big.indexOf('.. 125 °C') + 3;
  analyse({ path: '/bench/big.tsense', text: big, state });
  let end = 125;
  const tw = median(timeRunsOn(() => big.slice(0, endAt) + String(--end) + big.slice(endAt + 3), (t) => analyse({ path: '/bench/big.tsense', text: t, state }), 37));
  console.log(`    parse + analyse after a one-channel edit (editor path)  ${tw.toFixed(2)} ms  (all checks; per-document caches)`);

  console.log('== engine: operating-point solves per second (resistor bias, Lambert W)');
  const params = { kind: 'npn' as const, IS: 1e-14, N: 1, BF: 200, EG: 1.11, XTI: 3, XTB: 0, TNOM: 300.15, RS: 2 };
  const temps = Array.from({ length: 166 }, (_, i) => 233.15 + i);
  const at = temps.map((k) => junctionAtTemperature(params, k));
  const n = 2_000_000;
  const rawRate = rate(() => {
    let acc = 0;
    for (let i = 0; i < n; i++) {
      const j = at[i % at.length]!;
      acc += solveResistorBiasAmps(j.isx, 100e3 + j.seriesOhms, j.nVt, 3.3);
    }
    return acc;
  }, n);
  const bias = { kind: 'resistor' as const, ohms: 100e3, supply: 3.3 };
  const fullRate = rate(() => {
    let acc = 0;
    for (let i = 0; i < n; i++) acc += operatingPointAt(at[i % at.length]!, bias).volts;
    return acc;
  }, n);
  console.log(`  current only (solveResistorBiasAmps): ${(rawRate / 1e6).toFixed(2)} M solves/s  (target >= 2 M/s: ${verdict(rawRate >= 2e6)})`);
  console.log(`  full operating point with exact slope: ${(fullRate / 1e6).toFixed(2)} M solves/s`);
}

/** Command-line flag of the bench: time one cold figure only (`--cold=analyse`) and print it. */
const COLD = '--cold=';
type ColdFigure = 'parse' | 'analyse' | 'budget';

/** Cold parse or analyse of the 200-channel spec, median; every run on a spec no cache has seen. */
function coldFigure(what: ColdFigure): number {
  // Fresh variants so that no cache (budgets by content, definitions by parsed block) ever hits.
  let variant = 1;
  const fresh = () => generateSpec(200, variant++);
  if (what === 'parse') return median(timeRunsOn(fresh, (t) => parse(t), 31));
  if (what === 'analyse') return median(timeRunsOn(fresh, (t) => analyse({ path: '/bench/big.tsense', text: t, errorBudget: false }), 31));
  return median(timeRunsOn(fresh, (t) => analyse({ path: '/bench/big.tsense', text: t }), 11));
}

/** Runs this bench again in a child with the given node options to time one cold figure. */
function coldInChild(what: ColdFigure, nodeFlags: readonly string[]): number | string {
  const child = spawnSync(process.execPath, [...process.execArgv, ...nodeFlags, process.argv[1]!, COLD + what], { encoding: 'utf8' });
  const v = Number(/^cold ([\d.]+)$/m.exec(child.stdout)?.[1]);
  return Number.isFinite(v) ? v : (child.stderr || child.error?.message || 'no output').trim().split('\n')[0]!;
}

/** True when this process was started to time one cold figure (it then prints it and stops). */
export function runColdOnly(): boolean {
  const arg = process.argv.find((a) => a.startsWith(COLD));
  if (!arg) return false;
  const what = arg.slice(COLD.length);
  if (what !== 'parse' && what !== 'analyse' && what !== 'budget') throw new Error(`unknown cold figure '${what}'`);
  console.log(`cold ${coldFigure(what)}`);
  return true;
}

function rate(fn: () => number, n: number): number {
  fn(); // warm-up
  const runs: number[] = [];
  for (let r = 0; r < 5; r++) {
    const t0 = process.hrtime.bigint();
    fn();
    runs.push(Number(process.hrtime.bigint() - t0) / 1e9);
  }
  return n / median(runs);
}

if (require.main === module && !runColdOnly()) void benchEngine();
