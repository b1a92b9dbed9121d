// The spec and the outputs of the extreme-values tests (#17 items 8, 9, 10): a spec with a junction,
// a thermistor and an RTD channel whose numbers a test replaces, and every output rendered from it
// (hostile-values.test.ts and hostile-values-alone.test.ts).
import { expect } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { formatDiagnostic } from '../../../server/src/cli/text';
import { channelReport } from '../../../server/src/cli/commands/report';
import { budgetText } from '../../../server/src/cli/commands/budget';
import { groupText } from '../../../server/src/cli/commands/compare';
import { compareGroups } from '../../../server/src/compare/compare';
import { analysisJson } from '../../../server/src/report/json';
import { budgetJson } from '../../../server/src/budget/json';
import { hover } from '../../../server/src/features/hover';
import { inlayHints } from '../../../server/src/features/inlay';
import { plotData, plotProblem } from '../../../server/src/plot/data';
import { plotSpec } from '../../../server/src/plot/spec';
import { LineIndex } from '../../../server/src/syntax/line-index';

export const EXTREMES = ['0', '-0', '1e-320', '5e-324', '1e-30', '1e-12', '1e308', '1.7976931348623157e308', '1e30', '-1e308', '-1e-320', '123456789.12345678', '1e6', '0.1'];

/** The extremes put into each slot alone (the property test draws from all of them). */
export const ALONE = ['-0', '1e-320', '1e308'];

/** Each slot: its normal value (an invented, working design) or an extreme. */
export const SLOTS: Record<string, string> = {
  IS: '10', tolIS: '20', N: '1', BF: '200', EG: '1.11', XTI: '3', XTB: '0', TNOM: '27', RS: '0', theta: '250',
  r25: '10', beta: '3950', diss: '1.5', r0: '1000', cvda: '3.9083e-3', cvdb: '-5.775e-7',
  bits: '12', ref: '3.3', tolRef: '0.5', maxsrc: '50', cap: '8', off: '2', gerr: '0.1', inl: '1', noise: '0.8',
  rb: '100', vs: '3.3', lo: '-10', hi: '50', step: '1', res: '0.5', acc: '1', rd: '10', gain: '1', offs: '0', ib: '100', lead: '0.5', os: '0',
  outU: '0.01', cerr: '0.05',
  tau: '8', tolTau: '25', ts: '100', settle: '30', sstep: '20', lag: '0.5', ramp: '2', nlim: '0.05',
};

/**
 * The slots in two groups, each checked alone by its own test file (hostile-values.test.ts, beside
 * the property test, and hostile-values-alone.test.ts) so that the longest check runs as two halves
 * of about equal time side by side on a 2-core machine: the junction's and the thermistor's slots
 * (an extreme there more often leaves a clean spec, whose every output is rendered), then the RTD's,
 * the converter's, the channels' and the dynamics slots.
 */
const FIRST_RTD_SLOT = Object.keys(SLOTS).indexOf('r0');
export const FIRST_SLOTS = Object.keys(SLOTS).slice(0, FIRST_RTD_SLOT);
export const OTHER_SLOTS = Object.keys(SLOTS).slice(FIRST_RTD_SLOT);

/** Each extreme of ALONE in each of the slots, alone: an error diagnostic or sound figures, never garbage. */
export function checkEachAlone(slots: readonly string[]): void {
  for (const slot of slots) {
    for (const x of ALONE) {
      const text = spec({ ...SLOTS, [slot]: x });
      for (const o of outputs(text)) expect(shownFigures(o), `${slot} = ${x}`).not.toMatch(GARBAGE);
    }
  }
}

