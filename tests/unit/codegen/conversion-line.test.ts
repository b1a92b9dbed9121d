// `conversion = line` is honoured by the code generator: one straight line over the range (two
// points, linear interpolation), whose error is what a line gives, not held to code_error.
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import { generateC } from '../../../server/src/codegen';

const samples = path.resolve(__dirname, '../../../samples');

function channel(spec: string, name: string) {
  const file = path.join(samples, spec);
  const host = new DiskHost();
  const a = analyse({ path: file, text: host.read(file) ?? '', root: samples, host });
  const r = a.channels.find((c) => c.channel.name === name)!;
  return { r, file };
}

describe('conversion = line', () => {
  it('greenhouse heat_mat converts with a straight line: two points over every in-range code', () => {
    const { r, file } = channel('greenhouse.tsense', 'heat_mat');
    expect(r.channel.conversion).toBe('line');
    const input = conversionInput(r, file);
    expect(input.method).toBe('line');
    const g = generateC([input], { fileStem: 'conv' });
    const ch = g.channels[0]!;
    expect(ch.method).toBe('table');
    expect(ch.entries).toBe(2);
    // A line fitted for the least maximum error deviates no more than the least-squares line the
    // nonlinearity check reports (ordinary least squares, analysis/nonlinearity.ts), plus one
    // output unit of rounding: the chord of a convex curve (common practice, no source).
    expect(ch.maxErrorC).toBeLessThanOrEqual(r.summary.nonlinearity.bestFitK + 1 / input.outputScale);
    expect(ch.maxErrorC).toBeGreaterThan(input.errorTarget);
    expect(g.text).toMatch(/Straight line \(conversion = line in the spec\)/);
  });

  it('a table channel still gets a table held to its target', () => {
    const { r, file } = channel('greenhouse.tsense', 'bench_air');
    const input = conversionInput(r, file);
    expect(input.method).not.toBe('line');
    expect(generateC([input], { fileStem: 'conv' }).channels[0]!.maxErrorC).toBeLessThanOrEqual(input.errorTarget);
  });
});
