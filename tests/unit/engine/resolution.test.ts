// Resolution figures against facts of the trade, and the clip-low check on a synthetic sweep.
import { describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiagnosticSink } from '../../../server/src/diagnostics/diagnostic';
import { checkClip } from '../../../server/src/checks/clip';
import type { ChannelResult } from '../../../server/src/analysis/types';

const SPEC = `# invented parameters
junction q {
  IS = 10 fA
  BF = 200
}
adc a {
  bits = 10
  reference = 1.1 V
}
channel c {
  sensor = q
  adc = a
  bias = current 20 uA
  range = -40 °C .. 125 °C
}
`;

describe('ADC resolution', () => {
  it('10-bit on 1.1 V: about 1.07 mV per count and more than 1 count per kelvin at about -2 mV/K', () => {
    // Common practice, no source: 1.1 V / 1024 = 1.074 mV per LSB; a silicon junction moves about -2 mV/K.
    const a = analyse({ path: '/v/r.tsense', text: SPEC });
    const s = a.channels[0]!.summary;
    expect(s.lsbVolts * 1e3).toBeCloseTo(1.074, 3);
    for (const p of a.channels[0]!.sweep) {
      expect(p.slope * 1e3).toBeGreaterThan(-2.6);
      expect(p.slope * 1e3).toBeLessThan(-1.5);
      expect(p.countsPerKelvin).toBeGreaterThan(1);
    }
  });
});

describe('clip-low', () => {
  it('fires when a sweep point is below 0 V (a sensor behind an offset stage)', () => {
    const a = analyse({ path: '/v/r.tsense', text: SPEC });
    const r = a.channels[0]!;
    const shifted: ChannelResult = { ...r, sweep: r.sweep.map((p) => ({ ...p, volts: p.volts - 0.7 })), summary: { ...r.summary, voltsMin: r.summary.voltsMin - 0.7, voltsMax: r.summary.voltsMax - 0.7 } };
    const sink = new DiagnosticSink();
    checkClip({ channel: r.channel, result: shifted, sink, reported: new Set() });
    expect(sink.items.map((d) => d.code)).toContain('clip-low');
    const quiet = new DiagnosticSink();
    checkClip({ channel: r.channel, result: r, sink: quiet, reported: new Set() });
    expect(quiet.items.map((d) => d.code)).not.toContain('clip-low');
  });
});
