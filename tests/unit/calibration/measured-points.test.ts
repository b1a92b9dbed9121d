// Measured points: one fitted model, with a flagged outlier left out, for both the generated code
// and the error budget. Outside reference: the measured points themselves (a code read at a known
// temperature must read back as that temperature), and the sample's own story (the 5 °C reading of
// freezer_probe was taken before the probe settled; invented).
import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { fitMeasured, fittedChannel } from '../../../server/src/calibration/fit';
import { makeFrame } from '../../../server/src/budget/frame';
import { conversionInput } from '../../../server/src/codegen/channel-input';
import type { JunctionDef } from '../../../server/src/sensors/junction/types';
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

describe('measured points that cannot be fitted are diagnostics, never dropped silently', () => {
  // The calibration-outlier fixture's invented junction channel, with the measured field varied.
  const dir = path.resolve(__dirname, '../../fixtures/diagnostics');
  const base = fs.readFileSync(path.join(dir, 'calibration-outlier.fires.tsense'), 'utf8');
  function diagnose(measured: string) {
    const text = base.replace(/measured = .*/, `measured = ${measured}`);
    const a = analyse({ path: path.join(dir, 'probe.tsense'), text, root: dir, host: new DiskHost() });
    return a.diagnostics.filter((d) => d.span.start >= text.indexOf('measured =')).map((d) => `${d.code}: ${d.message}`);
  }

  it('two points at one temperature far apart (before: fitted with an rms of many kelvin, no word)', () => {
    const d = diagnose('2226 counts at -20 °C and 1000 counts at -20 °C');
    expect(d.some((m) => /^calibration-outlier: codes 2226 and 1000 were both read at -20 °C/.test(m))).toBe(true);
  });

  it('a code at the full scale or at 0 of the converter', () => {
    expect(diagnose('4095 counts at -20 °C and 2155 counts at -10 °C')).toEqual([expect.stringMatching(/^out-of-domain: measured: code 4095 is the full scale of the 12-bit converter/)]);
    expect(diagnose('0 counts at -20 °C')).toEqual([expect.stringMatching(/^out-of-domain: measured: code 0 is the bottom of the 12-bit converter/)]);
  });

  it('a fractional code', () => {
    expect(diagnose('2225.5 counts at -20 °C')).toEqual([expect.stringMatching(/^out-of-domain: measured: a code is a whole number of counts, 1 to 4094 \(found 2225\.5\)/)]);
  });

  it('a point outside the sensor rated range (before: the fit failed and the nominal model was used without a word)', () => {
    const d = diagnose('2226 counts at -20 °C and 3000 counts at -273 °C');
    expect(d.some((m) => /^out-of-domain: measured: the point at -273 °C lies outside the rated range of 'q'/.test(m))).toBe(true);
  });
});
