// Live budgets by channel content, so that a keystroke recomputes only the channel it changed.
import type { ChannelDef } from '../model/types';
import { channelKey } from '../analysis/cache';
import { liveBudget } from './budget';
import type { BudgetResult } from './types';

const LIMIT = 200;
const cache = new Map<string, BudgetResult>();

export function cachedLiveBudget(c: ChannelDef): BudgetResult {
  const key = channelKey(c);
  const hit = cache.get(key);
  if (hit) return hit;
  const b = liveBudget(c);
  if (cache.size >= LIMIT) cache.delete(cache.keys().next().value!);
  cache.set(key, b);
  return b;
}
