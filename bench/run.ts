// npm run bench: every benchmark of the project, printed as figures (never asserted).
import * as fs from 'node:fs';
import * as path from 'node:path';

async function main(): Promise<void> {
  console.log(`Thermoscribe benchmarks (${new Date().toISOString()}, node ${process.version}); figures are medians unless stated.`);
  const { benchEngine } = await import('./engine');
  await benchEngine();
  // Benchmarks of other layers are run when their module exists.
  for (const [file, fn] of [['budget.ts', 'benchBudget'], ['lsp.ts', 'benchLsp'], ['codegen.ts', 'benchCodegen']] as const) {
    if (!fs.existsSync(path.join(__dirname, file))) continue;
    const mod = (await import(`./${file.replace(/\.ts$/, '')}`)) as Record<string, () => Promise<void>>;
    if (typeof mod[fn] === 'function') await mod[fn]!();
  }
}

void main();
