// The thermocouple kind (issue 12): its channel reads another channel for the cold junction; the
// forward model is the law of intermediate temperatures with the ITS-90 reference functions; the
// budget carries the cold-junction channel's own error. All parts and scenarios are invented.
import { describe, expect, it } from 'vitest';
import { sense } from '../../../server/src/analysis/sense';
import { kelvinAtVolts } from '../../../server/src/analysis/inverse';
import { channelKey } from '../../../server/src/analysis/cache';
import { analyse, DocumentState } from '../../../server/src/engine';
import { definition, references } from '../../../server/src/features/navigation';
import { hover } from '../../../server/src/features/hover';
import { completion } from '../../../server/src/features/completion';
import { quickFixes } from '../../../server/src/features/quickfix';
import { channelJson } from '../../../server/src/report/json';
import { analyseText, channelOf, codesOf } from '../../fixtures/sensors/analyse';

const K = (c: number) => c + 273.15;

const PARTS = `
thermistor board_ntc {
  r25  = 10k ± 1 %
  beta = 3950 ± 1 %
  rated = -40 °C .. 125 °C
}
thermocouple probe_k {
  type  = K
  class = 2
}
adc adc12 {
  bits      = 12
  reference = 2.5 V ± 0.1 %
}
channel board {
  sensor = board_ntc
  adc    = adc12
  bias   = divider 10k ± 0.1 % above from 2.5 V
  ratiometric = yes
  range  = BOARD_RANGE
}
`;

const spec = (channel: string, board = '0 °C .. 70 °C') => PARTS.replace('BOARD_RANGE', board) + channel;

const HOT = `
channel hot {
  sensor        = probe_k
  adc           = adc12
  bias          = current 1 nA
  gain          = 50 ± 0.2 %
  offset        = 0.1 V
  cold_junction = board
  isothermal    = ± 0.3 °C
  input_offset  = ± 20 uV
  offset_drift  = ± 0.2 uV per K
  range         = 100 °C .. 1000 °C
  step          = 10 K
}`;

describe('thermocouple channel model', () => {
  it('senses gain x (E(T) - E(25 °C)) + offset, the cold junction at 25 °C', () => {
    // NIST Monograph 175, type K table (ITS-90, reference junction 0 °C), from memory:
    // E(25 °C) = 1.000 mV, E(500 °C) = 20.644 mV, E(1000 °C) = 41.276 mV (table resolution 1 µV).
    const c = channelOf(spec(HOT), 'hot');
    // 1 nA through the default 10 ohm loop adds 10 nV.
    expect(sense(c, K(500)).volts).toBeCloseTo(50 * (20.644e-3 - 1.0e-3 + 1e-8) + 0.1, 4);
    expect(sense(c, K(1000)).volts).toBeCloseTo(50 * (41.276e-3 - 1.0e-3 + 1e-8) + 0.1, 4);
    // The Seebeck coefficient near 500 °C is about 42.6 µV/K (the table's differences, from memory).
    expect(sense(c, K(500)).slope / 50).toBeCloseTo(42.6e-6, 6);
  });

  it('inverts exactly at the nominal cold junction', () => {
    // Reference: the forward model itself (round trip to 1 µK).
    const c = channelOf(spec(HOT), 'hot');
    for (const t of [100, 333.3, 777, 1000]) expect(kelvinAtVolts(c, sense(c, K(t)).volts)).toBeCloseTo(K(t), 6);
  });

  it('takes the cold junction at 25 °C, or the nearest end of the cold-junction channel range', () => {
    // A rule of ours (types.ts): the sensed voltage changes by -gain x (E(Tcj) - E(25 °C)).
    const at25 = channelOf(spec(HOT), 'hot');
    const at40 = channelOf(spec(HOT, '40 °C .. 70 °C'), 'hot');
    // E(40 °C) = 1.612 mV (NIST Monograph 175 type K table, from memory).
    expect(sense(at25, K(500)).volts - sense(at40, K(500)).volts).toBeCloseTo(50 * (1.612e-3 - 1.0e-3), 4);
  });

  it('reads µV per count at the thermocouple: 1 LSB over the gain', () => {
    // 2.5 V / 4096 / 50 = 12.2 µV per count (ideal code width, IEEE Std 1241-2010, 3.1).
    const a = analyseText(spec(HOT));
    const r = a.channels.find((x) => x.channel.name === 'hot')!;
    const text = hover(a, a.path === undefined ? 0 : spec(HOT).indexOf('channel hot') + 9)!.markdown;
    expect(text).toContain('12.21 µV per count');
    expect(text).toContain('Caution (thermocouple)');
    // °C per count: 12.2 µV / 39 .. 43 µV/K of type K over the range.
    expect(r.summary.worst.celsiusPerCount).toBeGreaterThan(0.25);
    expect(r.summary.worst.celsiusPerCount).toBeLessThan(0.33);
  });
});

