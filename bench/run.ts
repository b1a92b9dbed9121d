// npm run bench: every benchmark of the project, printed as figures (never asserted). Run from the
// bundle dist/bench.js (scripts/bundle.mjs --bench), so the engine is timed as it ships.
// BENCH_ONLY=scaling,lsp (names: engine, budget, lsp, felt, scaling, codegen) runs some of them.
import { benchEngine, runColdOnly } from './engine';
import { benchBudget } from './budget';
import { benchLsp, benchServerFelt } from './lsp';
import { benchCodegen } from './codegen';
import { benchScaling, runScaleChildIfAsked } from './scaling';

const BENCHES: [string, () => Promise<void>][] = [
  ['engine', benchEngine],
  ['budget', benchBudget],
  ['lsp', benchLsp],
  ['felt', benchServerFelt],
  ['scaling', benchScaling],
  ['codegen', benchCodegen],
];

async function main(): Promise<void> {
  if (runColdOnly() || (await runScaleChildIfAsked())) return;
  const only = process.env.BENCH_ONLY?.split(',').map((s) => s.trim()).filter(Boolean);
  console.log(`Thermoscribe benchmarks (${new Date().toISOString()}, node ${process.version}); figures are medians unless stated.`);
  for (const [name, bench] of BENCHES) if (!only || only.includes(name)) await bench();
}

void main();
