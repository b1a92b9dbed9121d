import { describe, expect, it } from 'vitest';
import { sense } from '../../../server/src/analysis/sense';
import { kelvinAtVolts, resistiveKelvinAtVolts } from '../../../server/src/analysis/inverse';
import { analyseText, channelOf, codesOf, PARTS } from '../../fixtures/sensors/analyse';

const K = (c: number) => c + 273.15;
const R_NTC = (c: number) => 10000 * Math.exp(3950 * (1 / K(c) - 1 / K(25))); // beta model, datasheet form

const ntcChannel = (bias: string, extra = '', adc = 'adc12') => `${PARTS}
channel ch {
  sensor = bead10k
  adc    = ${adc}
  bias   = ${bias}
  range  = -20 °C .. 80 °C
  ${extra}
}`;

describe('thermistor divider channel', () => {
  it('divider with the resistor above: V = Vs Rt/(Rf + Rt)', () => {
    // Reference: the unloaded voltage divider (Ohm's law) with the beta model R(T).
    const c = channelOf(ntcChannel('divider 10k above from 3.3 V'), 'ch');
    for (const t of [-20, 0, 25, 60, 80]) {
      const rt = R_NTC(t);
      expect(sense(c, K(t)).volts).toBeCloseTo((3.3 * rt) / (10000 + rt), 12);
      expect(sense(c, K(t)).powerW).toBeCloseTo((3.3 / (10000 + rt)) ** 2 * rt, 15);
      expect(sense(c, K(t)).sourceOhms).toBeCloseTo((10000 * rt) / (10000 + rt), 8);
    }
  });

  it('divider with the resistor below: V = Vs Rf/(Rf + Rt), rising with temperature', () => {
    // Reference: the unloaded voltage divider (Ohm's law).
    const c = channelOf(ntcChannel('divider 10k below from 3.3 V'), 'ch');
    for (const t of [-20, 25, 80]) expect(sense(c, K(t)).volts).toBeCloseTo((3.3 * 10000) / (10000 + R_NTC(t)), 12);
    expect(sense(c, K(30)).slope).toBeGreaterThan(0);
  });

  it('ratiometric reading does not depend on the supply', () => {
    // Reference: code = V/Vref 2^n = Rt/(Rf + Rt) 2^n when Vref is the divider supply (algebra).
    const codes = (vs: string) => {
      const text = ntcChannel(`divider 10k above from ${vs}`, 'ratiometric = yes', 'rail_adc').replace('adc adc12 {', `adc rail_adc {\n  bits = 12\n  reference = ${vs}\n}\nadc adc12 {`);
      const a = analyseText(text);
      expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
      return a.channels[0]!.sweep.map((p) => p.code);
    };
    const at33 = codes('3.3 V');
    expect(codes('5 V')).toEqual(at33);
    expect(codes('1.8 V')).toEqual(at33);
    // An absolute reference does depend on the supply.
    const abs = (vs: string) => analyseText(ntcChannel(`divider 10k above from ${vs}`)).channels[0]!.sweep.map((p) => p.code);
    expect(abs('3.0 V')).not.toEqual(abs('3.3 V'));
  });

  it('the model inverse is exact (closed form equals the bracketed search)', () => {
    // Reference: kelvinAtVolts' search on sense() (Illinois regula falsi) vs the closed-form inverse.
    const c = channelOf(ntcChannel('divider 10k above from 3.3 V'), 'ch');
    for (const t of [-19.5, 0, 25, 79.5]) {
      const v = sense(c, K(t)).volts;
      expect(resistiveKelvinAtVolts(c, v)).toBeCloseTo(K(t), 9);
      expect(kelvinAtVolts(c, v)).toBeCloseTo(K(t), 9);
    }
  });
});