describe('the cold junction as another channel', () => {
  const errors = (text: string) => analyseText(text).diagnostics.filter((d) => d.severity === 'error').map((d) => `${d.code}: ${d.message}`);

  it('refuses a channel naming itself', () => {
    expect(errors(spec(HOT.replace('cold_junction = board', 'cold_junction = hot')))).toEqual([
      expect.stringMatching(/^bad-value: cold_junction: channel 'hot' cannot name itself/),
    ]);
  });

  it('refuses two thermocouple channels naming each other, at the one found in the cycle', () => {
    const two = HOT.replace('cold_junction = board', 'cold_junction = hot2') + HOT.replace('channel hot', 'channel hot2').replace('cold_junction = board', 'cold_junction = hot');
    expect(errors(spec(two))).toEqual([expect.stringMatching(/^bad-value: cold_junction: channel 'hot' leads back to 'hot2'.*a cycle/)]);
  });

  it('refuses a thermocouple channel as the cold junction', () => {
    const two = HOT + HOT.replace('channel hot', 'channel hot2').replace('cold_junction = board', 'cold_junction = hot');
    expect(errors(spec(two))).toEqual([expect.stringMatching(/^bad-value: cold_junction: 'hot' is itself a thermocouple channel/)]);
  });

  it('names an unknown channel with a suggestion, and refuses a definition of another kind', () => {
    expect(errors(spec(HOT.replace('cold_junction = board', 'cold_junction = bord')))).toEqual([expect.stringMatching(/^unknown-name: no channel named 'bord' is defined \(did you mean 'board'\?\)/)]);
    expect(errors(spec(HOT.replace('cold_junction = board', 'cold_junction = adc12')))).toEqual([expect.stringMatching(/^wrong-kind: 'adc12' is an adc, but cold_junction needs a channel/)]);
    expect(errors(spec(HOT.replace('  cold_junction = board\n', '')))).toEqual([expect.stringMatching(/^missing-field: channel 'hot' needs 'cold_junction'/)]);
  });

  it('refuses the thermocouple fields on another kind\'s channel, and a divider on a thermocouple', () => {
    const onNtc = spec('').replace('  ratiometric = yes', '  ratiometric = yes\n  cold_junction = board\n  isothermal = ± 1 °C');
    expect(errors(onNtc)).toEqual([
      expect.stringMatching(/^bad-value: cold_junction applies to thermocouple channels/),
      expect.stringMatching(/^bad-value: isothermal applies to thermocouple channels/),
    ]);
    expect(errors(spec(HOT.replace('bias          = current 1 nA', 'bias = divider 10k above from 2.5 V')))).toEqual([expect.stringMatching(/^bad-value: a thermocouple takes no divider/)]);
  });

  it('a channel read before the one naming it, or after, gives the same definition', () => {
    const before = channelOf(spec(HOT), 'hot');
    const text = spec(HOT);
    const boardAt = text.indexOf('channel board');
    const boardEnd = text.indexOf('}', boardAt) + 1;
    const after = channelOf(text.slice(0, boardAt) + text.slice(boardEnd) + '\n' + text.slice(boardAt, boardEnd), 'hot');
    expect(channelKey(after)).toBe(channelKey(before));
  });

  it('carries the cold-junction channel in its content: the key and the kept results follow it', () => {
    const state = new DocumentState();
    const host = { read: () => null, realPath: (p: string) => p } as never;
    const first = analyse({ path: '/v/a.tsense', text: spec(HOT), state, host });
    const hot1 = first.channels.find((r) => r.channel.name === 'hot')!;
    // Only the cold-junction channel's text changes: the thermocouple channel must be read again.
    const second = analyse({ path: '/v/a.tsense', text: spec(HOT, '40 °C .. 70 °C'), state, host });
    const hot2 = second.channels.find((r) => r.channel.name === 'hot')!;
    expect(channelKey(hot2.channel)).not.toBe(channelKey(hot1.channel));
    expect(hot2.channel.linked!['cold_junction']!.lowK).toBeCloseTo(K(40), 9);
    expect(hot2.summary.voltsMin).not.toBeCloseTo(hot1.summary.voltsMin, 6);
    // The same text again keeps the same definition.
    const third = analyse({ path: '/v/a.tsense', text: spec(HOT, '40 °C .. 70 °C'), state, host });
    expect(channelKey(third.channels.find((r) => r.channel.name === 'hot')!.channel)).toBe(channelKey(hot2.channel));
  });

  it('navigates from cold_junction to the channel it names, and finds it among the references', () => {
    const text = spec(HOT);
    const a = analyseText(text);
    const use = text.indexOf('cold_junction = board') + 'cold_junction = '.length;
    const def = text.indexOf('channel board') + 'channel '.length;
    expect(definition(a, use)).toEqual({ file: '/virtual/sensors.tsense', span: { start: def, end: def + 5 } });
    expect(references(a, use, true).map((r) => r.span.start).sort((x, y) => x - y)).toEqual([def, use]);
  });

  it('offers the did-you-mean fix on a misspelt cold-junction channel', () => {
    const text = spec(HOT.replace('cold_junction = board', 'cold_junction = bord'));
    const a = analyseText(text);
    const fixes = quickFixes({ analysis: a, range: { start: 0, end: text.length }, reanalyse: (o) => analyse({ path: a.path, text: o.get(a.path) ?? text }) });
    expect(fixes.map((f) => f.title)).toContain("Change 'bord' to 'board'");
  });

  it('offers the thermocouple fields and the channels for cold_junction in completion', () => {
    const text = spec(HOT).replace('  cold_junction = board\n', '  cold_junction = \n');
    const a = analyseText(text);
    const at = text.indexOf('cold_junction = ') + 'cold_junction = '.length;
    expect(completion(a, at).map((i) => i.label)).toContain('board');
  });
});

