// npm run bench: every benchmark of the project, printed as figures (never asserted). Run from the
// bundle dist/bench.js (scripts/bundle.mjs --bench), so the engine is timed as it ships.
import { benchEngine, runColdOnly } from './engine';
import { benchBudget } from './budget';
import { benchLsp } from './lsp';
import { benchCodegen } from './codegen';

async function main(): Promise<void> {
  console.log(`Thermoscribe benchmarks (${new Date().toISOString()}, node ${process.version}); figures are medians unless stated.`);
  await benchEngine();
  await benchBudget();
  await benchLsp();
  await benchCodegen();
}

if (!runColdOnly()) void main();
