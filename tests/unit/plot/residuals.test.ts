// The residual chart (plot/data.ts residualSeries, plot/spec.ts) of the invented probe of
// tests/fixtures/diagnostics/bench-data-file.quiet.tsense, whose invented bench log
// (bench/good.csv) has one unsettled reading at 5 °C (row 10). The residual of one point is checked
// against a hand calculation with the SPICE Gummel–Poon temperature law of the saturation current,
// IS(T) = IS·(T/TNOM)^XTI·exp((T/TNOM − 1)·EG/Vt), and the diode-connected transistor's
// V = N·Vt·ln(1 + I/(IS(T)·(1 + 1/BF))) (A. Vladimirescu, The SPICE Book, Wiley 1994; from memory),
// written out here independently of the engine. The plot's caution carries the sensor kind's own
// cautions, as report, budget and compare do (report/caution.ts), shown with the invented kiln sample.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyse, type Analysis } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { plotData, plotProblem } from '../../../server/src/plot/data';
import { LABELS, plotSpec } from '../../../server/src/plot/spec';
import { renderSvg } from '../../../server/src/plot/render';
import { fitMeasured, OUTLIER_RULE } from '../../../server/src/calibration/fit';
import { kindCautions } from '../../../server/src/report/caution';
import type { JunctionDef } from '../../../server/src/sensors/junction/types';
import { CLI, ensureBuilt, ROOT } from '../../protocol/client';

const DIR = path.join(ROOT, 'tests', 'fixtures', 'diagnostics');
const SPEC = path.join(DIR, 'bench-data-file.quiet.tsense');
const KILN = path.join(ROOT, 'samples', 'kiln.tsense');
let a: Analysis;
beforeAll(() => {
  a = analyse({ path: SPEC, text: fs.readFileSync(SPEC, 'utf8'), root: DIR, host: new DiskHost() });
});
const probe = () => a.channels.find((r) => r.channel.name === 'probe')!;

type Values = Record<string, number | string>[];
type Mark = { type: string; name?: string; marks?: Mark[]; encode?: { enter?: Record<string, { value?: unknown; scale?: string }> } };
type Spec = { data: { name: string; values: Values }[]; marks: Mark[] };
const allMarks = (ms: Mark[]): Mark[] => ms.flatMap((m) => [m, ...allMarks(m.marks ?? [])]);
const dataset = (s: Spec, name: string) => s.data.find((d) => d.name === name)!.values;
const texts = (s: Spec) => allMarks(s.marks).flatMap((m) => [m.encode?.enter?.['text']?.value].flat()).filter((t): t is string => typeof t === 'string');

