// Protocol tests of the plot panel's server side: the channel code lenses and the custom request
// thermoscribe/plotData, through the real server process. JSON-RPC shapes follow the Language Server
// Protocol 3.17 specification (microsoft.github.io/language-server-protocol). The spec is the invented
// greenhouse sample, copied to a temporary folder.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, ROOT, TestClient } from './client';

interface PlotAnswer {
  ok: boolean;
  message?: string;
  channels?: string[];
  data?: {
    channel: string;
    transfer: { celsius: number[]; volts: number[]; code: number[] };
    error: { celsius: number[]; targetK: number | null; modes: { mode: string; stated: boolean; worstLow: number[]; mc: unknown }[] } | null;
  };
}

let dir: string;
let client: TestClient;
let uri: string;
let text: string;

beforeAll(async () => {
  ensureBuilt();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'thsc-plot-lsp-'));
  fs.cpSync(path.join(ROOT, 'samples'), dir, { recursive: true });
  client = await TestClient.start({ rootDir: dir, settings: { debounceMs: 0 } });
  text = fs.readFileSync(path.join(dir, 'greenhouse.tsense'), 'utf8');
  uri = client.open(path.join(dir, 'greenhouse.tsense'), text);
  await client.diagnostics(uri);
});

afterAll(async () => {
  await client.stop();
  fs.rmSync(dir, { recursive: true, force: true });
});

describe('channel code lenses', () => {
  it('puts a show-plot lens on each channel name, with the URI and the channel as arguments', async () => {
    const lenses = await client.request<{ range: { start: { line: number } }; command: { command: string; arguments: unknown[] } }[]>('textDocument/codeLens', { textDocument: { uri } });
    expect(lenses.map((l) => l.command.arguments)).toEqual(['bench_air', 'soil', 'heat_mat', 'canopy'].map((c) => [uri, c]));
    for (const l of lenses) {
      expect(l.command.command).toBe('thermoscribe.showPlot');
      expect(text.split('\n')[l.range.start.line]).toMatch(/^channel /);
    }
  });
});

describe('thermoscribe/plotData', () => {
  it("returns the channel's transfer curve and its error bands for the three calibration modes", async () => {
    const r = await client.request<PlotAnswer>('thermoscribe/plotData', { uri, channel: 'bench_air' });
    expect(r.ok).toBe(true);
    const d = r.data!;
    expect(d.channel).toBe('bench_air');
    // range -10 °C .. 50 °C in 0.5 K steps (the spec): 121 sweep points.
    expect(d.transfer.celsius).toHaveLength(121);
    expect(d.transfer.volts).toHaveLength(121);
    expect(d.error!.targetK).toBeCloseTo(0.5, 12);
    expect(d.error!.modes.map((m) => m.mode).sort()).toEqual(['none', 'one-point', 'two-point']);
    expect(d.error!.modes.find((m) => m.stated)!.mode).toBe('two-point');
    for (const m of d.error!.modes) {
      expect(m.worstLow).toHaveLength(d.error!.celsius.length);
      expect(m.mc).not.toBeNull();
    }
  });

  it('follows edits of the spec', async () => {
    const v = client.change(uri, text.replace('accuracy   = ± 0.5 °C', 'accuracy   = ± 0.8 °C'));
    await client.diagnostics(uri, v);
    const r = await client.request<PlotAnswer>('thermoscribe/plotData', { uri, channel: 'bench_air' });
    expect(r.data!.error!.targetK).toBeCloseTo(0.8, 12);
    client.change(uri, text);
  });

  it('names the error that stops a channel written in the spec, and lists that channel (issue 14, item 9)', async () => {
    const broken = text.replace(/(channel bench_air \{[^}]*?adc\s*=\s*)(\w+)/, '$1no_such_adc');
    const v = client.change(uri, broken);
    await client.diagnostics(uri, v);
    const line = broken.slice(0, broken.indexOf('no_such_adc')).split('\n').length;
    const r = await client.request<PlotAnswer & { blocked?: boolean }>('thermoscribe/plotData', { uri, channel: 'bench_air' });
    expect(r.ok).toBe(false);
    expect(r.blocked).toBe(true);
    expect(r.message).toMatch(new RegExp(`^channel 'bench_air' has no figures or plots until this error is fixed: line ${line}: .*no_such_adc`));
    expect((await client.request<PlotAnswer>('thermoscribe/plotData', { uri })).channels).toContain('bench_air');
    const back = client.change(uri, text);
    await client.diagnostics(uri, back);
  });

  it('answers an unknown channel with a message and the channels, and refuses bad parameters', async () => {
    const r = await client.request<PlotAnswer>('thermoscribe/plotData', { uri, channel: 'roof' });
    expect(r).toEqual({ ok: false, message: "no channel named 'roof' in this file", channels: ['bench_air', 'soil', 'heat_mat', 'canopy'] });
    const list = await client.request<PlotAnswer>('thermoscribe/plotData', { uri });
    expect(list.channels).toEqual(['bench_air', 'soil', 'heat_mat', 'canopy']);
    await expect(client.request('thermoscribe/plotData', { channel: 'soil' })).rejects.toThrow(/needs \{uri, channel\}/);
    // Still serving.
    expect((await client.request<PlotAnswer>('thermoscribe/plotData', { uri, channel: 'soil' })).ok).toBe(true);
  });
});

describe('thermoscribe/plotData with stated dynamics (issue 16)', () => {
  it('carries the step response and the ramp lag of the invented tank (tests/fixtures/dynamics/tank.tsense), and none for a channel without them', async () => {
    const file = path.join(dir, 'tank.tsense');
    fs.copyFileSync(path.join(ROOT, 'tests', 'fixtures', 'dynamics', 'tank.tsense'), file);
    const tank = client.open(file);
    await client.diagnostics(tank);
    type Dyn = { label: string; step: { t: number[]; sensor: number[]; reading: number[]; stepK: number }; ramp: { readingLag: number[]; targetK: number } | null };
    const r = await client.request<{ ok: boolean; data: { dynamics?: Dyn; cautions: string[] } }>('thermoscribe/plotData', { uri: tank, channel: 'tank' });
    const d = r.data.dynamics!;
    expect(d.step.stepK).toBe(20);
    expect(d.step.reading).toHaveLength(d.step.t.length);
    // The sensor alone follows 20·(1 − e^(−t/τ)) with the slowest τ = 8 s × 1.25 (Ogata, first-order unit-step response).
    d.step.t.forEach((t, i) => expect(d.step.sensor[i]!).toBeCloseTo(20 * (1 - Math.exp(-t / 10)), 9));
    expect(d.ramp!.targetK).toBe(0.5);
    expect(r.data.cautions).toEqual([]);
    const plain = await client.request<{ ok: boolean; data: { dynamics?: Dyn } }>('thermoscribe/plotData', { uri: tank, channel: 'tank_plain' });
    expect(plain.data.dynamics).toBeUndefined();
    client.close(tank);
  });
});
