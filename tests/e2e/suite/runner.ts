// A tiny test runner for the in-editor suite: named async checks run in order, each with its own
// verdict, no test framework needed. Results go to the extension host console (prefixed
// `[thermoscribe-e2e]`) and, when THERMOSCRIBE_E2E_RESULTS names a file, to that file as JSON.
import { writeFileSync } from 'node:fs';

export interface CheckResult {
  name: string;
  ok: boolean;
  ms: number;
  error?: string;
}

export type Check = { name: string; fn: () => Promise<void> };

export async function runChecks(checks: Check[]): Promise<CheckResult[]> {
  const results: CheckResult[] = [];
  for (const check of checks) {
    const t0 = Date.now();
    try {
      await check.fn();
      results.push({ name: check.name, ok: true, ms: Date.now() - t0 });
      console.log(`[thermoscribe-e2e] PASS ${check.name} (${Date.now() - t0} ms)`);
    } catch (err) {
      const error = err instanceof Error ? err.message : String(err);
      results.push({ name: check.name, ok: false, ms: Date.now() - t0, error });
      console.log(`[thermoscribe-e2e] FAIL ${check.name} (${Date.now() - t0} ms): ${error}`);
    }
  }
  const passed = results.filter((r) => r.ok).length;
  console.log(`[thermoscribe-e2e] suite: ${passed} passed, ${results.length - passed} failed`);
  const out = process.env.THERMOSCRIBE_E2E_RESULTS;
  if (out) writeFileSync(out, JSON.stringify(results, null, 2) + '\n');
  return results;
}

export function assert(condition: unknown, message: string): asserts condition {
  if (!condition) throw new Error(message);
}
