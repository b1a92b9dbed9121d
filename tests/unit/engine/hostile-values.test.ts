// Extreme values in every numeric field (#17 items 8, 9, 10): a property test (fast-check) puts zero,
// -0, denormals (1e-320), the largest doubles, huge and tiny magnitudes into each number of a spec
// with a junction, a thermistor and an RTD channel, and renders every output: diagnostics, the text
// report, the budget table, the comparison, JSON, hovers, inlay hints and the plot spec. Nothing
// throws, JSON stays valid, and no text shows NaN, Infinity, -0 or a figure with a huge exponent.
// A value outside a field's stated domain gets an out-of-domain diagnostic naming the range.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
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
import { fixedNumber, formatSI, trimNumber } from '../../../server/src/model/read-value';
import { allBlocks } from '../../../server/src/model/schema';
import { LineIndex } from '../../../server/src/syntax/line-index';

const EXTREMES = ['0', '-0', '1e-320', '5e-324', '1e-30', '1e-12', '1e308', '1.7976931348623157e308', '1e30', '-1e308', '-1e-320', '123456789.12345678', '1e6', '0.1'];

/** The extremes put into each slot alone (the property test draws from all of them). */
const ALONE = ['-0', '1e-320', '1e308'];

/** Each slot: its normal value (an invented, working design) or an extreme. */
const SLOTS: Record<string, string> = {
  IS: '10', tolIS: '20', N: '1', BF: '200', EG: '1.11', XTI: '3', XTB: '0', TNOM: '27', RS: '0', theta: '250',
  r25: '10', beta: '3950', diss: '1.5', r0: '1000', cvda: '3.9083e-3', cvdb: '-5.775e-7',
  bits: '12', ref: '3.3', tolRef: '0.5', maxsrc: '50', cap: '8', off: '2', gerr: '0.1', inl: '1', noise: '0.8',
  rb: '100', vs: '3.3', lo: '-10', hi: '50', step: '1', res: '0.5', acc: '1', rd: '10', gain: '1', offs: '0', ib: '100', lead: '0.5', os: '0',
  outU: '0.01', cerr: '0.05',
  tau: '8', tolTau: '25', ts: '100', settle: '30', sstep: '20', lag: '0.5', ramp: '2', nlim: '0.05',
};

function spec(v: Record<string, string>): string {
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
const GARBAGE = /NaN|Infinity|(^|[^\d.\w])-0(?![.\d])|e\+?[1-9]\d\d\b|\d\.\d{14,}/;
const TYPED = [...EXTREMES].sort((x, y) => y.length - x.length);
function shownFigures(o: string): string {
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

function outputs(text: string): string[] {
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

describe('extreme values in every numeric field', () => {
  it('the one figure formatter never shows NaN, Infinity or -0', () => {
    for (const v of [NaN, Infinity, -Infinity, -0, -1e-320]) {
      expect(trimNumber(v, 3)).not.toMatch(/NaN|Infinity|^-0$/);
      expect(fixedNumber(v, 3)).not.toMatch(/NaN|Infinity|^-0(\.0*)?$/);
      expect(formatSI(v, 'V')).not.toMatch(/NaN|Infinity/);
    }
  });

  it('every quantity field of schema.ts states a finite domain', () => {
    for (const block of allBlocks().values()) {
      for (const f of block.fields) {
        if (f.form.form !== 'quantity') continue;
        expect(Number.isFinite(f.form.min) && Number.isFinite(f.form.max) && f.form.min < f.form.max, `${block.kind}.${f.name}`).toBe(true);
      }
    }
  });

  it('the clean template analyses without errors (so the extremes are what the test varies)', () => {
    const a = analyse({ path: '/virtual/h.tsense', text: spec(SLOTS) });
    expect(a.diagnostics.filter((d) => d.severity === 'error').map((d) => d.message)).toEqual([]);
    expect(a.channels.map((r) => r.channel.name)).toEqual(['cj', 'ct', 'cr']);
  });

  it('each extreme in each slot alone: an error diagnostic or sound figures, never garbage', () => {
    for (const slot of Object.keys(SLOTS)) {
      for (const x of ALONE) {
        const text = spec({ ...SLOTS, [slot]: x });
        for (const o of outputs(text)) expect(shownFigures(o), `${slot} = ${x}`).not.toMatch(GARBAGE);
      }
    }
  }, 600_000);

  it('extremes in several slots at once (fast-check, 40 specs)', () => {
    const slot = fc.constantFrom(...Object.keys(SLOTS));
    fc.assert(
      fc.property(fc.dictionary(slot, fc.constantFrom(...EXTREMES), { maxKeys: 4 }), (over) => {
        const text = spec({ ...SLOTS, ...over });
        for (const o of outputs(text)) expect(shownFigures(o)).not.toMatch(GARBAGE);
      }),
      { numRuns: 40, seed: 17 },
    );
  }, 600_000);

  it('a value outside its domain is an out-of-domain error naming the range (#17 item 8 examples)', () => {
    const codes = (slot: string, x: string) => analyse({ path: '/virtual/h.tsense', text: spec({ ...SLOTS, [slot]: x }) }).diagnostics.filter((d) => d.severity === 'error');
    const ref = codes('ref', '1e308');
    expect(ref.map((d) => d.message)).toEqual(['reference must be from 0.001 to 1000 V (found 1e308 V)']);
    const vs = codes('vs', '1e308');
    expect(vs.every((d) => d.code === 'out-of-domain' && /from 0\.001 to 1000 V/.test(d.message))).toBe(true);
    const gain = codes('gain', '1e-320');
    expect(gain.map((d) => d.message)).toEqual(['gain must be from 0.001 to 10000 (found 1e-320)']);
    const ib = codes('ib', '1e-320');
    expect(ib.map((d) => d.message)).toEqual([expect.stringMatching(/^bias must be from 1e-12 to 1 A \(found 1e-320 uA/)]);
  });
});
