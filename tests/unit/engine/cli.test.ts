// The CLI over the engine: exit status, text, JSON and SARIF outputs.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import Ajv from 'ajv-draft-04';
import { main } from '../../../server/src/cli/main';
import { VERSION } from '../../../server/src/cli/version';
import { FIXTURES } from '../helpers/fixtures';

const ROOT = path.resolve(__dirname, '../../..');

function runCli(args: string[]) {
  let out = '';
  let err = '';
  const code = main(args, { out: (t) => (out += t), err: (t) => (err += t), cwd: ROOT });
  return { code, out, err };
}

describe('thermoscribe check', () => {
  it('exits 0 on the clean sample and 1 when any error is reported', () => {
    expect(runCli(['check', 'samples/greenhouse.tsense']).code).toBe(0);
    const r = runCli(['check', 'samples/cold-chain-problems.tsense']);
    expect(r.code).toBe(1);
    expect(r.out).toMatch(/^samples\/cold-chain-problems\.tsense:\d+:\d+: error \[clip-high\]/m);
  });
  it('exits 2 on unusable input, with a message', () => {
    const r = runCli(['check', 'samples/no-such.tsense']);
    expect(r.code).toBe(2);
    expect(r.err).toContain("cannot read 'samples/no-such.tsense'");
    expect(runCli(['check']).code).toBe(2);
    expect(runCli(['check', '--format', 'xml', 'samples/greenhouse.tsense']).code).toBe(2);
    expect(runCli(['frobnicate']).code).toBe(2);
  });
  it('reports the version of package.json', () => {
    const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8'));
    expect(VERSION).toBe(pkg.version);
  });
});

describe('JSON report', () => {
  const r = runCli(['check', '--format', 'json', 'samples/greenhouse.tsense']);
  const json = JSON.parse(r.out);
  const soil = json.analyses[0].channels.find((c: { name: string }) => c.name === 'soil');

  it('holds each channel with its sweep, summary and inputs in base SI units', () => {
    expect(soil.sensorKind).toBe('junction');
    expect(Object.keys(soil.sweep[0]).slice(0, 5)).toEqual(['celsius', 'volts', 'amps', 'code', 'countsPerKelvin']);
    expect(soil.inputs.bias).toMatchObject({ kind: 'current', amps: 20e-6 });
    expect(soil.inputs.sensor.TNOM).toBeCloseTo(300.15, 12);
    expect(soil.inputs.range.lowK).toBeCloseTo(268.15, 12);
  });

  it('can be checked independently from its own inputs', () => {
    // Re-derive each sweep voltage from the reported inputs with the SPICE Gummel-Poon
    // saturation-current law (Massobrio & Antognetti, Semiconductor Device Modeling with SPICE,
    // 2nd ed. 1993, BJT temperature dependence; from memory) and the diode
    // equation of a diode-connected transistor, I = IS(T) (1 + 1/BF) (exp(V/(N Vt)) - 1),
    // Vt = kT/q with the SI 2019 exact constants. Written here independently of the engine.
    const k = 1.380649e-23;
    const q = 1.602176634e-19;
    const s = soil.inputs.sensor;
    const I = soil.inputs.bias.amps;
    for (const p of soil.sweep) {
      const T = p.celsius + 273.15;
      const vt = (k * T) / q;
      const isT = s.IS * Math.exp((T / s.TNOM - 1) * s.EG / vt) * (T / s.TNOM) ** s.XTI;
      const v = s.N * vt * Math.log(I / (isT * (1 + 1 / s.BF)) + 1) + I * s.RS;
      expect(Math.abs(v - p.volts)).toBeLessThan(1e-12);
      expect(p.code).toBe(Math.floor((v / soil.inputs.adc.referenceVolts) * 2 ** soil.inputs.adc.bits));
    }
  });

  it('gives diagnostics 0-based line/character ranges', () => {
    const bad = JSON.parse(runCli(['check', '--format', 'json', 'samples/cold-chain-problems.tsense']).out);
    const d = bad.diagnostics.find((x: { code: string }) => x.code === 'clip-high');
    const lines = fs.readFileSync(path.join(ROOT, 'samples/cold-chain-problems.tsense'), 'utf8').split('\n');
    expect(lines[d.range.start.line].slice(d.range.start.character, d.range.end.character)).toBe('low_ref_adc');
  });
});

describe('SARIF output', () => {
  it('validates against the published SARIF 2.1.0 schema', () => {
    // Schema: OASIS SARIF 2.1.0 (rtm.5) JSON schema, as shipped in the npm package @microsoft/jest-sarif.
    const schemaPath = require.resolve('@microsoft/jest-sarif/lib/schemas/sarif-2.1.0-rtm.5.json');
    const schema = JSON.parse(fs.readFileSync(schemaPath, 'utf8'));
    const ajv = new Ajv({ allErrors: true, strict: false, unicodeRegExp: false });
    const validate = ajv.compile(schema);
    for (const file of ['samples/cold-chain-problems.tsense', 'samples/greenhouse.tsense', path.join(FIXTURES, 'diagnostics/import-cycle.fires.tsense')]) {
      const r = runCli(['check', '--format', 'sarif', file]);
      const log = JSON.parse(r.out);
      const ok = validate(log);
      expect(validate.errors ?? []).toEqual([]);
      expect(ok).toBe(true);
      expect(log.version).toBe('2.1.0');
    }
    const log = JSON.parse(runCli(['check', '--format', 'sarif', 'samples/cold-chain-problems.tsense']).out);
    const result = log.runs[0].results.find((x: { ruleId: string }) => x.ruleId === 'clip-high');
    expect(result.level).toBe('error');
    expect(log.runs[0].tool.driver.rules[result.ruleIndex].id).toBe('clip-high');
    expect(result.locations[0].physicalLocation.region.startLine).toBeGreaterThan(1);
  });
});

describe('thermoscribe report', () => {
  it('prints each channel as a table with the caution', () => {
    const r = runCli(['report', 'samples/greenhouse.tsense', '--channel', 'soil']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Channel soil: junction 'generic_npn'/);
    expect(r.out).toMatch(/°C\s+mV\s+µA\s+code/);
    expect(r.out).toMatch(/calibrated reference thermometer/);
    expect(runCli(['report', 'samples/greenhouse.tsense', '--channel', 'nope']).code).toBe(2);
  });
  it('--brief prints the summary without the sweep table, with the caution (the demo, issue #14 item 16)', () => {
    const r = runCli(['report', 'samples/greenhouse.tsense', '--channel', 'bench_air', '--brief']);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Channel bench_air: junction 'generic_npn'/);
    expect(r.out).toMatch(/worst resolution [\d.]+ °C\/count/);
    expect(r.out).not.toMatch(/°C\s+mV\s+µA\s+code/);
    expect(r.out).toMatch(/local codes, the\napplicable safety standards/);
    expect(r.out.length).toBeLessThan(4000);
  });
});

describe('the bundled CLI in a pipe', () => {
  it('finishes quietly when the reader closes the pipe early (EPIPE)', async () => {
    const { spawnSync } = await import('node:child_process');
    const cli = path.join(ROOT, 'dist/cli.js');
    if (!fs.existsSync(cli)) return; // built by `npm test` before vitest runs
    const r = spawnSync('bash', ['-c', `node "${cli}" report samples/greenhouse.tsense | head -1; exit \${PIPESTATUS[0]}`], { cwd: ROOT, encoding: 'utf8' });
    expect(r.stdout).toMatch(/^Channel bench_air/);
    expect(r.stderr).not.toMatch(/EPIPE/);
    expect(r.status).toBe(0);
  });
});
