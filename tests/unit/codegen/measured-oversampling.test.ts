// Generated conversion code for channels with measured calibration points and with oversampling,
// compiled with the host gcc and run over every code. Outside references: the measured points
// themselves (code read at a known temperature: the conversion must give that temperature back);
// the junction model (SPICE diode/BJT temperature laws, checked against published equations in the
// physics tests) inverted here by plain bisection, not by the engine's inverse; and the decimation
// rule of Atmel application note AVR121 (4^n readings summed, shifted right by n).
// Channels and parts are invented.
import * as path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { analyse } from '../../../server/src/engine';
import { DiskHost } from '../../../server/src/cli/io';
import { sense } from '../../../server/src/analysis/sense';
import { fitMeasured } from '../../../server/src/calibration/fit';
import { channelSpecHash, conversionInput, generatableResults } from '../../../server/src/codegen/channel-input';
import { generateC } from '../../../server/src/codegen';
import { planChannels } from '../../../server/src/codegen/generate';
import { generateForChannel } from '../../../server/src/features/generate-code';
import type { ChannelDef } from '../../../server/src/model/types';
import type { ConversionInput } from '../../../server/src/codegen/types';
import { WorkDir, hasTool, hostBuildRun } from '../../fixtures/codegen/toolchain';

const haveGcc = hasTool('gcc');
if (!haveGcc) console.log('measured-oversampling: gcc not found, the compiled checks are skipped');

const ROOT = path.resolve(__dirname, '../../fixtures/budget');
const FILE = path.join(ROOT, 'codegen-invented.tsense');

function spec(body: string): string {
  return `# Invented channel for the code generator tests.\nuse "parts.tsense"\nchannel c {\n${body}\n}\n`;
}

function analysed(text: string) {
  const host = new DiskHost();
  const a = analyse({ path: FILE, text, root: ROOT, host });
  const errors = a.diagnostics.filter((d) => d.severity === 'error');
  expect(errors.map((d) => d.message)).toEqual([]);
  const r = generatableResults(a.channels, a.diagnostics).find((x) => x.channel.name === 'c');
  expect(r).toBeDefined();
  return { a, r: r! };
}

/** Temperature (K) at which the model senses `volts`, by bisection on sense() (independent of analysis/inverse.ts). */
function bisectKelvin(c: ChannelDef, volts: number): number {
  let lo = c.lowK - 60;
  let hi = c.highK + 60;
  const f = (k: number) => sense(c, k).volts - volts;
  const rising = f(hi) > f(lo);
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (f(mid) > 0 === rising) hi = mid;
    else lo = mid;
  }
  return (lo + hi) / 2;
}

/** Runs the generated C over every code 0 .. 2^bits - 1 of each channel: value per code (index = channel). */
function compileAndRun(dir: WorkDir, inputs: ConversionInput[]): number[][] {
  const src = generateC(inputs, { fileStem: 'conv' });
  const hdr = generateC(inputs, { fileStem: 'conv', header: true });
  const { plans } = planChannels(inputs);
  let main = '#include <stdio.h>\n#include <stdint.h>\n#include "conv.h"\nint main(void)\n{\n    unsigned long c;\n';
  plans.forEach((p, i) => {
    main += `    for (c = 0; c < ${2 ** p.bits}ul; c++) {\n        ${p.ident}_temp_t v;\n        (void)${p.ident}_code_to_temp((uint16_t)c, &v);\n        printf("${i} %lu %ld\\n", c, (long)v);\n    }\n`;
  });
  main += '    return 0;\n}\n';
  dir.write('conv.c', src.text);
  dir.write('conv.h', hdr.text);
  dir.write('main.c', main);
  const out: number[][] = inputs.map(() => []);
  for (const line of hostBuildRun(dir, ['main.c', 'conv.c'], 'conv').trim().split('\n')) {
    const [i, code, v] = line.split(' ').map(Number);
    out[i!]![code!] = v!;
  }
  return out;
}

