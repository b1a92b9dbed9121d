// Generated code at the edges a firmware author meets (issue #13 items 1, 2, 3, 9, 14): sensor
// faults, saturated end codes, a one-code range, the source including its own header, and what the
// header says. The C is compiled with gcc and clang (when installed) under the strict warnings and
// the sanitizers, and run over every code.
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { conversionInput, generatableResults } from '../../../server/src/codegen/channel-input';
import { generateC, spliceGenerated } from '../../../server/src/codegen';
import { planChannels } from '../../../server/src/codegen/generate';
import type { ConversionInput } from '../../../server/src/codegen/types';
import { channelHover } from '../../../server/src/features/hover';
import { channelReport } from '../../../server/src/cli/commands/report';
import { sensorFaults } from '../../../server/src/analysis/sensor-faults';
import type { Analysis } from '../../../server/src/engine';
import { analyseFile, FIXTURES } from '../helpers/fixtures';
import { syntheticDiodeChannel } from '../../fixtures/codegen/channels';
import { expectedOutput } from '../../fixtures/codegen/measure';
import { WorkDir, hasTool, run } from '../../fixtures/codegen/toolchain';

const FAULTS = path.join(FIXTURES, 'codegen', 'faults', 'faults.tsense');
const SATURATED = path.join(FIXTURES, 'diagnostics', 'code-saturated.fires.tsense');
const STRICT = ['-std=c99', '-pedantic', '-Wall', '-Wextra', '-Wconversion', '-Wsign-conversion', '-Werror', '-O1'];
const SANITIZE = ['-fsanitize=address,undefined', '-fno-sanitize-recover=all', '-fno-omit-frame-pointer'];
const COMPILERS = ['gcc', 'clang'].filter(hasTool);
if (!COMPILERS.includes('clang')) console.log('faults-edges: clang not found, gcc only (scripts/install-toolchains.sh installs it)');

function channel(a: Analysis, name: string) {
  const r = a.channels.find((x) => x.channel.name === name);
  if (!r) throw new Error(`no channel ${name}`);
  return r;
}

function inputsOf(file: string): ConversionInput[] {
  const a = analyseFile(file);
  return generatableResults(a.channels, a.diagnostics).map((r) => conversionInput(r, file));
}

/** Builds conv.c + conv.h and a main that prints `name code status value` for every code. */
function buildAndRun(cc: string, inputs: ConversionInput[], dir: WorkDir): Map<string, { status: number; value: number }[]> {
  const { plans } = planChannels(inputs);
  let main = '#include <stdio.h>\n#include <stdint.h>\n#include "conv.h"\nint main(void)\n{\n    unsigned c;\n';
  plans.forEach((p, i) => {
    main += `    for (c = 0; c < ${2 ** p.bits}u; c++) {\n        ${p.ident}_temp_t v;\n        uint8_t st = ${p.ident}_code_to_temp((uint16_t)c, &v);\n        printf("${i} %u %u %ld\\n", c, (unsigned)st, (long)v);\n    }\n`;
  });
  main += '    return 0;\n}\n';
  dir.write('conv.c', generateC(inputs, { fileStem: 'conv' }).text);
  dir.write('conv.h', generateC(inputs, { fileStem: 'conv', header: true }).text);
  dir.write('main.c', main);
  run(cc, [...STRICT, ...SANITIZE, 'main.c', 'conv.c', '-o', `run_${cc}`], dir.path);
  const out = new Map<string, { status: number; value: number }[]>();
  for (const line of run(path.join(dir.path, `run_${cc}`), [], dir.path).stdout.trim().split('\n')) {
    const [i, code, st, v] = line.split(' ').map(Number);
    const name = inputs[i!]!.channelName;
    const list = out.get(name) ?? [];
    list[code!] = { status: st!, value: v! };
    out.set(name, list);
  }
  return out;
}

