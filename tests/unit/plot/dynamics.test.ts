// The response charts (plot/data.ts dynamicsSeries, plot/spec.ts) and the channel hover's response
// line, for the invented tank of tests/fixtures/dynamics/tank.tsense. The sensor's curves are
// checked against the first-order analytic responses (K. Ogata, Modern Control Engineering,
// "First-order systems": unit-step response 1 − e^(−t/T), unit-ramp error tending to T).
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { beforeAll, describe, expect, it } from 'vitest';
import { analyse, type Analysis } from '../../../server/src/engine';
import { plotData, plotProblem } from '../../../server/src/plot/data';
import { LABELS, plotSpec } from '../../../server/src/plot/spec';
import { renderSvg } from '../../../server/src/plot/render';
import { channelHover } from '../../../server/src/features/hover';
import { channelReport } from '../../../server/src/cli/commands/report';
import { channelDynamics, stepRemainder } from '../../../server/src/analysis/dynamics';
import { CLI, ensureBuilt, ROOT } from '../../protocol/client';

const TANK = path.join(ROOT, 'tests', 'fixtures', 'dynamics', 'tank.tsense');
let a: Analysis;
beforeAll(() => {
  a = analyse({ path: TANK, text: fs.readFileSync(TANK, 'utf8') });
});
const result = (name: string) => a.channels.find((r) => r.channel.name === name)!;
type Mark = { type: string; name?: string; marks?: Mark[]; encode?: { enter?: Record<string, { value?: unknown; scale?: string }> } };
const allMarks = (ms: Mark[]): Mark[] => ms.flatMap((m) => [m, ...allMarks(m.marks ?? [])]);

describe('response plot data', () => {
  it('follows the first-order analytic step and ramp responses with the slowest time constant', () => {
    const d = plotData(result('tank'), null).dynamics!;
    const tau = 8 * 1.25;
    d.step.t.forEach((t, i) => expect(d.step.sensor[i]!).toBeCloseTo(20 * (1 - Math.exp(-t / tau)), 9));
    d.ramp!.t.forEach((t, i) => expect(d.ramp!.sensorLag[i]!).toBeCloseTo((2 / 60) * tau * (1 - Math.exp(-t / tau)), 9));
    // The ramp's sensor lag tends to r·τ (Ogata): 2 K/min × 10 s = 0.333 K.
    expect(d.ramp!.sensorLag.at(-1)!).toBeCloseTo(1 / 3, 3);
    // The reading: the chosen filter behind the sensor, at the sample instants.
    const dyn = channelDynamics(result('tank'))!;
    d.step.t.forEach((t, i) => expect(d.step.reading[i]!).toBeCloseTo(20 * (1 - stepRemainder(dyn.chosen.filter, tau, 0.1, Math.round(t / 0.1))), 9));
    expect(d.step.settleS).toBe(dyn.chosen.settleS);
    expect(d.ramp!.lagK).toBe(dyn.chosen.lagK);
    expect(d.ramp!.targetK).toBe(0.5);
    expect(d.step.epsK).toBe(0.5);
    expect(d.label).toContain('sensor time constant 10 s (slowest), sampled every 0.1 s; filter: ');
  });

  it('draws a step panel and a ramp panel with the targets, and nothing for a channel without dynamics', () => {
    const d = plotData(result('tank'), null);
    const marks = allMarks((plotSpec(d, { chart: 'dynamics' }) as { marks: Mark[] }).marks);
    for (const name of ['dynamics-step', 'dynamics-ramp', 'step-sensor', 'step-reading', 'ramp-reading', 'lag-target', 'settle-low', 'settle-high', 'settling-target']) {
      expect(marks.some((m) => m.name === name), name).toBe(true);
    }
    expect(marks.find((m) => m.name === 'lag-target')!.encode!.enter!['y']).toEqual({ scale: 'y', value: 0.5 });
    expect(marks.find((m) => m.name === 'settle-low')!.encode!.enter!['y']).toEqual({ scale: 'y', value: 19.5 });
    const plain = plotData(result('tank_plain'), null);
    expect('dynamics' in plain).toBe(false);
    expect(plotProblem(plain, 'dynamics')).toContain("channel 'tank_plain' states no time_constant");
    expect(allMarks((plotSpec(plain, { chart: 'both' }) as { marks: Mark[] }).marks).some((m) => m.name?.startsWith('dynamics'))).toBe(false);
  });

  it('renders to SVG with the series labels and no NaN', async () => {
    const svg = await renderSvg(plotSpec(plotData(result('tank'), null), { chart: 'dynamics' }));
    for (const label of [LABELS.sensor, LABELS.reading, LABELS.settleBand, LABELS.lagTarget]) expect(svg).toContain(`>${label}`);
    expect(svg).not.toMatch(/NaN|Infinity/);
  });
});

describe('channel hover', () => {
  it('gains one response line with the lag, the settling and the filter', () => {
    const h = channelHover(result('tank'));
    const line = h.split('\n\n').find((l) => l.startsWith('Response'))!;
    expect(line).toMatch(/^Response \(time constant 10 s at its slowest, sampled every 0\.1 s\): lag \*\*[0-9.]+ K\*\* at 2 K\/min \(ramp_lag 0\.5 K\); within ±0\.5 K \*\*[0-9.]+ s\*\* after a 20 K step \(settling 60 s\); filter: /);
    expect(channelHover(result('tank_plain'))).not.toContain('Response');
  });
});

describe('thermoscribe report', () => {
  it('states the same response line (lag at the ramp, settling, filter) as the hover, in plain text', () => {
    const line = channelHover(result('tank')).split('\n\n').find((l) => l.startsWith('Response'))!;
    expect(channelReport(result('tank'), true)).toContain(`  ${line.replace(/\*\*/g, '')}`);
    expect(channelReport(result('tank_plain'), true)).not.toContain('Response');
  });
});

describe('thermoscribe plot --chart dynamics', () => {
  let dir: string;
  beforeAll(() => {
    ensureBuilt();
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-dyn-'));
  });
  const cli = (...args: string[]) => spawnSync(process.execPath, [CLI, 'plot', ...args], { cwd: ROOT, encoding: 'utf8' });
  it('writes the response chart, and refuses a channel without a time constant', () => {
    const out = path.join(dir, 'tank.svg');
    const r = cli(TANK, '--channel', 'tank', '--out', out, '--chart', 'dynamics');
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('step response and ramp lag of channel tank');
    expect(fs.readFileSync(out, 'utf8')).toContain(`>${LABELS.reading}`);
    const bad = cli(TANK, '--channel', 'tank_plain', '--out', path.join(dir, 'plain.svg'), '--chart', 'dynamics');
    expect(bad.status).toBe(1);
    expect(bad.stderr).toContain("channel 'tank_plain' states no time_constant");
    expect(fs.existsSync(path.join(dir, 'plain.svg'))).toBe(false);
  });
});