describe('RTD channel', () => {
  const rtd = (extra: string, bias = 'current 1 mA') => `${PARTS}
channel p {
  sensor = pt100
  adc    = adc12
  bias   = ${bias}
  range  = -100 °C .. 200 °C
  ${extra}
}`;

  it('current excitation, 2-wire leads and an amplifier: V = g I (R + 2 RL) + offset', () => {
    // Reference: Ohm's law with the IEC 60751 table value at 100 °C (138.5055 Ω, IEC 60751:2008 / CVD).
    const c = channelOf(rtd('wiring = 2 wires 0.5 ohm\n  gain = 10\n  offset = -0.5 V'), 'p');
    expect(sense(c, K(100)).volts).toBeCloseTo(10 * 1e-3 * (138.5055 + 1) - 0.5, 6);
    expect(sense(c, K(100)).sourceOhms).toBe(0); // amplifier output taken as a stiff source
    // Three wires: the lead resistances cancel (IEC 60751 three-wire connection, matched leads).
    const c3 = channelOf(rtd('wiring = 3 wires 0.5 ohm'), 'p');
    expect(sense(c3, K(-100)).volts).toBeCloseTo(1e-3 * 60.2558, 7); // IEC 60751:2008 table / CVD
  });

  it('inverse below 0 °C through the whole chain is exact', () => {
    // Reference: the forward chain (CVD equation of IEC 60751 and Ohm's law).
    const c = channelOf(rtd('wiring = 2 wires 0.5 ohm\n  gain = 10\n  offset = -0.5 V'), 'p');
    for (const t of [-100, -55.5, -0.25, 0, 0.25, 150, 200]) expect(resistiveKelvinAtVolts(c, sense(c, K(t)).volts)).toBeCloseTo(K(t), 9);
  });
});

describe('resolver messages for the new blocks', () => {
  it('reports bad input with precise ranges and never throws', () => {
    const cases: [string, string][] = [
      ['thermistor t {\n  r25 = 10k\n}', 'missing-field'],
      ['thermistor t {\n  r25 = 10k\n  beta = 50 K\n}', 'out-of-domain'],
      ['thermistor t {\n  r25 = 10k\n  beta = 3950\n  sh_a = 1e-3\n}', 'bad-value'],
      ['thermistor t {\n  point_1 = 0 °C 1k\n  point_2 = 25 °C 10k\n  point_3 = 50 °C 5k\n}', 'out-of-domain'],
      ['thermistor t {\n  r25 = 10k\n  beta = 3950\n  dissipation = 3 V\n}', 'bad-value'],
      ['rtd r {\n  cvd_a = 3.9e-3\n}', 'missing-field'],
      ['rtd r {\n  r0 = 100\n  class = D\n}', 'bad-value'],
    ];
    for (const [text, code] of cases) expect(codesOf(analyseText(text))).toContain(code);
    const chan = (body: string) => codesOf(analyseText(`${PARTS}\nchannel c {\n  sensor = pt100\n  adc = adc12\n  range = 0 °C .. 100 °C\n  ${body}\n}`));
    expect(chan('bias = divider 1k sideways from 3.3 V')).toContain('bad-value');
    expect(chan('bias = resistor 1k from 3.3 V')).toContain('bad-value');
    expect(chan('bias = current 1 mA\n  wiring = 5 wires 1 ohm')).toContain('out-of-domain');
    expect(chan('bias = current 1 mA\n  ratiometric = yes')).toContain('bad-value');
    expect(chan('bias = divider 1k above from 5 V\n  ratiometric = yes')).toContain('out-of-domain');
    expect(chan('bias = current 1 mA\n  gain = -3')).toContain('out-of-domain');
  });

  it('fits the Steinhart-Hart coefficients from three points given in the spec', () => {
    // Reference: the three spec points themselves (exact fit, Steinhart & Hart 1968).
    const text = `thermistor m {\n  point_1 = 0 °C 32.65k\n  point_2 = 25 °C 10k\n  point_3 = 70 °C 1.752k\n  r_tolerance = ± 1 %\n}\n${PARTS}\nchannel c {\n  sensor = m\n  adc = adc12\n  bias = divider 10k above from 3.3 V\n  range = 0 °C .. 70 °C\n}`;
    const c = channelOf(text, 'c');
    for (const [t, r] of [[0, 32650], [25, 10000], [70, 1752]] as const) {
      expect(sense(c, K(t)).volts).toBeCloseTo((3.3 * r) / (10000 + r), 10);
    }
  });
});
