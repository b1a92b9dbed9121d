// Speed of the error budget (printed, never asserted): worst case plus Monte Carlo of the default
// 1000 boards for each channel of the greenhouse sample. Run: npx tsx bench/budget.ts
import * as fs from 'node:fs';
import * as path from 'node:path';
import { analyse } from '../server/src/engine';
import { channelBudget } from '../server/src/budget/budget';

export async function benchBudget(): Promise<void> {
  console.log('== error budget per channel of samples/greenhouse.tsense (runs 0 = worst case only, the per-keystroke part)');
  const file = path.resolve(__dirname, '../samples/greenhouse.tsense');
  const host = { read: (p: string) => (fs.existsSync(p) ? fs.readFileSync(p, 'utf8') : undefined) };
  const a = analyse({ path: file, text: fs.readFileSync(file, 'utf8'), host });
  for (const r of a.channels) {
    channelBudget(r.channel, { runs: 200 }); // warm-up
    for (const runs of [0, 1000, 10000]) {
      const t0 = performance.now();
      const b = channelBudget(r.channel, { runs });
      const ms = performance.now() - t0;
      console.log(`  ${r.channel.name.padEnd(10)} runs ${String(runs).padStart(5)}: ${ms.toFixed(1).padStart(7)} ms (${b.method}, ${b.corners} corners, ${b.celsius.length} temperatures)`);
    }
  }
}

if (require.main === module) void benchBudget();
