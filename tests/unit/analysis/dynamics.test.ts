// The channel's dynamics (analysis/dynamics.ts) against outside references:
// - the first-order sensor's step response 1 − e^(−t/τ) and its steady-state ramp error τ (K. Ogata,
//   Modern Control Engineering, "First-order systems": unit-step and unit-ramp responses);
// - the closed forms of sensor + filter at each sample against the filters' own recurrences, run
//   sample by sample here (a direct simulation, not the module's algebra);
// - the recursive filter's noise variance ratio α/(2 − α) and the average's 1/N against a seeded
//   Monte Carlo run of white noise through the recurrences (the statistical definition);
// - the reader's messages for bad values, and the chosen filter of an invented channel.
import { describe, expect, it } from 'vitest';
import {
  channelDynamics,
  filterDelaySamples,
  filterNoiseRatio,
  firstOrderRampLag,
  firstOrderSettling,
  rampLagAt,
  recursiveTimeConstant,
  settlingSamples,
  stepRemainder,
  type FirmwareFilter,
} from '../../../server/src/analysis/dynamics';
import { analyse } from '../../../server/src/engine';
import { Xoshiro128 } from '../../../server/src/budget/prng';

const FILTERS: FirmwareFilter[] = [{ kind: 'none' }, { kind: 'recursive', shift: 1 }, { kind: 'recursive', shift: 3 }, { kind: 'recursive', shift: 6 }, { kind: 'average', log2n: 1 }, { kind: 'average', log2n: 4 }];

/** One step of the filter in floating point, from its definition. */
function filterRun(f: FirmwareFilter, xs: number[], start = 0): number[] {
  const out: number[] = [];
  let y = start;
  const window: number[] = f.kind === 'average' ? new Array<number>(2 ** f.log2n).fill(start) : [];
  for (const x of xs) {
    if (f.kind === 'none') y = x;
    else if (f.kind === 'recursive') y = y + (x - y) * 2 ** -f.shift;
    else {
      window.shift();
      window.push(x);
      y = window.reduce((a, b) => a + b, 0) / window.length;
    }
    out.push(y);
  }
  return out;
}

describe('first-order sensor (Ogata, first-order systems)', () => {
  it('reaches 1 − 1/e of a step after one time constant and lags r·τ behind a ramp', () => {
    // Unit-step response c(t) = 1 − e^(−t/T): at t = T, 63.2 % (Ogata).
    expect(1 - stepRemainder({ kind: 'none' }, 8, 8, 1)).toBeCloseTo(0.632120559, 8);
    // Unit-ramp error tends to T: 2 K/min on a 12 s sensor lags 0.4 K.
    expect(firstOrderRampLag(2 / 60, 12)).toBeCloseTo(0.4, 12);
    expect(rampLagAt({ kind: 'none' }, 12, 0.5, 2000)).toBeCloseTo(12, 9);
    // Settling to within ε of a step ΔT: τ ln(ΔT/ε); 20 K to 0.5 K with τ = 10 s: 36.9 s.
    expect(firstOrderSettling(10, 20, 0.5)).toBeCloseTo(10 * Math.log(40), 12);
    expect(firstOrderSettling(10, 0.4, 0.5)).toBe(0);
  });
});

describe('sensor + filter in closed form, against the recurrences run sample by sample', () => {
  const tau = 7.3;
  const T = 0.6;
  const n = 400;
  // The sampled first-order sensor after a unit step at t = 0 (sample 0 is the step's instant).
  const sensorStep = Array.from({ length: n + 1 }, (_, k) => 1 - Math.exp(-(k * T) / tau));
  // After a unit-rate ramp from rest: t − τ (1 − e^(−t/τ)) (Ogata, unit-ramp response).
  const sensorRamp = Array.from({ length: n + 1 }, (_, k) => k * T - tau * (1 - Math.exp(-(k * T) / tau)));
  for (const f of FILTERS) {
    it(`${JSON.stringify(f)}: step remainder and ramp lag at every sample`, () => {
      const step = filterRun(f, sensorStep);
      const ramp = filterRun(f, sensorRamp);
      for (let k = 0; k <= n; k++) {
        expect(stepRemainder(f, tau, T, k)).toBeCloseTo(1 - step[k]!, 10);
        expect(rampLagAt(f, tau, T, k)).toBeCloseTo(k * T - ramp[k]!, 9);
      }
      // Steady state: the sensor's τ plus the filter's delay.
      expect(rampLagAt(f, tau, T, 100_000)).toBeCloseTo(tau + filterDelaySamples(f) * T, 8);
    });
    it(`${JSON.stringify(f)}: settling is the first sample from which the remainder stays within`, () => {
      const long = 4000;
      const step = filterRun(f, Array.from({ length: long + 1 }, (_, k) => 1 - Math.exp(-(k * T) / tau)));
      for (const frac of [0.5, 0.1, 0.01, 0.001]) {
        let last = -1;
        for (let k = 0; k <= long; k++) if (1 - step[k]! > frac) last = k;
        expect(last).toBeLessThan(long - 1);
        expect(settlingSamples(f, tau, T, frac)).toBe(last + 1);
      }
    });
  }
  it('the recursive filter\'s equivalent time constant gives (1 − α)^n = e^(−nT/τ_f)', () => {
    for (const k of [1, 4, 10]) {
      const tf = recursiveTimeConstant(k, 0.1);
      expect((1 - 2 ** -k) ** 25).toBeCloseTo(Math.exp((-25 * 0.1) / tf), 12);
    }
  });
});