const dirs: WorkDir[] = [];
afterAll(() => dirs.forEach((d) => d.dispose()));

describe('measured calibration points in the generated code', () => {
  // Two measured points: IS and N are fitted through both (calibration/fit.ts), so the fitted model
  // passes through them and the conversion must read them back. Codes invented near the nominal model.
  const body = (codes: [number, number]) =>
    `  sensor = q1\n  adc = quiet\n  bias = current 20 uA\n  range = -30 °C .. 10 °C\n  measured = ${codes[0]} counts at -20 °C and ${codes[1]} counts at 5 °C`;
  const points: [number, number][] = [
    [2231, -20],
    [2052, 5],
  ];

  it('converts with the fitted model: exact inverse of the fitted channel, not of the nominal one', () => {
    const { r } = analysed(spec(body([points[0]![0], points[1]![0]])));
    const fit = fitMeasured(r.channel)!;
    expect(fit).not.toBeNull();
    const input = conversionInput(r, FILE);
    const lsb = r.channel.adc.reference.value / 2 ** r.channel.adc.bits;
    for (let code = input.codeLow; code <= input.codeHigh; code += 37) {
      // The fitted model senses the code's centre voltage at the temperature the conversion reports.
      const k = input.celsiusAtCode(code) + 273.15;
      expect(Math.abs(sense(fit.channel, k).volts - (code + 0.5) * lsb)).toBeLessThan(1e-9);
      expect(Math.abs(input.celsiusAtCode(code) + 273.15 - bisectKelvin(fit.channel, (code + 0.5) * lsb))).toBeLessThan(1e-6);
    }
    // The nominal model misses the measured points by more than the target: the fit matters here.
    const nominalMiss = Math.max(...points.map(([code, t]) => Math.abs(bisectKelvin(r.channel, (code + 0.5) * lsb) - 273.15 - t)));
    expect(nominalMiss).toBeGreaterThan(input.errorTarget);
    expect(input.note).toMatch(/fitted to the 2 measured point/);
  });

  it.skipIf(!haveGcc)('compiled with gcc, reads each measured code back as its temperature within the error target', () => {
    const { r } = analysed(spec(body([points[0]![0], points[1]![0]])));
    const input = conversionInput(r, FILE);
    const dir = new WorkDir();
    dirs.push(dir);
    const [values] = compileAndRun(dir, [input]);
    for (const [code, t] of points) {
      // Reference: the measured point itself (invented board reading at a known temperature).
      const got = values![code]! / input.outputScale;
      console.log(`measured point ${code} counts at ${t} °C: generated code reads ${got.toFixed(3)} °C (target ± ${input.errorTarget})`);
      expect(Math.abs(got - t)).toBeLessThanOrEqual(input.errorTarget);
    }
  });

  it('changes the block hash when a measured point changes (the stale check then fires)', () => {
    const h0 = channelSpecHash(analysed(spec(body([2231, 2052]))).r.channel);
    const h1 = channelSpecHash(analysed(spec(body([2232, 2052]))).r.channel);
    const h2 = channelSpecHash(analysed(spec(body([2231, 2052]).replace('at 5 °C', 'at 6 °C'))).r.channel);
    expect(new Set([h0, h1, h2]).size).toBe(3);
  });
});

