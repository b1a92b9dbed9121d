// An analysis with a budget allowance (engine.ts `errorBudget: n`): at most n missing worst-case
// budgets are computed, the other channels are listed as pending and their budget checks wait; once
// `keepWorstCaseBudget` has kept them, the next analysis with the same state gives exactly the
// diagnostics of a full analysis. What the language server's two-step publish rests on
// (lsp/diagnostics.ts). Facts of this design (common practice, no source).
import { describe, expect, it } from 'vitest';
import { analyse, DocumentState, keepWorstCaseBudget } from '../../../server/src/engine';
import { generateSpec } from '../../../bench/generate';

const FILE = '/virtual/rig.tsense';
const TEXT = generateSpec(6);
const codes = (a: { diagnostics: { code: string; span: { start: number } }[] }) => a.diagnostics.map((d) => `${d.code}@${d.span.start}`);

describe('worst-case budgets left pending', () => {
  const full = analyse({ path: FILE, text: TEXT });

  it('computes at most the allowance, lists the rest, and their accuracy check waits', () => {
    const fired = full.diagnostics.filter((d) => d.code === 'accuracy-unmet').length;
    expect(fired).toBe(6); // every generated channel misses its ±1 K target uncalibrated
    const a = analyse({ path: FILE, text: TEXT, state: new DocumentState(), errorBudget: 2 });
    expect(a.budgetsPending.map((r) => r.channel.name)).toEqual(['probe_2', 'probe_3', 'probe_4', 'probe_5']);
    expect(a.diagnostics.filter((d) => d.code === 'accuracy-unmet').length).toBe(2);
    expect(full.budgetsPending).toEqual([]);
  });

  it('once the pending budgets are kept, the next analysis is the full one and computes none', () => {
    const state = new DocumentState();
    const first = analyse({ path: FILE, text: TEXT, state, errorBudget: 2 });
    for (const r of first.budgetsPending) keepWorstCaseBudget(r);
    // An allowance of 0: every budget must come from the state.
    const next = analyse({ path: FILE, text: TEXT, state, errorBudget: 0 });
    expect(next.budgetsPending).toEqual([]);
    expect(codes(next)).toEqual(codes(full));
  });

  it('an edit of one channel needs one budget; the others are kept', () => {
    const state = new DocumentState();
    analyse({ path: FILE, text: TEXT, state });
    const at = TEXT.indexOf('.. 125 °C') + 3;
    const edited = TEXT.slice(0, at) + '120' + TEXT.slice(at + 3);
    const a = analyse({ path: FILE, text: edited, state, errorBudget: 0 });
    expect(a.budgetsPending.map((r) => r.channel.name)).toEqual(['probe_0']);
  });

  it('an edit while budgets are pending: the edited channel\'s budget first, the pending ones stay pending', () => {
    const state = new DocumentState();
    const first = analyse({ path: FILE, text: TEXT, state, errorBudget: 2 });
    expect(first.budgetsPending.map((r) => r.channel.name)).toEqual(['probe_2', 'probe_3', 'probe_4', 'probe_5']);
    const at = TEXT.lastIndexOf('.. 125 °C') + 3;
    const edited = TEXT.slice(0, at) + '120' + TEXT.slice(at + 3);
    const a = analyse({ path: FILE, text: edited, state, errorBudget: 2 });
    expect(a.budgetsPending.map((r) => r.channel.name)).toEqual(['probe_2', 'probe_3', 'probe_4']);
    // A full analysis computes every one.
    expect(analyse({ path: FILE, text: edited, state }).budgetsPending).toEqual([]);
  });
});
