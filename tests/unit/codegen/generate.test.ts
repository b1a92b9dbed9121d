import { describe, expect, it } from 'vitest';
import { CodegenInputError, findGeneratedBlocks, generateC, spliceGenerated } from '../../../server/src/codegen';
import { rtdChannel, syntheticDiodeChannel } from '../../fixtures/codegen/channels';

describe('generateC (pure)', () => {
  it('is deterministic: same input, same bytes', () => {
    const a = generateC([syntheticDiodeChannel(), rtdChannel()], { fileStem: 'conv' });
    const b = generateC([syntheticDiodeChannel(), rtdChannel()], { fileStem: 'conv' });
    expect(a.text).toBe(b.text);
    expect(a.channels).toEqual(b.channels);
  });

  it('wraps each channel in markers carrying its name and spec hash; splicing is a no-op', () => {
    const inputs = [syntheticDiodeChannel({ specHash: 'f00d' }), rtdChannel({ specHash: 'beef' })];
    const g = generateC(inputs, { fileStem: 'conv' });
    const found = findGeneratedBlocks(g.text);
    expect(found.map((f) => [f.channel, f.hash])).toEqual([[inputs[0]!.channelName, 'f00d'], ['rtd-oven', 'beef']]);
    const again = spliceGenerated(
      g.text,
      inputs.map((c, i) => ({ channel: c.channelName, hash: c.specHash, text: g.channels[i]!.code })),
    );
    expect(again).toEqual({ ok: true, text: g.text });
  });

  it('carries the safety caution and no float or libm in the integer build', () => {
    const g = generateC([syntheticDiodeChannel()], { fileStem: 'conv' });
    expect(g.text).toMatch(/CAUTION/);
    expect(g.text).toMatch(/calibrated reference thermometer/);
    expect(g.text).not.toMatch(/\bfloat\b|\bdouble\b|math\.h/);
  });

  it('meets the error target in its own exact simulation, and auto picks the fewest bytes', () => {
    const auto = generateC([rtdChannel()], { fileStem: 'c' }).channels[0]!;
    const table = generateC([rtdChannel({ method: 'table' })], { fileStem: 'c' }).channels[0]!;
    const poly = generateC([rtdChannel({ method: 'polynomial' })], { fileStem: 'c' }).channels[0]!;
    for (const ch of [auto, table, poly]) expect(ch.maxErrorC).toBeLessThanOrEqual(0.1);
    expect(auto.bytesEstimate).toBe(Math.min(table.bytesEstimate, poly.bytesEstimate));
    expect(table.method).toBe('table');
    expect(poly.method).toBe('polynomial');
  });

  it('sanitises notes and names so nothing escapes a comment', () => {
    const g = generateC([syntheticDiodeChannel({ channelName: 'x */ int evil; /*', note: 'a */ b ??/\nc\u0000d \u00fc' })], { fileStem: 'st */em' });
    // Every "*/" in the output closes a comment that the generator opened: strip comments and
    // check that no text from the name or note survives outside them.
    const code = g.text.replace(/\/\*[\s\S]*?\*\//g, '');
    expect(code).not.toMatch(/int evil;|\?\?|\bb\b|\bc\b/);
  });

  const bad: [string, Parameters<typeof syntheticDiodeChannel>[0], RegExp][] = [
    ['bits', { bits: 17 }, /bits: must be an integer 1\.\.16, got 17/],
    ['codeHigh', { codeHigh: 5000 }, /ADC code range: must be an integer \d+\.\.1023/],
    ['codeLow', { codeLow: -1 }, /ADC code range: must be an integer 0\.\.1023/],
    ['outputScale', { outputScale: 0.5 }, /output: must be an integer 1\.\.10000/],
    ['errorTarget', { errorTarget: 0.001 }, /below half an output unit/],
    ['NaN model', { celsiusAtCode: () => NaN }, /maps to no temperature the sensor gives/],
    ['non-monotonic model', { celsiusAtCode: (c: number) => Math.sin(c / 10) }, /not monotonic/],
    ['throwing model', { celsiusAtCode: () => { throw new Error('boom'); } }, /threw at code \d+: boom/],
    ['gain', { calibration: { mode: 'two-point', gain: 3, runtime: false } }, /calibration: must be in 0\.5\.\.1\.4999, got 3/],
    ['unreachable target', { errorTarget: 0.006, method: 'polynomial' }, /cannot be met/],
  ];
  for (const [what, over, msg] of bad) {
    it(`rejects bad ${what} with a precise message`, () => {
      let err: unknown;
      try {
        generateC([syntheticDiodeChannel(over)], { fileStem: 'c' });
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(CodegenInputError);
      expect((err as Error).message).toMatch(msg);
    });
  }

  it('rejects duplicate channel names', () => {
    expect(() => generateC([syntheticDiodeChannel(), syntheticDiodeChannel()], { fileStem: 'c' })).toThrow(/two channels have this name/);
  });
});
