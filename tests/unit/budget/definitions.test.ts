// What the error budget counts (issue 18): calibration readings, one INL curve per board, the worst
// point between grid temperatures, variance shares, and a check of the Monte Carlo against the
// published additive-model example of the GUM's Monte Carlo supplement. Each check names its source.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import type { ChannelDef } from '../../../server/src/model/types';
import { sense } from '../../../server/src/analysis/sense';
import { channelBudget } from '../../../server/src/budget/budget';
import { makeFrame } from '../../../server/src/budget/frame';
import { monteCarlo, percentileSorted } from '../../../server/src/budget/monte-carlo';
import { InlProfile } from '../../../server/src/budget/inl-profile';
import { Xoshiro128 } from '../../../server/src/budget/prng';
import { budgetJson } from '../../../server/src/budget/json';
import { pairedDifference } from '../../../server/src/budget/paired';
import { compareGroups } from '../../../server/src/compare/compare';

function channelOf(text: string): ChannelDef {
  const a = analyse({ path: '/virtual/t.tsense', text });
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length) throw new Error(errors.map((d) => d.message).join('; '));
  return a.model.channels[0]!;
}

const SAMPLE = path.join(__dirname, '../../../samples/sous-vide.tsense');
const sousVide = (extra = '') => {
  const text = fs.readFileSync(SAMPLE, 'utf8').replace(/compare_group = bath\n\}/g, `compare_group = bath\n${extra}\n}`);
  const a = analyse({ path: SAMPLE, text });
  return Object.fromEntries(a.model.channels.map((c) => [c.name, c]));
};
const mode = (b: ReturnType<typeof channelBudget>, m: string) => b.modes.find((x) => x.setting.mode === m)!;

/** An ideal junction read by a 12-bit converter: only the converter's figures move the reading. */
const idealChannel = (adc: string, more = '', reference = '1.2 V') => channelOf(`junction q {\n kind = diode\n IS = 1 fA\n N = 1\n RS = 0 ohm\n}\nadc a {\n bits = 12\n reference = ${reference}\n${adc}\n}\nchannel c {\n sensor = q\n adc = a\n bias = current 20 uA\n range = 0 °C .. 50 °C\n${more}\n}\n`);

describe('calibration readings', () => {
  it('a two-point trim passes the calibration reading\'s quantisation on: at a calibration point it adds its own 0.5 LSB', () => {
    // The trim is the straight line through the two calibration readings: at a calibration point the
    // reported value is pulled to the reference by exactly the error of the reading taken there (the
    // definition of a two-point trim, calibration/trim.ts), and a later reading at that point carries
    // its own ± 0.5 LSB (quantisation of a uniform quantiser, e.g. B. Widrow and I. Kollár,
    // "Quantization Noise", Cambridge 2008, ch. 4). So the worst case there is 2 x 0.5 LSB in kelvin;
    // issue 18's independent recomputation gives 0.186 -> 0.374 K for bath_rtd at 95 °C.
    const rtd = sousVide()['bath_rtd']!;
    const two = mode(channelBudget(rtd, { runs: 0 }), 'two-point');
    const f = makeFrame(rtd);
    const kelvinPerLsb = Math.abs(f.kPerLsb[f.gridK.length - 1]!);
    expect(two.worstAtCelsius).toBeCloseTo(95, 6);
    expect(two.worstAbsK).toBeCloseTo(2 * 0.5 * kelvinPerLsb, 2);
    expect(Math.abs(two.worstAbsK - 0.374)).toBeLessThan(0.001);
    expect(two.shares.find((s) => s.id === 'cal-quantisation')!.swingAtWorstK).toBeCloseTo(0.5 * kelvinPerLsb, 2);
  });

  it('counts the reference thermometer: a one-point trim moves every reading by its error; two points by the weights of a straight line', () => {
    // One point: offset = reference - reported, so a reference error e shifts every reading by e.
    // Two points: the line through (r1, t1 + e1) and (r2, t2 + e2) moves by w1 e1 + w2 e2 with
    // w1 + w2 = 1 and both weights in [0, 1] between the points (linear interpolation; elementary).
    const plain = sousVide()['bath_ntc']!;
    const withRef = sousVide('  cal_reference = ± 0.05 °C')['bath_ntc']!;
    expect(withRef.calReferenceK).toBeCloseTo(0.05, 12);
    const a = channelBudget(plain, { runs: 0 });
    const b = channelBudget(withRef, { runs: 0 });
    expect(mode(b, 'one-point').worstAbsK - mode(a, 'one-point').worstAbsK).toBeCloseTo(0.05, 6);
    expect(mode(b, 'none').worstAbsK).toBe(mode(a, 'none').worstAbsK);
    const ref = mode(b, 'two-point').shares.find((s) => s.id === 'cal-reference')!;
    expect(ref.swingAtWorstK).toBeCloseTo(0.05, 4);
    expect(ref.maxSwingK).toBeCloseTo(0.05, 4);
    expect(b.notes.join(' ')).toMatch(/reference thermometer \(`cal_reference`\)/);
  });
});

