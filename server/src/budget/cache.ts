// Budgets by channel content, so that a keystroke recomputes only the channel it changed.
// Two kinds: the worst case alone (what the accuracy check needs on every analysis) and the full
// budget with Monte Carlo (computed only when something asks: hover, JSON, plots, the CLI).
import type { ChannelDef } from '../model/types';
import { channelKey } from '../analysis/cache';
import { channelBudget, liveBudget } from './budget';
import type { BudgetResult } from './types';

const LIMIT = 5000;
const full = new Map<string, BudgetResult>();
const worst = new Map<string, BudgetResult>();

function cached(map: Map<string, BudgetResult>, c: ChannelDef, compute: () => BudgetResult): BudgetResult {
  const key = channelKey(c);
  const hit = map.get(key);
  if (hit) return hit;
  const b = compute();
  if (map.size >= LIMIT) map.delete(map.keys().next().value!);
  map.set(key, b);
  return b;
}

/** The full live budget: worst case and Monte Carlo (up to LIVE_RUNS runs). */
export function cachedLiveBudget(c: ChannelDef): BudgetResult {
  return cached(full, c, () => liveBudget(c));
}

/** The worst case alone (no Monte Carlo), on the same temperature grid as the full budget. */
export function cachedWorstCaseBudget(c: ChannelDef): BudgetResult {
  const hit = full.get(channelKey(c));
  return hit ?? cached(worst, c, () => channelBudget(c, { runs: 0 }));
}