describe('residual data', () => {
  it('one point per measured point, in the bench log\'s order, with the fit\'s residuals, tolerances and the outlier flag', () => {
    const r = plotData(probe(), null).residuals!;
    const fit = fitMeasured(probe().channel)!;
    expect(r.points.map((p) => p.source)).toEqual([3, 4, 5, 6, 7, 8, 9, 10, 11].map((n) => `row ${n}, board P1`));
    expect(r.points.map((p) => p.residualK)).toEqual(fit.points.map((p) => p.residualK));
    expect(r.points.map((p) => p.leaveOneOutK)).toEqual(fit.points.map((p) => p.leaveOneOutK));
    expect(r.points.map((p) => p.outlier)).toEqual([false, false, false, false, false, false, false, true, false]);
    // accuracy ± 1 °C: the tolerance is half of it (the stated rule), above 2 LSB here.
    expect(r.points.every((p) => p.toleranceK === 0.5)).toBe(true);
    expect(r.rule).toBe(OUTLIER_RULE);
    expect(r.model).toMatch(/^junction model of 'q' fitted to all 9 points: IS = 1\.36\d+e-14, N = 1\.004\d*; the budget and the generated code use it fitted without the outlier \(row 10, board P1\): IS = 1\.19\d*e-14, N = 0\.999\d*$/);
  });

  it('the residual at 0 °C (row 9, code 2069) agrees with a hand calculation from the fitted constants', () => {
    const fit = fitMeasured(probe().channel)!;
    const s = fit.channel.sensor as JunctionDef;
    const { IS, N, EG, XTI, TNOM, BF } = s.params;
    const k = 1.380649e-23; // J/K, SI 2019 exact
    const q = 1.602176634e-19; // C, SI 2019 exact
    const volts = (T: number) => {
      const vt = (k * T) / q;
      const isT = IS * (T / TNOM) ** XTI * Math.exp(((T / TNOM - 1) * EG) / vt);
      return N * vt * Math.log1p(20e-6 / (isT * (1 + 1 / BF)));
    };
    const T = 273.15;
    // The code's voltage at the middle of its step (12 bits on 1.2 V), and the model's slope there.
    const measured = ((2069 + 0.5) * 1.2) / 4096;
    const slope = (volts(T + 1e-3) - volts(T - 1e-3)) / 2e-3;
    const hand = (measured - volts(T)) / slope;
    // Worked by hand with the 5-digit constants the report prints (IS = 1.3638e-14, N = 1.0043): −0.242 K;
    // the full-precision constants give the engine's −0.233 K.
    expect(hand).toBeCloseTo(-0.233, 2);
    const row9 = plotData(probe(), null).residuals!.points[6]!;
    expect(row9.residualK).toBeCloseTo(hand, 3);
  });

  it('is absent for a channel without measured points, and `residuals` is then refused with the reason', () => {
    const text = fs.readFileSync(SPEC, 'utf8').replace(/\n\s*bench_data = .*\n/, '\n');
    const plain = analyse({ path: SPEC, text, root: DIR, host: new DiskHost() });
    const d = plotData(plain.channels[0]!, null);
    expect('residuals' in d).toBe(false);
    expect(plotProblem(d, 'residuals')).toBe("channel 'probe' has no measured points that its sensor's model is fitted to (measured, bench_data): there are no residuals to draw");
    expect(allMarks((plotSpec(d) as unknown as Spec).marks).some((m) => m.name === 'residual-panel')).toBe(false);
  });

  it('points without a finite residual are left out and said; none left: `residuals` is refused, `both` draws the rest', () => {
    const d = plotData(probe(), probe().budget);
    const none = { ...d, residuals: { ...d.residuals!, points: [] } };
    expect(plotProblem(none, 'residuals')).toBe("channel 'probe': no measured point has a finite residual to draw; check the measured points against the range and the bias");
    expect(plotProblem(none, 'both')).toBeNull();
    const huge = { ...d, residuals: { ...d.residuals!, points: d.residuals!.points.map((p, i) => (i === 0 ? { ...p, residualK: 1e13 } : p)) } };
    expect(plotProblem(huge, 'residuals')).toMatch(/a residual leaves the drawable range/);
  });
});

describe('residual chart spec', () => {
  it('carries every point, the outlier rule\'s limits at ± the tolerance, the outlier apart, and names the model', () => {
    const d = plotData(probe(), null);
    const spec = plotSpec(d, { chart: 'residuals' }) as unknown as Spec;
    const pts = dataset(spec, 'residuals');
    expect(pts.map((p) => p['t'])).toEqual([-30, -25, -20, -15, -10, -5, 0, 5, 10]);
    expect(pts.map((p) => p['outlier'])).toEqual([0, 0, 0, 0, 0, 0, 0, 1, 0]);
    expect(pts.map((p) => p['r'])).toEqual(d.residuals!.points.map((p) => Number(p.residualK.toPrecision(6))));
    const limits = dataset(spec, 'residual-limits');
    expect(limits.every((l) => l['hi'] === 0.5 && l['lo'] === -0.5)).toBe(true);
    // The limits span the panel from edge to edge.
    expect(limits[0]!['t']).toBeLessThan(-30);
    expect(limits.at(-1)!['t']).toBeGreaterThan(10);
    const out = dataset(spec, 'residual-outliers');
    expect(out).toHaveLength(1);
    expect(out[0]).toMatchObject({ t: 5, outlier: 1, source: 'row 10, board P1' });
    // Judged by the others' fit: 0.956 K against 0.5 K (the diagnostic's figure, tests/unit/calibration/bench-data.test.ts).
    expect(out[0]!['loo']).toBeCloseTo(0.956, 3);
    const marks = allMarks(spec.marks);
    for (const name of ['residual-panel', 'residual-points', 'residual-others', 'outlier-limit-high', 'outlier-limit-low', 'residual-outlier', 'residual-outlier-label', 'legend-residuals']) {
      expect(marks.some((m) => m.name === name), name).toBe(true);
    }
    // The outlier is a cross, the other points circles.
    expect(marks.find((m) => m.name === 'residual-outlier')!.encode!.enter!['shape']).toEqual({ value: 'cross' });
    expect(marks.find((m) => m.name === 'residual-points')!.encode!.enter!['shape']).toEqual({ value: 'circle' });
    const words = texts(spec).join(' ');
    expect(words).toContain('Junction model of');
    expect(words).toContain('Outliers: a point is flagged when');
    // Only the residual chart was asked for.
    expect(marks.some((m) => m.name?.startsWith('transfer') || m.name?.startsWith('error-'))).toBe(false);
  });

  it('`both` adds the residual chart after the others when the channel has measured points', () => {
    const spec = plotSpec(plotData(probe(), probe().budget)) as unknown as Spec;
    const names = allMarks(spec.marks).map((m) => m.name);
    expect(names).toContain('transfer-volts');
    expect(names).toContain('residual-panel');
    expect(names.indexOf('residual-panel')).toBeGreaterThan(names.indexOf('transfer-volts'));
  });

  it('renders to SVG with the series labels, the outlier named and no NaN', async () => {
    const svg = await renderSvg(plotSpec(plotData(probe(), null), { chart: 'residuals' }));
    for (const label of [LABELS.residual, LABELS.othersFit, LABELS.outlierLimit, LABELS.outlier, 'row 10, board P1']) expect(svg).toContain(`>${label}`);
    expect(svg).not.toMatch(/NaN|Infinity/);
  });
});

