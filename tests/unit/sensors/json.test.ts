// The JSON report names the sensor kind and carries the resistive inputs in base SI units.
import { describe, expect, it } from 'vitest';
import { channelJson } from '../../../server/src/report/json';
import { analyseText, PARTS } from '../../fixtures/sensors/analyse';

describe('JSON report of resistive channels', () => {
  it('has sensorKind and the element, bias, wiring and amplifier inputs', () => {
    const a = analyseText(`${PARTS}
channel n {
  sensor = bead10k
  adc = adc12
  bias = divider 10k ± 0.1 % below from 3.3 V
  ratiometric = yes
  range = 0 °C .. 50 °C
}
channel p {
  sensor = pt100
  adc = adc12
  bias = current 1 mA
  gain = 10
  offset = -0.5 V
  wiring = 3 wires 0.5 ohm
  range = 0 °C .. 100 °C
}`);
    const [n, p] = a.channels.map((r) => channelJson(r) as unknown as Record<string, any>);
    expect(n!.sensorKind).toBe('thermistor');
    expect(n!.inputs.bias).toMatchObject({ kind: 'divider', position: 'below', ohms: 10000, ohmsTolerance: 0.001 });
    expect(n!.inputs.element).toMatchObject({ form: 'beta', r25Ohms: 10000, r25Tolerance: 0.01, betaK: 3950, betaTolerance: 0.01 });
    expect(n!.inputs.ratiometric).toBe(true);
    expect(p!.sensorKind).toBe('rtd');
    // IEC 60751:2008 coefficients by default (clause 4.2).
    expect(p!.inputs.sensor).toMatchObject({ kind: 'platinum', R0: 100, A: 3.9083e-3, B: -5.775e-7, C: -4.183e-12 });
    expect(p!.inputs.element).toMatchObject({ r0Ohms: 100, toleranceClass: 'A' });
    expect(p!.inputs.amplifier).toEqual({ gain: 10, offsetVolts: -0.5 });
    expect(p!.inputs.wiring).toEqual({ wires: 3, leadOhms: 0.5 });
    expect(JSON.stringify([n, p])).not.toMatch(/NaN|null,"sweep"/);
    // The junction's current range is the junction's input alone.
    expect(n!.inputs).not.toHaveProperty('currentWindow');
    expect(p!.inputs).not.toHaveProperty('currentWindow');
  });
});

describe('the junction\'s current_window (invented parts)', () => {
  const JUNCTION = `${PARTS}
junction q {
  IS = 10 fA
}
channel j {
  sensor = q
  adc = adc12
  bias = current 20 uA
  current_window = 5 uA .. 500 uA
  range = 0 °C .. 50 °C
}`;

  it('is reported as an input of a junction channel', () => {
    const j = channelJson(analyseText(JUNCTION).channels[0]!) as unknown as Record<string, any>;
    expect(j.inputs.currentWindow).toEqual({ lowA: 5e-6, highA: 5e-4 });
  });

  it('is refused on another kind\'s channel, naming the kind that takes it', () => {
    const a = analyseText(`${PARTS}
channel n {
  sensor = bead10k
  adc = adc12
  bias = divider 10k above from 3.3 V
  current_window = 5 uA .. 500 uA
  range = 0 °C .. 50 °C
}`);
    expect(a.diagnostics.map((d) => `${d.code}: ${d.message}`)).toEqual([expect.stringMatching(/^bad-value: current_window applies to junction channels; 'bead10k' is a thermistor/)]);
    expect(a.channels).toHaveLength(0);
  });
});