describe('thermocouple error budget', () => {
  it('carries the cold-junction channel\'s own worst case, and shows its share', () => {
    const a = analyseText(spec(HOT));
    const board = a.channels.find((r) => r.channel.name === 'board')!.worstCaseBudget!;
    const hot = a.channels.find((r) => r.channel.name === 'hot')!;
    const b = hot.worstCaseBudget!;
    const cj = b.contributors.find((k) => k.id === 'tc-cold-junction')!;
    expect(cj.amount).toBeCloseTo(board.stated.worstAbsK, 9);
    expect(cj.unit).toBe('K');
    expect(b.contributors.map((k) => k.id)).toEqual(expect.arrayContaining(['element-class', 'tc-input-offset', 'tc-offset-drift', 'tc-isothermal', 'amp-gain']));
    const none = b.modes.find((m) => m.setting.mode === 'none')!;
    const share = none.shares.find((s) => s.id === 'tc-cold-junction')!;
    // A cold-junction error of e K reads as e x S(T_cj)/S(T_hot) K at the hot junction (the law of
    // intermediate temperatures): at most about e here (S rises little from 25 °C to 1000 °C for type K).
    expect(share.maxSwingK).toBeGreaterThan(0.8 * cj.amount);
    expect(share.maxSwingK).toBeLessThan(1.1 * cj.amount);
    // IEC 60584-1 class 2 type K: ±2.5 °C or ±0.0075 |t| (from memory), ±7.5 K at 1000 °C.
    const cls = none.shares.find((s) => s.id === 'element-class')!;
    expect(cls.maxSwingK).toBeCloseTo(7.5, 1);
    // The Monte Carlo shows the cold junction's variance share.
    const mc = hot.budget!.modes.find((m) => m.setting.mode === 'none')!;
    expect(mc.shares.find((s) => s.id === 'tc-cold-junction')!.varianceShare).toBeGreaterThan(0);
  });

  it('reports its inputs and cautions in JSON, and the thermocouple summary in completion of sensor', () => {
    const a = analyseText(spec(HOT));
    const j = channelJson(a.channels.find((r) => r.channel.name === 'hot')!) as unknown as { inputs: { thermocouple: Record<string, unknown> } };
    expect(j.inputs.thermocouple).toMatchObject({ type: 'K', toleranceClass: 2, coldJunctionChannel: 'board', nominalColdJunctionK: K(25), gain: 50, gainTolerance: 0.002 });
    // 2.5 V / 4096 / 50 (ideal code width, IEEE Std 1241-2010, 3.1).
    expect(j.inputs.thermocouple['inputVoltsPerCount']).toBeCloseTo(2.5 / 4096 / 50, 12);
    expect(codesOf(a).filter((c) => c.startsWith('tc-'))).toEqual([]);
  });
});

