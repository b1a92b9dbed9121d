// Engine benchmark: parse+analyse time for the samples and a 200-channel spec, and
// operating-point solves per second. Prints medians; asserts nothing.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { analyse, ParseCache, SweepCache } from '../server/src/engine';
import { loadWorkspace } from '../server/src/model/workspace';
import { resolveModel } from '../server/src/model/resolve';
import { DiagnosticSink } from '../server/src/checks/diagnostic';
import { analyseChannel } from '../server/src/analysis/sweep';
import { CHANNEL_CHECKS } from '../server/src/checks/index';
import { checkAccuracy } from '../server/src/checks/accuracy';
import { parse } from '../server/src/syntax/parse';
import { DiskHost } from '../server/src/cli/io';
import { junctionAtTemperature, operatingPointAt, solveResistorBiasAmps } from '../server/src/physics/junction';
import { generateSpec } from './generate';
import { median, timeRuns, verdict } from './stats';

const ROOT = path.resolve(__dirname, '..');
const NO_FILES = { read: () => undefined };

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
  // Fresh variants so that the module-level budget cache and the sweep cache never hit.
  let variant = 1;
  const specs = Array.from({ length: 40 }, () => generateSpec(200, variant++));
  let k = 0;
  const tp = median(timeRuns(() => parse(specs[k++ % specs.length]!), 15));
  const parsedSpecs = specs.map((t) => loadWorkspace('/bench/big.tsense', t, '/bench', NO_FILES, new DiagnosticSink()));
  k = 0;
  const tSweep = median(timeRuns(() => {
    const files = parsedSpecs[k++ % parsedSpecs.length]!;
    const sink = new DiagnosticSink();
    const model = resolveModel(files, sink);
    for (const c of model.channels) {
      const result = analyseChannel(c);
      const reported = new Set<string>();
      for (const check of CHANNEL_CHECKS) if (check !== checkAccuracy) check({ channel: c, result, sink, reported });
    }
  }, 15, 0));
  k = 0;
  const tAnalyse = median(timeRuns(() => analyse({ path: '/bench/big.tsense', text: specs[k++ % specs.length]! }), 15, 0));
  console.log(`    parse alone                                            ${tp.toFixed(2)} ms`);
  console.log(`    resolve + sweep + checks (no error budget), after parse ${tSweep.toFixed(2)} ms  (target <= 20 ms: ${verdict(tSweep <= 20)})`);
  console.log(`    parse + analyse with the live worst-case error budget   ${tAnalyse.toFixed(2)} ms  (cold: no cache)`);
  // The language server keeps a ParseCache and SweepCache per document: after an edit to one
  // channel only that block is parsed and swept again. Alternate two versions differing in one bias.
  const cache = new SweepCache();
  const parseCache = new ParseCache();
  const edited = big.replace('current 10 uA ± 1 %', 'current 11 uA ± 1 %');
  analyse({ path: '/bench/big.tsense', text: big, cache, parseCache });
  let flip = false;
  const tw = median(timeRuns(() => analyse({ path: '/bench/big.tsense', text: (flip = !flip) ? edited : big, cache, parseCache }), 15));
  console.log(`    parse + analyse after a one-channel edit (editor path)  ${tw.toFixed(2)} ms  (per-document parse and sweep caches)`);

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

if (require.main === module) void benchEngine();
