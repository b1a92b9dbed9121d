// The sweep is held as columns and its points are made on first read: they equal the point of
// each temperature computed on its own, and the summary's extremes are the sweep's own points.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { pointAt, sweepKelvins } from '../../../server/src/analysis/sweep';
import { DiskHost } from '../../../server/src/cli/io';

const ROOT = path.resolve(__dirname, '../../..');
const SAMPLES = fs.readdirSync(path.join(ROOT, 'samples')).filter((f) => f.endsWith('.tsense')).map((f) => path.join(ROOT, 'samples', f));

describe('sweep table', () => {
  it('gives, for every channel of every sample, the points computed one by one', () => {
    const host = new DiskHost();
    let channels = 0;
    for (const file of SAMPLES) {
      const a = analyse({ path: file, text: fs.readFileSync(file, 'utf8'), root: path.dirname(file), host, errorBudget: false });
      for (const r of a.channels) {
        channels++;
        const c = r.channel;
        expect(r.sweep).toEqual(sweepKelvins(c).map((k) => pointAt(c, k)));
        const s = r.summary;
        const first = <K extends 'volts' | 'amps' | 'selfHeatingK'>(key: K, pick: (a: number, b: number) => number) =>
          r.sweep.find((p) => p[key] === r.sweep.map((q) => q[key]).reduce((a, b) => pick(a, b)))!;
        expect(s.at.voltsMin).toEqual(first('volts', Math.min));
        expect(s.at.voltsMax).toEqual(first('volts', Math.max));
        expect(s.at.ampsMin).toEqual(first('amps', Math.min));
        expect(s.at.ampsMax).toEqual(first('amps', Math.max));
        expect(s.at.selfHeatingMax).toEqual(first('selfHeatingK', Math.max));
        expect(s.worst.countsPerKelvin).toBe(Math.min(...r.sweep.map((p) => p.countsPerKelvin)));
        expect([s.codeMin, s.codeMax]).toEqual([Math.min(...r.sweep.map((p) => p.code)), Math.max(...r.sweep.map((p) => p.code))]);
        expect([s.voltsMin, s.voltsMax, s.ampsMin, s.ampsMax]).toEqual([s.at.voltsMin.volts, s.at.voltsMax.volts, s.at.ampsMin.amps, s.at.ampsMax.amps]);
      }
    }
    expect(channels).toBeGreaterThan(10);
  });

  it('without the error budget, gives every diagnostic but accuracy-unmet', () => {
    const host = new DiskHost();
    const file = path.join(ROOT, 'samples/cold-chain-problems.tsense');
    const text = fs.readFileSync(file, 'utf8');
    const full = analyse({ path: file, text, root: path.dirname(file), host });
    const lean = analyse({ path: file, text, root: path.dirname(file), host, errorBudget: false });
    expect(full.diagnostics.some((d) => d.code === 'accuracy-unmet')).toBe(true);
    expect(lean.diagnostics).toEqual(full.diagnostics.filter((d) => d.code !== 'accuracy-unmet'));
    expect(lean.channels.every((c) => c.worstCaseBudget === undefined)).toBe(true);
  });
});