describe('thermocouple block, cautions and code generation', () => {
  it('refuses a range beyond the type\'s reference function (type K: -270 °C .. 1372 °C, NIST Monograph 175)', () => {
    const a = analyseText(spec(HOT.replace('range         = 100 °C .. 1000 °C', 'range         = 100 °C .. 1400 °C')));
    expect(a.diagnostics.filter((d) => d.severity === 'error').map((d) => `${d.code}: ${d.message}`)).toEqual([
      expect.stringMatching(/^out-of-domain: the range leaves the type K reference function of 'probe_k', -270 °C .. 1372 °C/),
    ]);
  });

  it('refuses a class the type does not have (IEC 60584-1 gives type B classes 2 and 3 only, from memory)', () => {
    const a = analyseText('thermocouple b {\n  type = B\n  class = 1\n}\n');
    expect(a.diagnostics.map((d) => `${d.code}: ${d.message}`)).toEqual(['out-of-domain: class: IEC 60584-1 gives type B classes 2 and 3 only (found 1)']);
  });

  it('puts the kind\'s cautions (mains isolation, independent cut-out) under reports of its channels only', async () => {
    const { cautionFor, CAUTION } = await import('../../../server/src/engine');
    const a = analyseText(spec(HOT));
    const text = cautionFor(a.channels.map((r) => r.channel));
    expect(text.startsWith(CAUTION)).toBe(true);
    expect(text).toMatch(/isolate the measuring circuit from mains/);
    expect(text).toMatch(/independent over-temperature cut-out/);
    expect(cautionFor(a.channels.filter((r) => r.channel.name === 'board').map((r) => r.channel))).toBe(CAUTION);
  });

  it('is generated with its cold-junction channel (the kind gives the generator its second input)', async () => {
    const { generatableResults, tooWideMessage } = await import('../../../server/src/codegen/channel-input');
    const a = analyseText(spec(HOT));
    expect(generatableResults(a.channels, a.diagnostics).map((r) => r.channel.name)).toEqual(['board', 'hot']);
    expect(tooWideMessage(a.channels.find((r) => r.channel.name === 'hot')!.channel)).toBeNull();
  });

  it("writes the kind's cautions into its generated block's comment, and only into its own", async () => {
    const { generatorInput } = await import('../../../server/src/codegen/channel-input');
    const { generateC } = await import('../../../server/src/codegen/generate');
    const a = analyseText(spec(HOT));
    const order = ['board', 'hot'].map((n) => a.channels.find((r) => r.channel.name === n)!);
    const out = generateC(order.map((r) => generatorInput(r, 'hot.tsense')), { fileStem: 'hot_conversion' });
    const [board, hot] = out.channels.map((ch) => ch.code);
    expect(hot).toMatch(/Caution \(thermocouple\): a thermocouple in a furnace, kiln or heater may touch live heating\n \* elements/);
    expect(hot).toMatch(/independent over-temperature cut-out/);
    expect(board).not.toMatch(/Caution \(thermocouple\)/);
  });
});