describe('sensor faults: the code an open or shorted sensor gives', () => {
  const a = analyseFile(FAULTS);
  const codes = (name: string) => {
    const r = channel(a, name);
    return Object.fromEntries(sensorFaults(r.channel, r.summary.codeMin, r.summary.codeMax).map((f) => [f.kind, f.code]));
  };
  // Expected codes by hand: floor(V / Vref * 2^bits) with V from Ohm's law and the unloaded divider
  // (common practice, no source); a current source with no load taken to full scale (stated assumption).
  it('junction on a current source: open at full scale, short at 0', () => {
    expect(codes('j_current')).toEqual({ open: 1023, short: 0 });
  });
  it('junction on a resistor: open at the supply, floor(1.8 V / 2.5 V * 1024) = 737', () => {
    expect(codes('j_resistor')).toEqual({ open: 737, short: 0 });
  });
  it('thermistor in a ratiometric divider: open goes to the side of the fixed resistor', () => {
    expect(codes('ntc_above')).toEqual({ open: 4095, short: 0 });
    expect(codes('ntc_below')).toEqual({ open: 0, short: 4095 });
  });
  it('RTD on 1 mA with two 5 ohm leads: a short reads the leads, floor(10 mV / (3.3 V / 4096)) = 12', () => {
    expect(codes('rtd_current')).toEqual({ open: 4095, short: 12 });
  });
  it('are shown in the channel hover and the report', () => {
    const r = channel(a, 'j_resistor');
    expect(channelHover(r)).toMatch(/Sensor faults[^\n]*\n- open junction or lead: code 737 \(assumes/);
    expect(channelReport(r)).toContain('fault: shorted junction or leads: code 0 (assumes the ADC pin is tied to ground)');
  });
});

describe.skipIf(COMPILERS.length === 0)('generated C at the edges, every code, strict warnings and sanitizers', () => {
  const faultInputs = inputsOf(FAULTS);
  const satInputs = inputsOf(SATURATED);
  // One-code range of a falling sensor (the invented diode: the voltage falls as it warms).
  const base = syntheticDiodeChannel({ channelName: 'one code' });
  const oneCode = { ...base, codeHigh: base.codeLow };
  const all = [...faultInputs, ...satInputs.map((c) => ({ ...c, channelName: 'saturated' })), oneCode];
  const results = new Map<string, Map<string, { status: number; value: number }[]>>();
  let dir: WorkDir;
  beforeAll(() => {
    dir = new WorkDir();
    for (const cc of COMPILERS) results.set(cc, buildAndRun(cc, all, dir));
  }, 300_000);
  afterAll(() => dir?.dispose());

  it('returns THSC_SENSOR_FAULT (3) at every fault code, apart from the range and the clamped codes', () => {
    for (const cc of COMPILERS) {
      for (const c of faultInputs) {
        const got = results.get(cc)!.get(c.channelName)!;
        const r = channel(analyseFile(FAULTS), c.channelName);
        for (const f of sensorFaults(r.channel, r.summary.codeMin, r.summary.codeMax)) expect(got[f.code]!.status, `${cc} ${c.channelName} ${f.kind}`).toBe(3);
        for (let code = c.codeLow; code <= c.codeHigh; code++) expect(got[code]!.status).toBe(0);
        // Just outside the range: clamped (1 or 2), not a fault.
        if (c.codeLow > 0) expect([1, 2]).toContain(got[c.codeLow - 1]!.status);
        if (c.codeHigh < 2 ** c.bits - 1) expect([1, 2]).toContain(got[c.codeHigh + 1]!.status);
        const e = expectedOutput(c);
        for (let code = 0; code < 2 ** c.bits; code++) expect(got[code]).toEqual(e(code));
      }
    }
  });

  it('tells the author to put the load in its safe state on a fault', () => {
    const text = generateC(faultInputs, { fileStem: 'conv' }).text;
    expect(generateC(faultInputs, { fileStem: 'conv', header: true }).text).toContain('#define THSC_SENSOR_FAULT  3u');
    expect(text).toMatch(/SAFETY: on THSC_SENSOR_FAULT put the load in its safe state/);
    expect(text.replace(/\n \*   /g, '')).toContain('Open junction or lead: ADC code 737; assumes no current flows');
  });

  it('never calls a saturated end code in range (8-bit ADC whose cold end reads 255)', () => {
    // The sweep reaches the full-scale code; the conversion's range stops one code short of it.
    const a = analyseFile(SATURATED);
    expect(a.channels[0]!.summary.codeMax).toBe(255);
    expect(satInputs[0]!.codeHigh).toBe(254);
    for (const cc of COMPILERS) expect(results.get(cc)!.get('saturated')![255]!.status).not.toBe(0);
  });

  it('a one-code range of a falling sensor says it falls, and a lower code is hotter', () => {
    const text = generateC([oneCode], { fileStem: 'conv' }).text;
    expect(text).toContain('(temperature falls with the code)');
    for (const cc of COMPILERS) {
      const got = results.get(cc)!.get('one code')!;
      expect(got[oneCode.codeLow - 1]!.status).toBe(2); // THSC_CLAMPED_HOT
      expect(got[oneCode.codeLow + 1]!.status).toBe(1); // THSC_CLAMPED_COLD
    }
  });

  it('the source includes its own header: a file that includes it too compiles under -pedantic -Werror', () => {
    const src = generateC(all, { fileStem: 'conv' }).text;
    expect(src).toContain('#include "conv.h"');
    expect(src).not.toMatch(/typedef/);
    dir.write('user.c', `#include "conv.h"\n${src}`);
    for (const cc of COMPILERS) run(cc, [...STRICT, '-c', 'user.c', '-o', `user_${cc}.o`], dir.path);
    // A block pasted on its own (no header beside it) still declares what it needs.
    const pasted = generateC([oneCode], { fileStem: 'conv', selfContained: true }).text;
    expect(pasted).toContain('typedef');
    dir.write('pasted.c', pasted);
    for (const cc of COMPILERS) run(cc, [...STRICT, '-c', 'pasted.c', '-o', `pasted_${cc}.o`], dir.path);
    // The editor's code action splices a self-contained block into a file the CLI made (which
    // includes the header): the declarations are guarded, so both meet cleanly.
    const block = generateC([oneCode], { fileStem: 'conv', selfContained: true }).channels[0]!;
    const mixed = spliceGenerated(src, [{ channel: oneCode.channelName, hash: oneCode.specHash, text: block.code }]);
    expect(mixed.ok).toBe(true);
    dir.write('mixed.c', mixed.ok ? mixed.text : '');
    for (const cc of COMPILERS) run(cc, [...STRICT, '-c', 'mixed.c', '-o', `mixed_${cc}.o`], dir.path);
  });

  it('the header says what a code stands for, the degC per count, the clamped values and how to set trims safely', () => {
    const trimmed: ConversionInput = { ...syntheticDiodeChannel({ channelName: 'trimmed' }), calibration: { mode: 'two-point', offset: 0, gain: 1, runtime: true } };
    const text = generateC([oneCode, faultInputs[0]!, trimmed], { fileStem: 'conv' }).text;
    expect(text).toContain('A code stands for the centre');
    expect(text).toMatch(/of its step \(code \+ 0\.5 LSB\); one count spans [\d.]+ degC/);
    expect(text).toMatch(/one count spans [\d.]+ to [\d.]+ degC over the range/);
    const { plans } = planChannels([faultInputs[0]!]);
    const p = plans[0]!;
    const [cold, hot] = p.dir > 0 ? [p.outAtLow, p.outAtHigh] : [p.outAtHigh, p.outAtLow];
    expect(text).toContain(`THSC_CLAMPED_COLD gives exactly ${cold} (`);
    expect(text).toContain(`THSC_CLAMPED_HOT ${hot} (`);
    expect(text).toMatch(/trimmed_set_trim\(\) writes two fields \(32 and 16 bits\): not atomic on an 8-bit core/);
    expect(text).toContain('ATOMIC_BLOCK(ATOMIC_RESTORESTATE)');
  });
});
