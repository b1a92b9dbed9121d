// Error budget, calibration, two-current method and oversampling. Each check names its source.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import type { ChannelDef } from '../../../server/src/model/types';
import { sense } from '../../../server/src/analysis/sense';
import { kelvinAtVolts } from '../../../server/src/analysis/inverse';
import { BOLTZMANN, ELEMENTARY_CHARGE } from '../../../server/src/physics/constants';
import { channelBudget, channelBudgetAsync } from '../../../server/src/budget/budget';
import { NominalInverse } from '../../../server/src/budget/nominal-inverse';
import { boardErrors, boardTrim, makeFrame } from '../../../server/src/budget/frame';
import { applyTrimK } from '../../../server/src/calibration/trim';
import { fitMeasured, fittedChannel } from '../../../server/src/calibration/fit';
import { Xoshiro128 } from '../../../server/src/budget/prng';
import { extraBitsForSamples, MIN_NOISE_LSB_RMS, samplesForExtraBits } from '../../../server/src/budget/oversampling';
import { percentileSorted } from '../../../server/src/budget/monte-carlo';
import { analyseFile, FIXTURES } from '../helpers/fixtures';

const PARTS = `
junction q1 {
  kind = npn
  IS = 10 fA ± 40 %
  N = 1.0 ± 0.2 %
  BF = 200 ± 30 %
  RS = 2 ohm
}
adc a12 {
  bits = 12
  reference = 1.2 V ± 0.5 %
  offset_error = ± 1 LSB
  gain_error = ± 0.1 %
  inl = ± 1 LSB
}
`;

function channelOf(body: string, extra = ''): ChannelDef {
  const a = analyse({ path: '/virtual/t.tsense', text: PARTS + extra + `channel c {\n${body}\n}\n` });
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  if (errors.length) throw new Error(errors.map((d) => d.message).join('; '));
  return a.model.channels[0]!;
}

const currentChannel = (more = '') => channelOf(`sensor = q1\nadc = a12\nbias = current 20 uA ± 1 %\nrange = 0 °C .. 50 °C\n${more}`);

describe('two-current (delta-VBE) method', () => {
  it('gives N k T/q ln 10 = 59.16 mV x N at 25 °C for a current ratio of 10', () => {
    // Ideal delta-VBE = N (k T / q) ln(I2/I1): k and q exact in the SI (BIPM SI Brochure, 9th ed.,
    // 2019, Table 1); 1.380649e-23 * 298.15 / 1.602176634e-19 * ln 10 = 59.159 mV.
    const ideal = ((BOLTZMANN * 298.15) / ELEMENTARY_CHARGE) * Math.log(10);
    expect(ideal * 1000).toBeCloseTo(59.16, 2);
    for (const n of [1, 1.02]) {
      const c = channelOf(`sensor = ideal\nadc = a12\nbias = currents 10 uA and 100 uA\nrange = 0 °C .. 50 °C`,
        `junction ideal {\n kind = diode\n IS = 1 fA\n N = ${n}\n RS = 0 ohm\n}\n`);
      // With IS = 1 fA the "-1" term shifts ln by I_S/I < 1e-9: the exact model equals the ideal to 1 nV.
      expect(sense(c, 298.15).volts).toBeCloseTo(n * ideal, 8);
    }
  });

  it('models BF and RS exactly: the difference equals the two operating points\' difference', () => {
    const c = channelOf(`sensor = q1\nadc = a12\nbias = resistors 330k and 33k from 3.3 V\nrange = 0 °C .. 50 °C`);
    const single = (ohms: number) => sense({ ...c, secondBias: undefined, bias: { ...c.bias, ohms: { ...(c.bias as { ohms: { value: number; tolerance: number; span: { start: number; end: number } } }).ohms, value: ohms } } as ChannelDef['bias'] }, 300).volts;
    expect(sense(c, 300).volts).toBeCloseTo(single(33e3) - single(330e3), 12);
    // Proportional to absolute temperature within the small IS(T)/RS terms (common practice, no source).
    expect(sense(c, 330).volts / sense(c, 300).volts).toBeCloseTo(330 / 300, 2);
  });
});

