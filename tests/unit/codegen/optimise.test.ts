// `optimise = size | speed | balanced` steers which design `code_method = auto` picks among those
// that meet code_error. The kiln sample (invented) has a polynomial a little smaller than its
// table but much slower on an 8-bit MCU (bench/codegen.ts prints the measured cycles).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import { generateC } from '../../../server/src/codegen';
import { blockSpec } from '../../../server/src/model/schema';

const samples = path.resolve(__dirname, '../../../samples');
const file = path.join(samples, 'kiln.tsense');

function chamber(optimise?: string) {
  let text = fs.readFileSync(file, 'utf8');
  if (optimise) text = text.replace(/channel chamber \{\n/, `channel chamber {\n  optimise = ${optimise}\n`);
  const a = analyse({ path: file, text, root: samples, host: new DiskHost() });
  expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  const r = a.channels.find((c) => c.channel.name === 'chamber')!;
  const input = conversionInput(r, file);
  return { input, ch: generateC([input], { fileStem: 'k' }).channels[0]! };
}

describe('optimise', () => {
  it('is a channel field with a documented default of balanced', () => {
    const f = blockSpec('channel')!.fields.find((x) => x.name === 'optimise');
    expect(f?.defaultText).toBe('balanced');
    expect(f?.doc).toMatch(/size/);
  });

  it('size takes the fewest bytes, speed and balanced the faster table', () => {
    const size = chamber('size');
    const speed = chamber('speed');
    const balanced = chamber();
    expect(size.input.optimise).toBe('size');
    expect(balanced.input.optimise).toBe('balanced');
    expect(size.ch.method).toBe('polynomial');
    expect(speed.ch.method).toBe('table');
    expect(balanced.ch.method).toBe('table');
    expect(size.ch.bytesEstimate).toBeLessThanOrEqual(balanced.ch.bytesEstimate);
    for (const x of [size, speed, balanced]) expect(x.ch.maxErrorC).toBeLessThanOrEqual(x.input.errorTarget);
  });
});