describe('the plot caution carries the sensor kind\'s cautions (sensors/kind.ts `cautions`)', () => {
  it('a thermocouple channel\'s plot says to isolate mains and keep an independent cut-out; a junction\'s has none of that', async () => {
    const kiln = analyse({ path: KILN, text: fs.readFileSync(KILN, 'utf8'), root: path.dirname(KILN), host: new DiskHost() });
    const tc = kiln.channels.find((r) => r.channel.sensor.kind === 'thermocouple')!;
    const d = plotData(tc, null);
    expect(d.cautions).toEqual(kindCautions([tc.channel]));
    expect(d.cautions.join(' ')).toMatch(/isolate the measuring circuit from mains/);
    const caution = allMarks((plotSpec(d, { chart: 'transfer' }) as unknown as Spec).marks).find((m) => m.name === 'caution')!;
    const lines = caution.encode!.enter!['text']!.value as string[];
    expect(lines.join(' ')).toContain('Model figures, not a safety assessment');
    expect(lines.join(' ')).toContain('isolate the measuring circuit from mains');
    expect(lines.join(' ')).toContain('independent over-temperature cut-out');
    const svg = await renderSvg(plotSpec(d, { chart: 'transfer' }));
    expect(svg).toContain('isolate the measuring');
    expect(plotData(probe(), null).cautions).toEqual([]);
  });
});

describe('thermoscribe plot --chart residuals', () => {
  let dir: string;
  beforeAll(() => {
    ensureBuilt();
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-res-'));
  });
  const cli = (...args: string[]) => spawnSync(process.execPath, [CLI, 'plot', ...args], { cwd: ROOT, encoding: 'utf8' });
  it('writes the residual chart; `both` includes it; a channel without measured points is refused and nothing is written', () => {
    const out = path.join(dir, 'probe.svg');
    const r = cli(SPEC, '--channel', 'probe', '--out', out, '--chart', 'residuals', '--root', DIR);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('residuals of the measured points of channel probe');
    const svg = fs.readFileSync(out, 'utf8');
    for (const label of [LABELS.residual, LABELS.outlierLimit, LABELS.outlier, 'row 10, board P1']) expect(svg).toContain(`>${label}`);
    expect(svg).not.toMatch(/NaN|Infinity/);
    const both = cli(SPEC, '--channel', 'probe', '--out', path.join(dir, 'both.svg'), '--runs', '200', '--root', DIR);
    expect(both.status).toBe(0);
    expect(both.stdout).toContain('(transfer curve, error budget and residuals of channel probe)');
    expect(fs.readFileSync(path.join(dir, 'both.svg'), 'utf8')).toContain(`>${LABELS.residual}`);
    const plainSpec = path.join(dir, 'plain.tsense');
    fs.writeFileSync(plainSpec, fs.readFileSync(SPEC, 'utf8').replace(/\n\s*bench_data = .*\n/, '\n'));
    const bad = cli(plainSpec, '--channel', 'probe', '--out', path.join(dir, 'plain.svg'), '--chart', 'residuals');
    expect(bad.status).toBe(1);
    expect(bad.stderr).toContain("channel 'probe' has no measured points");
    expect(fs.existsSync(path.join(dir, 'plain.svg'))).toBe(false);
  });
});