describe('nominal inverse', () => {
  it('matches the bracketing solver analysis/inverse.ts to 1 µK', () => {
    const c = currentChannel();
    const inv = new NominalInverse(c);
    for (const k of [273.15, 280.3, 298.15, 310.7, 323.15]) {
      const v = sense(c, k).volts;
      expect(Math.abs(inv.kelvinAt(v) - kelvinAtVolts(c, v))).toBeLessThan(1e-6);
      expect(Math.abs(inv.kelvinAt(v) - k)).toBeLessThan(1e-6);
    }
  });
});

describe('calibration', () => {
  it('one-point calibration removes an IS error exactly at the calibration temperature', () => {
    const c = channelOf(`sensor = q1\nadc = a12\nbias = current 20 uA\nrange = 0 °C .. 50 °C\ncalibration = one point at 25 °C`);
    const f = makeFrame(c);
    const u = f.board.map((k) => (k.id === 'IS' ? 1 : 0));
    const e = boardErrors(f, u);
    const iCal = f.calIndex[0]![0]!;
    // Uncalibrated: at constant current V = N Vt ln(I/IS) (Shockley, Bell Syst. Tech. J. 28, 1949),
    // so IS x 1.4 lowers V by N Vt ln 1.4; the firmware reads that as a temperature error of
    // -N Vt ln 1.4 / (dV/dT).
    const k = f.evalK[iCal]!;
    const expected = -((BOLTZMANN * k) / ELEMENTARY_CHARGE) * Math.log(1.4) / sense(c, k).slope;
    expect(e[iCal]!).toBeCloseTo(expected, 2);
    // One-point (offset) trim: by its definition the reported value equals the reference there.
    const trim = boardTrim(f, 0, e);
    expect(applyTrimK(trim, k + e[iCal]!) - k).toBeCloseTo(0, 9);
  });

  it('fits IS and N to measured codes and returns a fitted channel copy', () => {
    // Round trip: codes made by the model with IS x 1.3 and N x 1.01 give back those constants.
    const c = currentChannel();
    const truth: ChannelDef = { ...c, sensor: { ...(c.sensor as never as { params: object }), params: { ...(c.sensor as never as { params: { IS: number; N: number } }).params, IS: 13e-15, N: 1.01 } } as never as ChannelDef['sensor'] };
    const codeAt = (k: number) => (sense(truth, k).volts / 1.2) * 4096 - 0.5;
    const measured = [278.15, 298.15, 318.15].map((k) => ({ kelvin: k, code: codeAt(k), span: { start: 0, end: 0 } }));
    const fit = fitMeasured({ ...c, measured })!;
    expect(fit.parameters.IS! / 13e-15).toBeCloseTo(1, 5);
    expect(fit.parameters.N!).toBeCloseTo(1.01, 6);
    expect(fit.rmsK).toBeLessThan(1e-6);
    expect(fit.outlier).toBeNull();
    expect(fittedChannel({ ...c, measured }).sensor).not.toBe(c.sensor);
  });
});

