// The sweep of a single-bias junction channel is filled by a loop of its own
// (sweepJunction, server/src/physics/junction.ts) that makes no object per point. Its columns must be the
// very doubles that sense() gives point by point, and bad input must fail with the same message at
// the same point.
//
// Reference for every check below: the project's general path sense() (server/src/analysis/sense.ts,
// one temperature at a time through junctionAtTemperature and operatingPointAt). That path is itself
// checked against the independent damped-Newton solve, high-precision roots of the resistor-bias
// equation and the SPICE temperature laws (ngspice bjttemp.c / diotemp.c) in tests/unit/physics.
// Equality is Object.is: bit for bit, -0 and NaN included.
import * as fs from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { nominalBias, sense } from '../../../server/src/analysis/sense';
import { sweepJunction, type SweepColumns } from '../../../server/src/physics/junction';
import { SweepTable, sweepKelvins } from '../../../server/src/analysis/sweep';
import { nonlinearity } from '../../../server/src/analysis/nonlinearity';
import { ZERO_CELSIUS_K } from '../../../server/src/physics/constants';
import type { BiasDef, ChannelDef, JunctionDef } from '../../../server/src/model/types';
import type { JunctionParams } from '../../../server/src/physics/types';
import { generateSpec } from '../../../bench/generate';

const ROOT = path.resolve(__dirname, '../../..');
const FIELDS = ['volts', 'amps', 'slope', 'powerW', 'sourceOhms'] as const;

/** Plain growing arrays: also shows how far the loop got before an error. */
type Columns = SweepColumns & { [F in (typeof FIELDS)[number]]: number[] };

interface Run {
  cols: Columns;
  error?: string;
}

const emptyColumns = (): Columns => ({ volts: [], amps: [], slope: [], powerW: [], sourceOhms: [] });

/** What the sweep gave before the loop existed: sense() per temperature, stopping at the first error. */
function viaSense(c: ChannelDef, kelvins: readonly number[]): Run {
  const cols = emptyColumns();
  try {
    for (const k of kelvins) {
      const p = sense(c, k);
      for (const f of FIELDS) cols[f].push(p[f]);
    }
  } catch (err) {
    return { cols, error: (err as Error).message };
  }
  return { cols };
}

function viaLoop(c: ChannelDef, kelvins: readonly number[]): Run {
  const cols = emptyColumns();
  try {
    sweepJunction((c.sensor as JunctionDef).params, nominalBias(c), kelvins, cols);
  } catch (err) {
    return { cols, error: (err as Error).message };
  }
  return { cols };
}

/** Every point and field where `got` is not the very same double as `want` (at most a few listed). */
function differences(label: string, got: SweepColumns, want: SweepColumns): string[] {
  const out: string[] = [];
  for (const f of FIELDS) {
    if (got[f].length !== want[f].length) out.push(`${label} ${f}: ${got[f].length} points, reference ${want[f].length}`);
    const n = Math.min(got[f].length, want[f].length);
    for (let i = 0; i < n && out.length < 5; i++) {
      if (!Object.is(got[f][i], want[f][i])) out.push(`${label} ${f}[${i}]: ${got[f][i]} vs reference ${want[f][i]}`);
    }
  }
  return out;
}

const isLoopChannel = (c: ChannelDef): boolean => c.sensor.kind === 'junction' && !c.secondBias;

/** Compares, for every channel, the sweep table (and the loop itself where it applies) with sense(). */
function compareChannels(channels: ChannelDef[]): { points: number; loopChannels: number; diffs: string[] } {
  let points = 0;
  let loopChannels = 0;
  const diffs: string[] = [];
  for (const c of channels) {
    const kelvins = sweepKelvins(c);
    const want = viaSense(c, kelvins);
    expect(want.error).toBeUndefined();
    diffs.push(...differences(`${c.name} (table)`, new SweepTable(c, kelvins), want.cols));
    if (isLoopChannel(c)) {
      loopChannels++;
      diffs.push(...differences(`${c.name} (loop)`, viaLoop(c, kelvins).cols, want.cols));
    }
    points += kelvins.length;
  }
  return { points, loopChannels, diffs };
}

function channelsOf(file: string, text: string): ChannelDef[] {
  return analyse({ path: file, text, root: path.dirname(file), host: new DiskHost(), errorBudget: false }).channels.map((r) => r.channel);
}