describe('cal_reference', () => {
  it('reports bad input with a message and a range, never a crash', () => {
    const diags = (v: string) => {
      const text = fs.readFileSync(SAMPLE, 'utf8').replace('compare_group = bath\n}', `compare_group = bath\n  cal_reference = ${v}\n}`);
      return analyse({ path: SAMPLE, text }).diagnostics.map((d) => `${d.code}: ${d.message}`);
    };
    expect(diags('± 0.05 °C')).toEqual([]);
    expect(diags('± 20 K')).toEqual(['out-of-domain: cal_reference: must be from 0 to 10 K (found 20 K)']);
    expect(diags('± 1 V')[0]).toMatch(/^wrong-unit: cal_reference takes a temperature/);
    expect(diags('banana')[0]).toMatch(/^bad-value: cal_reference: takes the reference thermometer's uncertainty such as `± 0.05 °C`/);
  });
});

describe('one INL curve per board', () => {
  it('the profile stays within the bound and vanishes at both ends of the scale', () => {
    // End-point INL is zero at both ends by its definition (common practice, no source).
    const p = new InlProfile();
    const rng = new Xoshiro128(5);
    for (let i = 0; i < 200; i++) {
      p.draw(rng, 'uniform');
      expect(Math.abs(p.at(0))).toBeLessThan(1e-12);
      expect(Math.abs(p.at(1))).toBeLessThan(1e-12);
      for (let x = 0; x <= 1; x += 1 / 64) expect(Math.abs(p.at(x))).toBeLessThanOrEqual(1 + 1e-12);
    }
  });

  it('a one-point trim removes the INL at its own code in the Monte Carlo; the worst case allows any curve', () => {
    // A fixed error of the code is the same at the calibration reading and at a later reading of the
    // same code, so an offset trim taken there removes it (definition of an offset trim). What is
    // left at 25 °C is the two readings' quantisation, 2 x 0.5 LSB. Before, INL was drawn afresh at
    // every reading and the Monte Carlo spread there was up to 2 x (0.5 + 2) LSB.
    const c = idealChannel(' inl = ± 2 LSB', 'calibration = one point at 25 °C');
    const f = makeFrame(c, 11);
    const t = f.gridK.findIndex((k) => Math.abs(k - 298.15) < 1e-9);
    expect(t).toBeGreaterThan(0);
    const lsbK = Math.abs(f.kPerLsb[t]!);
    const mc = monteCarlo(f, 3000, 3, 'uniform');
    const at25 = mc.samples[0]![t]!;
    expect(Math.max(...at25.map(Math.abs))).toBeLessThanOrEqual(1.0001 * lsbK);
    const b = channelBudget(c, { runs: 0, points: 11 });
    expect(Math.max(Math.abs(b.stated.worstLow[t]!), Math.abs(b.stated.worstHigh[t]!))).toBeCloseTo((0.5 + 2 + 0.5 + 2) * lsbK, 3);
  });
});

describe('worst point between grid temperatures', () => {
  it('finds the maximum a coarse grid misses', () => {
    // Check by brute force: the same budget on 301 temperatures (common practice, no source).
    const ntc = sousVide()['bath_ntc']!;
    const dense = mode(channelBudget(ntc, { runs: 0, points: 301 }), 'two-point');
    const coarse = mode(channelBudget(ntc, { runs: 0, points: 4 }), 'two-point');
    const gridOnly = Math.max(...coarse.worstLow.map(Math.abs), ...coarse.worstHigh.map(Math.abs));
    expect(gridOnly).toBeLessThan(dense.worstAbsK * 0.98);
    expect(coarse.worstAbsK).toBeGreaterThan(dense.worstAbsK * 0.998);
    expect(coarse.worstAbsK).toBeLessThanOrEqual(dense.worstAbsK * 1.0001);
    // The maximum is flat: its place is known to a couple of kelvin, its size to 0.2 %.
    expect(Math.abs(coarse.worstAtCelsius - dense.worstAtCelsius)).toBeLessThan(2);
  });
});

describe('shares', () => {
  it('says what each share is in the JSON, and gives the Monte Carlo variance shares beside the swing shares', () => {
    const rtd = sousVide()['bath_rtd']!;
    const b = channelBudget(rtd, { runs: 4000, seed: 2 });
    const j = budgetJson(b);
    expect(j.shareDefinitions.share).toMatch(/sum of every input's swingAtWorstK/);
    expect(j.shareDefinitions.varianceShare).toMatch(/squared correlation/);
    for (const m of b.modes) {
      const v = m.shares.map((s) => s.varianceShare ?? 0);
      // Independent inputs, error nearly linear in them: the first-order shares sum to about 1
      // (A. Saltelli et al., "Global Sensitivity Analysis: The Primer", Wiley 2008, ch. 1; from memory).
      expect(v.reduce((s, x) => s + x, 0)).toBeGreaterThan(0.9);
      expect(v.reduce((s, x) => s + x, 0)).toBeLessThan(1.1);
    }
    expect(mode(b, 'none').shares.find((s) => s.id === 'bias')!.varianceShare).toBeGreaterThan(0.3);
  });
});

describe('Monte Carlo against JCGM 101:2008, 9.2.3 (additive model, rectangular inputs)', () => {
  it('four equal rectangular inputs: u(y) = 2 u(x) and the 95 % interval is ±3.88 u(x), narrower than the GUM\'s ±3.92', () => {
    // JCGM 101:2008 (Supplement 1 to the GUM, propagation of distributions by a Monte Carlo method),
    // 9.2.3: Y = X1 + X2 + X3 + X4, each Xi rectangular with expectation 0 and standard deviation 1.
    // Published results (values from memory): u(y) = 2.00 both ways; 95 % coverage interval
    // [-3.92, 3.92] by the GUM uncertainty framework (JCGM 100:2008, k = 1.96) and [-3.88, 3.88]
    // by the Monte Carlo method. The same model in a channel: an ideal junction whose code moves by
    // the converter's offset, gain, reference and the reading's quantisation, each ± 0.5 LSB (gain
    // and reference set to 0.5 LSB at the code there), so the error is their sum times dT/dcode.
    const nominal = idealChannel('');
    const k = 273.15;
    const code = (sense(nominal, k).volts / 1.2) * 4096;
    const rel = ((0.5 / code) * 100).toPrecision(12);
    const c = idealChannel(` offset_error = ± 0.5 LSB\n gain_error = ± ${rel} %`, '', `1.2 V ± ${rel} %`);
    const f = makeFrame(c, 2);
    expect(f.gridK[0]).toBeCloseTo(k, 9);
    expect(f.board.map((x) => x.id).sort()).toEqual(['gain', 'offset', 'reference']);
    const runs = 200_000;
    const s = Float64Array.from(monteCarlo(f, runs, 101, 'uniform').samples[f.modes.findIndex((m) => m.mode === 'none')]![0]!).sort();
    const unit = (0.5 / Math.sqrt(3)) * Math.abs(f.kPerLsb[0]!); // standard deviation of one input, K
    const mean = s.reduce((a, x) => a + x, 0) / runs;
    const sd = Math.sqrt(s.reduce((a, x) => a + (x - mean) ** 2, 0) / (runs - 1));
    expect(mean / unit).toBeCloseTo(0, 1);
    expect(sd / unit).toBeCloseTo(2.0, 1);
    const half = (percentileSorted(s, 97.5) - percentileSorted(s, 2.5)) / 2 / unit;
    expect(Math.abs(half - 3.88)).toBeLessThan(0.03);
    expect(half).toBeLessThan(3.92 - 0.01);
    // The worst case is the sum of the four bounds, 4 x 0.5 LSB = 2 x sqrt(3) x 2 u(x) (common practice, no source).
    const wc = channelBudget(c, { runs: 0, points: 2 });
    const first = Math.max(Math.abs(mode(wc, 'none').worstLow[0]!), Math.abs(mode(wc, 'none').worstHigh[0]!));
    expect(first / unit).toBeCloseTo(4 * Math.sqrt(3), 2);
    // Variance shares: by the law of propagation (JCGM 100:2008, 5.1.2, eq. 10) each of four equal
    // terms is a quarter of u_c^2; so are the swing shares, each a quarter of the summed bounds.
    const mc = mode(channelBudget(c, { runs: 20_000, seed: 4, points: 2 }), 'none');
    expect(mc.sharesAtCelsius).toBeCloseTo(0, 9);
    for (const id of ['offset', 'gain', 'reference', 'quantisation']) {
      const sh = mc.shares.find((x) => x.id === id)!;
      expect(Math.abs(sh.varianceShare! - 0.25)).toBeLessThan(0.03);
      expect(sh.share).toBeCloseTo(0.25, 3);
    }
  });
});

describe('channels on one converter', () => {
  it('draws the converter once per board for a difference, so its shared part cancels', () => {
    // A common additive or proportional error of two readings of the same size cancels in their
    // difference (elementary; common practice, no source). Two identical channels on one converter:
    // with the converter drawn once per board only the two readings' quantisation is left,
    // 2 x 0.5 LSB at most; drawn apart, the reference, offset and gain errors add.
    const junction = `junction q {\n kind = diode\n IS = 1 fA\n N = 1\n RS = 0 ohm\n}\nadc a {\n bits = 12\n reference = 1.2 V ± 1 %\n offset_error = ± 2 LSB\n gain_error = ± 0.2 %\n}\n`;
    const ch = (name: string) => `channel ${name} {\n sensor = q\n adc = a\n bias = current 20 uA\n range = 0 °C .. 50 °C\n compare_group = pair\n}\n`;
    const a = analyse({ path: '/virtual/p.tsense', text: junction + ch('left') + ch('right') });
    const [l, r] = a.model.channels as [ChannelDef, ChannelDef];
    const d = pairedDifference(l, r, 400, 3)!;
    expect(d.shared).toEqual(['reference', 'offset', 'gain']);
    const f = makeFrame(l, 2);
    const lsbK = Math.max(...f.kPerLsb.map(Math.abs));
    expect(d.sharedK).toBeLessThanOrEqual(1.0001 * lsbK);
    expect(d.independentK).toBeGreaterThan(5 * lsbK);
    const g = compareGroups(a).find((x) => x.name === 'pair')!;
    expect(g.differences).toHaveLength(1);
    expect(g.rows[0]!.notes.join(' ')).toMatch(/minus right \(same converter: reference, offset, gain drawn once per board\)/);
    // Different converters: nothing is shared, no difference figure.
    const other = analyse({ path: '/virtual/q.tsense', text: junction + 'adc b {\n bits = 12\n reference = 1.2 V ± 1 %\n}\n' + ch('left') + ch('right').replace('adc = a', 'adc = b') });
    expect(pairedDifference(other.model.channels[0]!, other.model.channels[1]!)).toBeNull();
  });
});