describe('worst case and Monte Carlo', () => {
  it('the worst case bounds every Monte Carlo sample', () => {
    const b = channelBudget(currentChannel(), { runs: 2000, seed: 3, points: 11 });
    expect(b.method).toBe('corners');
    expect(b.samplesOutsideWorstCase).toBe(0);
    for (const m of b.modes) {
      m.mc!.max.forEach((x, t) => expect(x).toBeLessThanOrEqual(m.worstHigh[t]! + 1e-9));
      m.mc!.min.forEach((x, t) => expect(x).toBeGreaterThanOrEqual(m.worstLow[t]! - 1e-9));
    }
  });

  it('the Monte Carlo band converges to the worst case from inside as N grows', () => {
    // The sample extremes of independent uniform draws approach the bounds of their support
    // (order statistics, e.g. David and Nagaraja, "Order Statistics", 3rd ed., 2003, ch. 2).
    // One board input (IS) and the quantisation: the corners are reached quickly.
    const c = channelOf(`sensor = q2\nadc = plain\nbias = current 20 uA\nrange = 0 °C .. 50 °C`,
      `junction q2 {\n IS = 10 fA ± 40 %\n}\nadc plain {\n bits = 12\n reference = 1.2 V\n}\n`);
    const gap = (runs: number) => {
      const b = channelBudget(c, { runs, seed: 11, points: 5 });
      const m = b.modes.find((x) => x.setting.mode === 'none')!;
      return Math.max(...m.worstHigh.map((h, t) => h - m.mc!.max[t]!));
    };
    const g = [gap(20), gap(200), gap(2000)];
    expect(g.every((x) => x >= 0)).toBe(true);
    expect(g[1]!).toBeLessThanOrEqual(g[0]!);
    expect(g[2]!).toBeLessThanOrEqual(g[1]!);
    expect(g[2]!).toBeLessThan(g[0]! / 5);
  });

  it('is reproducible for a seed; the async, chunked form gives the same samples and can be cancelled', async () => {
    const c = currentChannel();
    const a = channelBudget(c, { runs: 300, seed: 7, points: 7 });
    const b = channelBudget(c, { runs: 300, seed: 7, points: 7 });
    const d = channelBudget(c, { runs: 300, seed: 8, points: 7 });
    expect(b.stated.mc).toEqual(a.stated.mc);
    expect(d.stated.mc!.p50).not.toEqual(a.stated.mc!.p50);
    let calls = 0;
    const async = await channelBudgetAsync(c, { runs: 300, seed: 7, points: 7 }, undefined, () => calls++);
    expect(async!.stated.mc).toEqual(a.stated.mc);
    expect(calls).toBeGreaterThan(0);
    const token = { isCancellationRequested: false };
    const cancelled = await channelBudgetAsync(c, { runs: 5000, seed: 7, points: 7 }, token, () => (token.isCancellationRequested = true));
    expect(cancelled).toBeNull();
  });

  it('names the dominant contributor: IS spread uncalibrated, not after a two-point trim', () => {
    const b = channelBudget(currentChannel(), { runs: 0, points: 11 });
    const none = b.modes.find((m) => m.setting.mode === 'none')!;
    const two = b.modes.find((m) => m.setting.mode === 'two-point')!;
    expect(none.dominant!.id).toBe('IS');
    expect(two.worstAbsK).toBeLessThan(none.worstAbsK / 10);
    const shares = none.shares.reduce((s, x) => s + x.share, 0);
    expect(shares).toBeCloseTo(1, 9);
  });

  it('falls back to the sensitivity method above the corner limit, still bounding the samples', () => {
    const b = channelBudget(currentChannel(), { runs: 500, points: 7, maxCornerContributors: 2 });
    expect(b.method).toBe('sensitivity');
    expect(b.samplesOutsideWorstCase).toBe(0);
  });
});

describe('seeded generator and percentiles', () => {
  it('draws uniform numbers with mean 1/2 and variance 1/12', () => {
    // Moments of U(0,1): mean 1/2, variance 1/12 (any probability text, e.g. Feller, vol. II, I.1).
    const r = new Xoshiro128(42);
    let s = 0;
    let s2 = 0;
    const n = 200_000;
    for (let i = 0; i < n; i++) {
      const x = r.next();
      s += x;
      s2 += x * x;
    }
    const mean = s / n;
    expect(mean).toBeCloseTo(0.5, 2);
    expect(s2 / n - mean * mean).toBeCloseTo(1 / 12, 3);
  });

  it('interpolates percentiles as Hyndman and Fan type 7', () => {
    // Hyndman and Fan (1996), type 7: Q(p) = x[floor(h)] + (h - floor(h)) (x[floor(h)+1] - x[floor(h)]), h = (n-1)p.
    expect(percentileSorted([1, 2, 3, 4], 50)).toBe(2.5);
    expect(percentileSorted([10, 20, 30, 40, 50], 90)).toBe(46);
  });
});

describe('oversampling and decimation', () => {
  it('follows Atmel application note AVR121: 4^n readings for n extra bits, noise above 0.5 LSB', () => {
    // AVR121 "Enhancing ADC resolution by oversampling": f_os = 4^n f_s for n extra bits.
    expect([0, 1, 2, 3, 4].map(samplesForExtraBits)).toEqual([1, 4, 16, 64, 256]);
    expect([1, 3, 4, 15, 16, 64, 255, 256].map(extraBitsForSamples)).toEqual([0, 0, 1, 1, 2, 3, 3, 4]);
    // AVR121: "the noise amplitude has to exceed 0.5 LSB to toggle the LSB".
    expect(MIN_NOISE_LSB_RMS).toBe(0.5);
  });

  it('credits the extra bits in the resolution check only with enough stated noise', () => {
    const base = `sensor = q1\nadc = a12n\nbias = current 20 uA\nrange = 0 °C .. 50 °C\nresolution = 0.05 °C per count\n`;
    const run = (noise: string, os: string) => analyse({ path: '/virtual/t.tsense', text: PARTS + `adc a12n {\n bits = 12\n reference = 1.2 V\n noise = ${noise}\n}\nchannel c {\n${base}${os}\n}\n` }).diagnostics.map((d) => d.code);
    expect(run('1 LSB rms', '')).toContain('resolution-short');
    expect(run('1 LSB rms', 'oversampling = 2 bits')).not.toContain('resolution-short');
    expect(run('0.2 LSB rms', 'oversampling = 2 bits')).toEqual(expect.arrayContaining(['resolution-short', 'oversampling-noise']));
  });
});