export function spec(v: Record<string, string>): string {
  return `# Invented: a spec whose numbers the property test replaces.
junction q {
  IS = ${v.IS} fA ± ${v.tolIS} %
  N = ${v.N}
  BF = ${v.BF}
  EG = ${v.EG} eV
  XTI = ${v.XTI}
  XTB = ${v.XTB}
  TNOM = ${v.TNOM} °C
  RS = ${v.RS} ohm
  theta_ja = ${v.theta} K/W
}
thermistor t {
  r25 = ${v.r25}k ± 1 %
  beta = ${v.beta} K ± 1 %
  dissipation = ${v.diss} mW/K
}
rtd p {
  r0 = ${v.r0}
  cvd_a = ${v.cvda}
  cvd_b = ${v.cvdb}
  class = A
}
adc a {
  bits = ${v.bits}
  reference = ${v.ref} V ± ${v.tolRef} %
  max_source = ${v.maxsrc} kohm
  sample_cap = ${v.cap} pF
  offset_error = ± ${v.off} LSB
  gain_error = ± ${v.gerr} %
  inl = ± ${v.inl} LSB
  noise = ${v.noise} LSB rms
}
channel cj {
  sensor = q
  adc = a
  bias = resistor ${v.rb}k ± 1 % from ${v.vs} V
  range = ${v.lo} °C .. ${v.hi} °C
  step = ${v.step} K
  resolution = ${v.res} °C per count
  accuracy = ± ${v.acc} °C
  output = ${v.outU} °C
  code_error = ${v.cerr} °C
  calibration = one point at 25 °C
  compare_group = g
}
channel ct {
  sensor = t
  adc = a
  bias = divider ${v.rd}k above from ${v.vs} V
  range = ${v.lo} °C .. ${v.hi} °C
  gain = ${v.gain}
  offset = ${v.offs} V
  oversampling = ${v.os} bits
  compare_group = g
  accuracy = ± ${v.acc} °C
  time_constant = ${v.tau} s ± ${v.tolTau} %
  sample_period = ${v.ts} ms
  settling = ${v.settle} s for ${v.sstep} K step
  ramp_lag = ${v.lag} K at ${v.ramp} K/min
  noise_limit = ${v.nlim} °C rms
}
channel cr {
  sensor = p
  adc = a
  bias = current ${v.ib} uA
  range = ${v.lo} °C .. ${v.hi} °C
  wiring = 3 wires ${v.lead} ohm
  compare_group = g
}
`;
}

// NaN, Infinity, a negative zero standing alone, an exponent of 100 or more, or a raw 17-digit
// double. Checked on the output with the user's own typed extremes taken out (a message may quote
// what was written).
export const GARBAGE = /NaN|Infinity|(^|[^\d.\w])-0(?![.\d])|e\+?[1-9]\d\d\b|\d\.\d{14,}/;
const TYPED = [...EXTREMES].sort((x, y) => y.length - x.length);
export function shownFigures(o: string): string {
  let s = o;
  for (const t of TYPED) s = s.split(t).join('‹typed›');
  return s;
}

/** The strings of a chart spec (titles, labels, descriptions): what the drawing shows as text. */
function specStrings(x: unknown, out: string[] = []): string[] {
  if (typeof x === 'string') out.push(x);
  else if (Array.isArray(x)) for (const v of x) specStrings(v, out);
  else if (x && typeof x === 'object') for (const v of Object.values(x)) specStrings(v, out);
  return out;
}

export function outputs(text: string): string[] {
  const a = analyse({ path: '/virtual/h.tsense', text });
  const index = new LineIndex(text);
  const out: string[] = [];
  for (const d of a.diagnostics) out.push(formatDiagnostic(d, index, '/virtual'));
  for (const r of a.channels) {
    out.push(channelReport(r));
    const b = r.worstCaseBudget;
    if (b) {
      out.push(budgetText(b, r.channel));
      const j = JSON.stringify(budgetJson(b));
      expect(() => JSON.parse(j)).not.toThrow();
    }
    const data = plotData(r, b ?? null);
    if (plotProblem(data, b ? 'both' : 'transfer') === null) out.push(specStrings(plotSpec(data, { chart: b ? 'both' : 'transfer' })).join('\n'));
  }
  for (const g of compareGroups(a)) out.push(groupText(g));
  const json = JSON.stringify(analysisJson(a, () => index));
  expect(() => JSON.parse(json)).not.toThrow();
  // Hovers at the start of every word, and the inlay hints.
  for (const m of text.matchAll(/[A-Za-z_]\w*/g)) {
    const h = hover(a, m.index!);
    if (h) out.push(h.markdown);
  }
  for (const h of inlayHints(a)) out.push(h.label);
  return out;
}