describe('noise reduction (white noise through the recurrences, seeded)', () => {
  it('recursive: variance ratio α/(2 − α); average of N: 1/N', () => {
    const rng = new Xoshiro128(11);
    const xs = Array.from({ length: 400_000 }, () => rng.normal());
    for (const f of FILTERS) {
      const ys = filterRun(f, xs).slice(5000);
      const mean = ys.reduce((a, b) => a + b, 0) / ys.length;
      const variance = ys.reduce((a, b) => a + (b - mean) ** 2, 0) / ys.length;
      // Within 8 % (the runs are correlated for long filters; 400k samples keep the spread small).
      expect(variance / filterNoiseRatio(f)).toBeGreaterThan(0.92);
      expect(variance / filterNoiseRatio(f)).toBeLessThan(1.08);
    }
    expect(filterNoiseRatio({ kind: 'recursive', shift: 3 })).toBeCloseTo(1 / 15, 15);
  });
});

const HEAD = `# Invented channel for the dynamics tests.
junction q {
  kind = npn
  IS   = 10 fA ± 40 %
  BF   = 200
}
adc a {
  bits      = 12
  reference = 1.2 V
  noise     = 1.5 LSB rms
}
`;

function channel(lines: string): ReturnType<typeof analyse> {
  return analyse({ path: '/virtual/dyn.tsense', text: `${HEAD}channel c {\n  sensor = q\n  adc = a\n  bias = current 20 uA\n  range = 0 °C .. 50 °C\n  accuracy = ± 1 °C\n  calibration = one point at 25 °C\n${lines}\n}\n` });
}

describe('the spec fields', () => {
  it('reads times, ramps in K/min and °C/min, and a noise limit', () => {
    const a = channel('  time_constant = 8 s ± 25 %\n  sample_period = 100 ms\n  settling = 1 min for 20 K step\n  ramp_lag = 0.5 K at 3 °C/min\n  noise_limit = 0.05 °C rms');
    expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const d = a.channels[0]!.channel.dynamics!;
    expect(d.timeConstant).toEqual({ seconds: 8, tolerance: 0.25 });
    expect(d.samplePeriodS).toBeCloseTo(0.1, 15);
    expect(d.settling).toEqual({ seconds: 60, stepK: 20 });
    expect(d.rampLag!.rampKPerS).toBeCloseTo(0.05, 15);
    expect(d.noiseLimitK).toBe(0.05);
  });
  it.each([
    ['time_constant = 8 K', 'wrong-unit', "time_constant takes a time (s, ms or min), but 'K' is a temperature"],
    ['time_constant = 0 s', 'out-of-domain', 'time_constant must be from 0.001 to 100000 s (found 0 s)'],
    ['sample_period = 2 h', 'bad-value', 'sample_period: unexpected text after the value'],
    ['settling = 30 s for 20 K', 'bad-value', 'settling: takes a time such as `30 s`'],
    ['settling = 2e6 s', 'out-of-domain', 'settling must be from 0.001 to 1000000 s'],
    ['ramp_lag = 0.5 K at 2 K/W', 'wrong-unit', 'ramp_lag takes a rate of temperature change (K/min or K/s)'],
    ['ramp_lag = 0.5 K at 200 K/s', 'out-of-domain', 'ramp_lag must be from 0.000001 to 100 K/s'],
    ['ramp_lag = 0.5 K', 'bad-value', 'ramp_lag: takes a lag and a ramp such as `0.5 K at 2 K/min`'],
    ['noise_limit = 0.05 °C peak', 'bad-value', 'noise_limit: takes an rms temperature noise'],
    ['noise_limit = -1 K rms', 'out-of-domain', 'noise_limit must be from 0.000001 to 100 K'],
  ])('%s: %s', (line, code, message) => {
    const a = channel(`  ${line}`);
    const d = a.diagnostics.find((x) => x.code === code);
    expect(d, a.diagnostics.map((x) => `${x.code} ${x.message}`).join('\n')).toBeDefined();
    expect(d!.message).toContain(message);
    for (const x of a.diagnostics) expect(x.message).not.toMatch(/NaN|Infinity/);
  });
});

describe('the chosen filter', () => {
  it('takes the lightest filter meeting the noise, and its figures meet every target', () => {
    const a = channel('  time_constant = 5 s\n  sample_period = 100 ms\n  ramp_lag = 0.5 K at 5 K/min\n  noise_limit = 0.2 °C rms');
    const d = channelDynamics(a.channels[0]!)!;
    expect(d.shortfall).toBeNull();
    expect(d.chosen.filter.kind).toBe('recursive');
    expect(d.meets).toEqual({ settling: null, ramp: true, noise: true });
    expect(d.chosen.noiseK!).toBeLessThanOrEqual(0.2);
    // The next weaker recursive filter misses the noise (so this one is the least lag meeting it).
    const k = (d.chosen.filter as { shift: number }).shift;
    const weaker = d.kPerUnit * Math.sqrt(d.inputNoiseUnits! ** 2 * filterNoiseRatio({ kind: 'recursive', shift: k - 1 }) + (k - 1 > 0 ? 1 / 12 : 0));
    expect(weaker).toBeGreaterThan(0.2);
    // Lag: the sensor's r·τ plus the filter's (2^k − 1) samples (Ogata; the recurrence above).
    expect(d.chosen.lagK!).toBeCloseTo((5 / 60) * (5 + (2 ** k - 1) * 0.1), 12);
  });
  it('without a noise limit no filter is chosen', () => {
    const a = channel('  time_constant = 5 s\n  sample_period = 100 ms\n  settling = 30 s');
    const d = channelDynamics(a.channels[0]!)!;
    expect(d.chosen.filter).toEqual({ kind: 'none' });
    expect(d.meets.settling).toBe(true);
    // 50 K step to 1 K with τ = 5 s: 5 ln 50 = 19.56 s, rounded up to the next 0.1 s sample.
    expect(d.chosen.settleS!).toBeCloseTo(19.6, 9);
  });
});