describe('diagnostic fixtures', () => {
  const dir = path.join(FIXTURES, 'budget');
  const codes = (f: string) => analyseFile(path.join(dir, f)).diagnostics.map((d) => d.code);
  it.each([
    ['accuracy-unmet.tsense', ['accuracy-unmet']],
    ['accuracy-met.tsense', []],
    ['two-current-unresolved.tsense', ['two-current-unresolved']],
    ['two-current-resolved.tsense', []],
    ['oversampling-noise.tsense', ['oversampling-noise']],
    ['oversampling-ok.tsense', []],
    ['calibration-outlier.tsense', ['calibration-outlier']],
    ['calibration-consistent.tsense', []],
  ])('%s reports %j', (file, expected) => {
    expect(codes(file)).toEqual(expected);
  });

  it('reports malformed budget fields with a message and a range, never a crash', () => {
    const a = analyseFile(path.join(dir, 'bad-values.tsense'));
    expect(a.diagnostics.map((d) => d.code)).toEqual(['wrong-unit', 'out-of-domain', 'bad-value', 'out-of-domain', 'out-of-domain', 'out-of-domain', 'out-of-domain', 'out-of-domain', 'bad-value']);
    expect(a.diagnostics.every((d) => !/NaN|undefined/.test(d.message))).toBe(true);
  });

  it('names the dominant contributor and the calibration that would meet the target', () => {
    const d = analyseFile(path.join(dir, 'accuracy-unmet.tsense')).diagnostics[0]!;
    expect(d.message).toMatch(/dominant: IS spread/);
    expect(d.message).toMatch(/two-point calibration at 0 °C and 50 °C would meet it/);
  });
});

describe('ratiometric reading', () => {
  const SAMPLE = path.join(__dirname, '../../../samples/sous-vide.tsense');
  const channelsOf = (withTolerance: boolean) => {
    let text = fs.readFileSync(SAMPLE, 'utf8');
    if (withTolerance) text = text.replace('reference  = 3.3 V ', 'reference  = 3.3 V ± 1 %');
    const a = analyse({ path: SAMPLE, text });
    expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    return a.model.channels;
  };

  it('does not count the rail\'s tolerance: the divider ratio does not depend on the rail', () => {
    // An unloaded divider read by a converter whose reference is the divider's own supply gives
    // code = 2^n Rt / (Rf + Rt) whatever the rail's value (Ohm's law; common practice, no source),
    // so a tolerance on that rail cannot move the reading. Before the fix the divider was fed the
    // nominal rail while the code divided by the drawn one, and a 'reference' input of 0.53 K
    // appeared (worst case 1.86 K uncalibrated, 0.307 K after two points).
    const plain = channelsOf(false);
    const toleranced = channelsOf(true);
    for (let i = 0; i < plain.length; i++) {
      const a = channelBudget(plain[i]!, { runs: 0 });
      const b = channelBudget(toleranced[i]!, { runs: 0 });
      expect(b.contributors.map((k) => k.id)).not.toContain('reference');
      expect(b.modes.map((m) => m.worstAbsK)).toEqual(a.modes.map((m) => m.worstAbsK));
      expect(b.notes.join(' ')).toMatch(/Ratiometric reading: the rail's tolerance \(± 1 %\)/);
    }
    const ntc = channelBudget(toleranced.find((c) => c.name === 'bath_ntc')!, { runs: 0 });
    const worst = Object.fromEntries(ntc.modes.map((m) => [m.setting.mode, m.worstAbsK]));
    // Issue 18's recomputation without the reference tolerance: 1.33 K uncalibrated (1.04 / 0.067 K
    // after one / two points before the calibration readings' own errors were counted).
    expect(worst['none']!).toBeCloseTo(1.33, 2);
    expect(worst['two-point']!).toBeLessThan(0.1);
  });
});
