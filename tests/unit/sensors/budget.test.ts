// The error budget counts a resistive element's own spread (R25 and beta; R0 and the IEC 60751 class).
import { describe, expect, it } from 'vitest';
import { analyseText, PARTS } from '../../fixtures/sensors/analyse';

describe('error budget of resistive channels', () => {
  it('lists the element spreads and their size follows the sensor equations', () => {
    const a = analyseText(`${PARTS}
channel n {
  sensor = bead10k
  adc = adc12
  bias = divider 10k above from 3.3 V
  ratiometric = yes
  range = 24 °C .. 26 °C
  step = 0.5 K
}
channel p {
  sensor = pt100
  adc = adc12
  bias = current 1 mA
  gain = 10
  range = 99 °C .. 101 °C
  step = 0.5 K
}`);
    const [n, p] = a.channels;
    const bn = n!.worstCaseBudget!;
    expect(bn.contributors.map((c) => c.id)).toEqual(expect.arrayContaining(['element-R', 'element-beta']));
    // Near 25 °C beta does not matter (the beta model is exact at 25 °C) and 1 % of R reads as
    // 0.01 / (beta / T^2) = 0.01 / (3950 / 298.15^2) = 0.225 K (derivative of the beta model).
    const none = bn.modes.find((m) => m.setting.mode === 'none')!;
    expect(none.worstAbsK).toBeGreaterThan(0.2);
    expect(none.worstAbsK).toBeLessThan(0.26); // plus half an LSB of quantisation
    const bp = p!.worstCaseBudget!;
    expect(bp.contributors.map((c) => c.id)).toEqual(expect.arrayContaining(['element-R0', 'element-slope']));
    // IEC 60751:2008 class A at 100 °C: ±(0.15 + 0.002 x 100) = ±0.35 °C (class formula, from memory).
    // Read as an R0 spread (0.15 K at 0 °C, i.e. 0.15 x A relative, which at 100 °C is
    // 0.15 x A x R(100)/R0 / (dR/dt / R0) = 0.214 K by the CVD equation) plus a slope spread (0.2 K),
    // plus half an LSB (0.5 x 3.3 V / 4096 / (10 x 1 mA x 0.3790 ohm/K) = 0.106 K): 0.52 K.
    const pn = bp.modes.find((m) => m.setting.mode === 'none')!;
    expect(pn.worstAbsK).toBeGreaterThan(0.35);
    expect(pn.worstAbsK).toBeCloseTo(0.214 + 0.2 + 0.106, 1);
  });
});
