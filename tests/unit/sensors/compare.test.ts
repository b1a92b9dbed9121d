// `thermoscribe compare` on the invented sous-vide sample: text and JSON, and bad arguments.
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { main } from '../../../server/src/cli/main';

const ROOT = path.resolve(__dirname, '../../..');

function runCli(argv: string[]): { code: number | 'serving'; out: string; err: string } {
  let out = '';
  let err = '';
  const code = main(argv, { out: (t) => { out += t; }, err: (t) => { err += t; }, cwd: ROOT });
  return { code, out, err };
}

describe('thermoscribe compare', () => {
  it('lays out the candidates of a group side by side (text)', () => {
    const r = runCli(['compare', 'samples/sous-vide.tsense']);
    expect(r.code).toBe(0);
    expect(r.out).toContain("Measurement 'bath': 2 candidates");
    expect(r.out).toMatch(/^bath_ntc\s+thermistor bath_bead/m);
    expect(r.out).toMatch(/^bath_rtd\s+rtd bath_pt/m);
    expect(r.out).toContain('Caution');
    expect(r.out).not.toMatch(/NaN|undefined/);
  });

  it('gives the same figures as JSON', () => {
    const r = runCli(['compare', 'samples/sous-vide.tsense', '--format', 'json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.out);
    const rows = j.groups[0].rows;
    expect(rows.map((x: { channel: string }) => x.channel)).toEqual(['bath_ntc', 'bath_rtd']);
    for (const row of rows) {
      expect(row.errorAfterK).toBeLessThanOrEqual(row.errorBeforeK);
      expect(row.codeBytes).toBeGreaterThan(0);
      expect(row.parts).toBe(2);
    }
    // IEC 60751:2008 class A at 95 °C: 0.15 + 0.002 x 95 = 0.34 °C (class formula, from memory).
    expect(rows[1].classToleranceK).toBeCloseTo(0.34, 12);
  });

  it('refuses bad arguments with a clear message', () => {
    expect(runCli(['compare']).code).toBe(2);
    expect(runCli(['compare', 'samples/sous-vide.tsense', '--format', 'xml']).err).toContain('--format takes text or json');
    const g = runCli(['compare', 'samples/sous-vide.tsense', '--group', 'nope']);
    expect(g.code).toBe(2);
    expect(g.err).toContain("no group named 'nope'; groups: bath");
    expect(runCli(['compare', 'samples/none.tsense']).code).toBe(2);
  });
});