const SAMPLE_CHANNELS = fs
  .readdirSync(path.join(ROOT, 'samples'))
  .filter((f) => f.endsWith('.tsense'))
  .flatMap((f) => {
    const file = path.join(ROOT, 'samples', f);
    return channelsOf(file, fs.readFileSync(file, 'utf8'));
  });

describe('junction sweep loop', () => {
  it('gives sense() bit for bit on every channel of every sample', () => {
    // Reference: sense(), see the top of this file.
    const r = compareChannels(SAMPLE_CHANNELS);
    expect(r.diffs).toEqual([]);
    expect(r.loopChannels).toBeGreaterThan(5);
    expect(r.points).toBeGreaterThan(1000);
  });

  it('gives sense() bit for bit on the generated 200-channel benchmark spec (33,200 points)', () => {
    // Reference: sense(), see the top of this file. The spec is invented (bench/generate.ts).
    const channels = channelsOf('/bench/generated.tsense', generateSpec(200, 3));
    const r = compareChannels(channels);
    expect(r.diffs).toEqual([]);
    expect(r.loopChannels).toBe(200);
    expect(r.points).toBe(33_200);
  });

  it('summary non-linearity: kelvin with an offset gives what a copied degC array gave', () => {
    // Reference: nonlinearity() called as the summary called it before, on kelvin - 273.15 per point.
    for (const c of SAMPLE_CHANNELS) {
      const t = new SweepTable(c, sweepKelvins(c));
      expect(nonlinearity(t.volts, t.kelvin, ZERO_CELSIUS_K)).toEqual(nonlinearity(t.volts, t.kelvin.map((k) => k - ZERO_CELSIUS_K)));
    }
  });

  // A real channel of a sample is the template; the property varies its junction, bias and sweep.
  const template = SAMPLE_CHANNELS.find(isLoopChannel)!;
  const withJunction = (params: JunctionParams, bias: BiasDef): ChannelDef => ({
    ...template,
    sensor: { ...(template.sensor as JunctionDef), params },
    bias,
  });
  const span = { start: 0, end: 0 };
  const tol = (value: number) => ({ value, tolerance: 0, span });
  const BAD = [NaN, -1, 0, Infinity, -Infinity];

  const goodParams = fc.record({
    kind: fc.constantFrom('npn' as const, 'pnp' as const, 'diode' as const),
    IS: fc.double({ min: 1e-18, max: 1e-8, noNaN: true }),
    N: fc.double({ min: 0.8, max: 2.5, noNaN: true }),
    BF: fc.double({ min: 2, max: 2000, noNaN: true }),
    EG: fc.double({ min: 0, max: 1.6, noNaN: true }),
    XTI: fc.double({ min: -2, max: 6, noNaN: true }),
    XTB: fc.oneof(fc.constant(0), fc.double({ min: -3, max: 3, noNaN: true })),
    TNOM: fc.double({ min: 150, max: 450, noNaN: true }),
    RS: fc.oneof(fc.constant(0), fc.double({ min: 0, max: 2000, noNaN: true })),
  });
  // About one case in eight has one parameter out of its domain.
  const params = fc.oneof(
    { weight: 7, arbitrary: goodParams },
    {
      weight: 1,
      arbitrary: fc
        .tuple(goodParams, fc.constantFrom('IS', 'N', 'BF', 'EG', 'XTI', 'XTB', 'TNOM', 'RS'), fc.constantFrom(...BAD))
        .map(([p, key, v]): JunctionParams => ({ ...p, [key]: v })),
    },
  );
  const value = (min: number, max: number) => fc.oneof({ weight: 12, arbitrary: fc.double({ min, max, noNaN: true }) }, { weight: 1, arbitrary: fc.constantFrom(...BAD) });
  const bias: fc.Arbitrary<BiasDef> = fc.oneof(
    value(0, 5e-3).map((amps): BiasDef => ({ kind: 'current', amps: tol(amps), span })),
    fc.tuple(value(1, 1e7), value(0, 30)).map(([ohms, supply]): BiasDef => ({ kind: 'resistor', ohms: tol(ohms), supply: tol(supply), span })),
  );
  // Even sweeps as the resolver makes them, and lists with temperatures that fail part-way
  // (0 K, negative, NaN, and temperatures where IS(T) leaves the double range).
  const kelvins = fc.oneof(
    fc
      .tuple(fc.double({ min: 20, max: 700, noNaN: true }), fc.double({ min: 0.05, max: 25, noNaN: true }), fc.integer({ min: 1, max: 250 }))
      .map(([low, step, n]) => Array.from({ length: n }, (_, i) => low + i * step)),
    fc.array(fc.oneof({ weight: 6, arbitrary: fc.double({ min: 1, max: 3000, noNaN: true }) }, { weight: 1, arbitrary: fc.constantFrom(0, -5, NaN, Infinity, 1e-3, 2, 1e120) }), {
      minLength: 1,
      maxLength: 30,
    }),
  );

  it('gives sense() bit for bit, or the same error after the same points, for random junctions, biases and sweeps', () => {
    // Reference: sense(), see the top of this file; fast-check, fixed seed.
    let failed = 0;
    fc.assert(
      fc.property(params, bias, kelvins, (p, b, ks) => {
        const c = withJunction(p, b);
        const want = viaSense(c, ks);
        const got = viaLoop(c, ks);
        if (want.error !== undefined) failed++;
        expect(got.error).toBe(want.error);
        expect(differences('random', got.cols, want.cols)).toEqual([]);
        if (want.error === undefined) expect(differences('table', new SweepTable(c, ks), want.cols)).toEqual([]);
        else expect(() => new SweepTable(c, ks)).toThrow(want.error);
      }),
      { numRuns: 3000, seed: 20251202 },
    );
    // Both outcomes were exercised.
    expect(failed).toBeGreaterThan(100);
    expect(failed).toBeLessThan(2900);
  });

  it('checks the parameters before computing anything, and the temperature first', () => {
    // Reference: sense() at the first temperature (junctionAtTemperature checks the temperature,
    // then IS, N, TNOM, EG, RS, XTI, BF, XTB).
    const p = (template.sensor as JunctionDef).params;
    for (const [bad, ks] of [
      [{ ...p, IS: -1 }, [300, 310]],
      [{ ...p, RS: NaN }, [300, 310]],
      [{ ...p, IS: -1 }, [0, 310]],
    ] as const) {
      const c = withJunction(bad, template.bias);
      const want = viaSense(c, ks);
      const got = viaLoop(c, ks);
      expect(want.error).toMatch(/must be a finite number/);
      expect(got).toEqual(want);
      expect(got.cols.volts).toEqual([]);
    }
  });

  it('fails at the same temperature with the same message when IS(T) leaves the double range part-way', () => {
    // Reference: sense() per point. At 1e120 K the (T/TNOM)^XTI factor overflows a double.
    const c = withJunction((template.sensor as JunctionDef).params, template.bias);
    const ks = [290, 300, 1e120, 310];
    const want = viaSense(c, ks);
    const got = viaLoop(c, ks);
    expect(want.error).toMatch(/^the saturation current IS cannot be computed at 1\.000e\+120 K/);
    expect(got.error).toBe(want.error);
    expect(got.cols.volts.length).toBe(2);
    expect(differences('part-way', got.cols, want.cols)).toEqual([]);
  });

  it("throws the resistor solve's own errors at the same point, as sense() does", () => {
    // Reference: sense() (solveResistorBiasAmps checks nVt > 0 and that rt/nVt stays a double).
    const p = (template.sensor as JunctionDef).params;
    const resistor = (ohms: number): BiasDef => ({ kind: 'resistor', ohms: tol(ohms), supply: tol(3.3), span });
    for (const [params, bias, message] of [
      [{ ...p, N: 5e-324 }, resistor(100e3), /the resistor bias cannot be solved/],
      [p, resistor(1e307), /bias resistor or supply is too large/],
    ] as const) {
      const c = withJunction(params, bias);
      const want = viaSense(c, [300, 310]);
      expect(want.error).toMatch(message);
      expect(viaLoop(c, [300, 310])).toEqual(want);
    }
  });

  it('reports IS(T) at the first temperature before a bad bias, as sense() does', () => {
    // Reference: sense() (junctionAtTemperature runs before operatingPointAt checks the bias).
    const bad: BiasDef = { kind: 'resistor', ohms: tol(0), supply: tol(3.3), span };
    const c = withJunction((template.sensor as JunctionDef).params, bad);
    for (const ks of [[1e120, 300], [300, 1e120]]) {
      const want = viaSense(c, ks);
      expect(viaLoop(c, ks)).toEqual(want);
    }
    expect(viaSense(c, [1e120])).toEqual({ cols: emptyColumns(), error: expect.stringMatching(/saturation current IS/) });
    expect(viaSense(c, [300])).toEqual({ cols: emptyColumns(), error: expect.stringMatching(/bias resistor must be a finite number > 0 ohm/) });
  });
});