describe('oversampling in the generated code', () => {
  const text = spec('  sensor = q1\n  adc = a12\n  bias = current 20 uA\n  range = 0 °C .. 50 °C\n  oversampling = 2 bits');
  const n = 2;

  it('converts a decimated value of bits + n bits over the scaled code range', () => {
    const { r } = analysed(text);
    const input = conversionInput(r, FILE);
    expect(input.bits).toBe(12 + n);
    expect(input.oversamplingBits).toBe(n);
    expect(input.codeLow).toBe(r.summary.codeMin * 2 ** n);
    expect(input.codeHigh).toBe((r.summary.codeMax + 1) * 2 ** n - 1);
    const gen = generateC([input], { fileStem: 'conv' });
    expect(gen.text).toMatch(/14-bit decimated value/);
    expect(gen.text).toMatch(/sum of 16 readings of the 12-bit ADC shifted right by 2/);
  });

  it.skipIf(!haveGcc)('compiled with gcc, every decimated code in range is within the target of the model', () => {
    const { r } = analysed(text);
    const c = r.channel;
    const input = conversionInput(r, FILE);
    const dir = new WorkDir();
    dirs.push(dir);
    const [values] = compileAndRun(dir, [input]);
    expect(values!.filter((v) => v !== undefined).length).toBe(2 ** input.bits);
    const lsb = c.adc.reference.value / 2 ** c.adc.bits;
    let worst = 0;
    for (let d = input.codeLow; d <= input.codeHigh; d++) {
      // AVR121: D = floor(S / 2^n), S the sum of 4^n readings; the mean reading is then in
      // [D / 2^n, (D + 1) / 2^n - 4^-n], centre (D + 0.5 - 2^-(n+1)) / 2^n; a reading k stands for
      // the voltage (k + 0.5) LSB (ideal quantiser, common practice, no source).
      const meanReading = (d + 0.5 - 2 ** -(n + 1)) / 2 ** n;
      const want = bisectKelvin(c, (meanReading + 0.5) * lsb) - 273.15;
      worst = Math.max(worst, Math.abs(values![d]! / input.outputScale - want));
    }
    console.log(`oversampling: ${input.codeHigh - input.codeLow + 1} decimated codes, max error ${worst.toFixed(4)} °C (target ${input.errorTarget})`);
    expect(worst).toBeLessThanOrEqual(input.errorTarget);
  });

  it.skipIf(!haveGcc)('reads a dithered input back: 16 readings with noise spread over one LSB, summed and shifted', () => {
    const { r } = analysed(text);
    const c = r.channel;
    const input = conversionInput(r, FILE);
    const dir = new WorkDir();
    dirs.push(dir);
    const [values] = compileAndRun(dir, [input]);
    const lsb = c.adc.reference.value / 2 ** c.adc.bits;
    const slopeK = (k: number) => Math.abs(lsb / 2 ** n / sense(c, k).slope);
    let worst = 0;
    for (let i = 0; i <= 100; i++) {
      const k = c.lowK + ((c.highK - c.lowK) * i) / 100;
      const v = sense(c, k).volts;
      // 4^n readings of an ideal ADC with the noise spread evenly over one LSB (AVR121's dither).
      let sum = 0;
      for (let j = 0; j < 4 ** n; j++) sum += Math.floor(v / lsb + (j + 0.5) / 4 ** n - 0.5);
      const d = Math.floor(sum / 2 ** n);
      const err = Math.abs(values![d]! / input.outputScale - (k - 273.15));
      // Within the target plus half a decimated LSB in temperature (the decimation's own rounding).
      expect(err).toBeLessThanOrEqual(input.errorTarget + 0.5 * slopeK(k) + 1e-9);
      worst = Math.max(worst, err / slopeK(k));
    }
    console.log(`oversampling: dithered readings back within ${worst.toFixed(3)} decimated LSB`);
  });

  it('refuses an oversampled value wider than 16 bits with a clear message', () => {
    const t = spec('  sensor = q1\n  adc = a12\n  bias = current 20 uA\n  range = 0 °C .. 50 °C\n  oversampling = 5 bits');
    const a = analyse({ path: FILE, text: t, root: ROOT, host: new DiskHost() });
    expect(generatableResults(a.channels, a.diagnostics)).toEqual([]);
    const out = generateForChannel(a, 'c', undefined);
    expect(out.ok).toBe(false);
    expect(!out.ok && out.message).toMatch(/up to 16 bits .* 12 bits and oversampling adds 5: 17.*at most 4 bits/);
  });
});
