// Measured points: one fitted model, with a flagged outlier left out, for both the generated code
// and the error budget. Outside reference: the measured points themselves (a code read at a known
// temperature must read back as that temperature), and the sample's own story (the 5 °C reading of
// freezer_probe was taken before the probe settled; invented).
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { fitMeasured, fittedChannel } from '../../../server/src/calibration/fit';
import { makeFrame } from '../../../server/src/budget/frame';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import type { JunctionDef } from '../../../server/src/model/types';
import { ZERO_CELSIUS_K } from '../../../server/src/physics/constants';

const samples = path.resolve(__dirname, '../../../samples');

function sampleChannel(spec: string, name: string) {
  const file = path.join(samples, spec);
  const host = new DiskHost();
  const a = analyse({ path: file, text: host.read(file) ?? '', root: samples, host });
  return { r: a.channels.find((c) => c.channel.name === name)!, file, a };
}

describe('measured points: the outlier is left out of the model gen and the budget use', () => {
  const { r, file } = sampleChannel('cold-chain-problems.tsense', 'freezer_probe');
  const c = r.channel;

  it('flags the 5 °C point and fits the other two for the firmware', () => {
    const fit = fitMeasured(c)!;
    expect(fit.outlier).toBe(2);
    const input = conversionInput(r, file);
    // The kept points read back as their temperatures (within the fit tolerance); before the fix
    // the firmware model was pulled towards the unsettled reading.
    for (const i of [0, 1]) {
      const m = c.measured![i]!;
      expect(Math.abs(input.celsiusAtCode(m.code) - (m.kelvin - ZERO_CELSIUS_K))).toBeLessThan(fit.toleranceK);
    }
    // The outlier does not: its reading disagrees by more than the tolerance.
    const bad = c.measured![2]!;
    expect(Math.abs(input.celsiusAtCode(bad.code) - (bad.kelvin - ZERO_CELSIUS_K))).toBeGreaterThan(fit.toleranceK);
    expect(input.note).toMatch(/left out/);
  });

  it('the error budget starts from the same fitted model as the code', () => {
    const frame = makeFrame(c, 9);
    const used = fittedChannel(c).sensor as JunctionDef;
    const inBudget = frame.channel.sensor as JunctionDef;
    expect(inBudget.params.IS).toBe(used.params.IS);
    expect(inBudget.params.N).toBe(used.params.N);
    expect(inBudget.params.IS).not.toBe((c.sensor as JunctionDef).params.IS);
  });
});
