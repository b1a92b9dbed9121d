// The junction channel's checks where they apply to resistive sensors, plus the two new codes'
// arithmetic. Fixture files for the new codes live in tests/fixtures/diagnostics/.
import { describe, expect, it } from 'vitest';
import { analyseText, codesOf, PARTS } from '../../fixtures/sensors/analyse';
import { dividerSlopeShare } from '../../../server/src/sensors/thermistor/divider-optimum';

const chan = (body: string, adc = 'adc12') => analyseText(`${PARTS}
adc fussy {
  bits       = 12
  reference  = 3.3 V
  max_source = 1 kohm
}
channel c {
  adc = ${adc}
  ${body}
}`);

describe('checks on thermistor and RTD channels', () => {
  it('clip-low fires when an amplifier offset drives the RTD reading below 0 V', () => {
    // 1 mA x 80.3 ohm (Pt100 at -50 °C, IEC 60751 CVD) x 2 - 0.5 V = -0.34 V: below 0 V.
    const a = chan('sensor = pt100\n  bias = current 1 mA\n  gain = 2\n  offset = -0.5 V\n  range = -50 °C .. 100 °C');
    expect(codesOf(a)).toContain('clip-low');
    expect(codesOf(chan('sensor = pt100\n  bias = current 1 mA\n  gain = 2\n  offset = -0.1 V\n  range = -50 °C .. 100 °C'))).not.toContain('clip-low');
  });

  it('self-heating uses the dissipation constant: rise = P / delta', () => {
    // 10k/10k divider from 3.3 V at 25 °C: I = 165 µA, P = I^2 R = 0.272 mW; / 1.5 mW/K = 0.1815 K.
    const a = chan('sensor = bead10k\n  bias = divider 10k above from 3.3 V\n  range = 25 °C .. 26 °C\n  accuracy = ± 0.5 °C');
    expect(a.channels[0]!.sweep[0]!.selfHeatingK).toBeCloseTo((3.3 / 20000) ** 2 * 10000 / 1.5e-3, 9);
    expect(codesOf(a)).toContain('self-heating');
  });

  it('source impedance is the divider node: R_fixed parallel R_ntc', () => {
    // Thevenin equivalent of the divider (Ohm's law): 10k || 10k = 5k at 25 °C > 1k allowed.
    const a = chan('sensor = bead10k\n  bias = divider 10k above from 3.3 V\n  range = 25 °C .. 26 °C', 'fussy');
    expect(a.channels[0]!.sweep[0]!.sourceOhms).toBeCloseTo(5000, 6);
    expect(codesOf(a)).toContain('source-impedance');
  });

  it('the junction-only checks stay quiet for resistive sensors', () => {
    // 1 mA would be above the junction current window; it is an ordinary RTD excitation.
    const a = chan('sensor = pt100\n  bias = current 1 mA\n  range = 0 °C .. 100 °C');
    expect(codesOf(a)).not.toContain('bias-current-high');
    expect(codesOf(a)).not.toContain('supply-too-low');
  });

  it('divider slope share is 4k/(1+k)^2, 1 at the optimum', () => {
    // Algebra on dV/dT = Vs Rf/(Rf + Rt)^2 dRt/dT (see divider-optimum.ts).
    expect(dividerSlopeShare(10000, 10000)).toBe(1);
    expect(dividerSlopeShare(47000, 2486)).toBeCloseTo((4 * 47000 / 2486) / (1 + 47000 / 2486) ** 2, 12);
    expect(dividerSlopeShare(2, 1)).toBeCloseTo(8 / 9, 12);
  });
});
