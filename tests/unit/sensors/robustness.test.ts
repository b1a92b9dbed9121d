// Bad or extreme input on the new blocks never throws, hangs or leaves NaN in the results
// (RULES.md 6). Values are drawn at random around and beyond every domain edge.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyseText } from '../../fixtures/sensors/analyse';

const num = fc.oneof(
  fc.constantFrom('0', '-1', '1e-30', '1e30', '3950', '100', '10k', '0.5', '-0.5', '1e308', '7e-323', '1e-300', '1e-9', '1e9'),
  fc.double({ min: -1e6, max: 1e6, noNaN: true, noDefaultInfinity: true }).map((v) => String(v)),
);

describe('resistive sensors: robustness', () => {
  it('random field values give diagnostics or finite figures, never a throw or NaN', () => {
    fc.assert(
      fc.property(num, num, num, num, num, num, fc.constantFrom('above', 'below'), fc.constantFrom(2, 3, 4, 5), fc.boolean(), (r25, beta, sha, shb, shc, gain, pos, wires, ratio) => {
        const text = `thermistor t {\n  r25 = ${r25}\n  beta = ${beta} K\n}\nthermistor s {\n  sh_a = ${sha}\n  sh_b = ${shb}\n  sh_c = ${shc}\n}\nrtd p {\n  r0 = ${r25}\n  cvd_a = ${sha}\n}\nadc a {\n  bits = 12\n  reference = 3.3 V\n}\n` +
          ['t', 's', 'p'].map((n) => `channel c_${n} {\n  sensor = ${n}\n  adc = a\n  bias = divider ${r25} ${pos} from 3.3 V\n  ${ratio ? 'ratiometric = yes' : ''}\n  gain = ${gain}\n  wiring = ${wires} wires 0.5 ohm\n  range = -40 °C .. 120 °C\n  step = 5 K\n}\n`).join('');
        const a = analyseText(text);
        for (const r of a.channels) {
          for (const p of r.sweep) {
            for (const v of [p.volts, p.amps, p.slope, p.selfHeatingK, p.sourceOhms]) expect(Number.isNaN(v)).toBe(false);
          }
        }
        for (const d of a.diagnostics) expect(d.message).not.toMatch(/NaN/);
      }),
      { numRuns: Number(process.env.ROBUST_RUNS ?? 150) },
    );
  });
});
