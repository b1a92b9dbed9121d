// Generated integer C for thermocouple channels: ADC code + cold-junction temperature -> hot-junction
// temperature (codegen/compensated.ts with sensors/thermocouple/codegen.ts). Checked against the
// exact model built here from the ITS-90 reference function and its exact inverse (NIST Monograph
// 175, 1993): T_hot = E^-1(E_meas + E(T_cj)), E_meas = (V_code - V_offset) / gain, the law of
// intermediate temperatures. Over every ADC code and cold-junction temperatures every 5 degC:
// (a) the TypeScript simulation of the C arithmetic, (b) host gcc under -Wconversion and the
// sanitizers, equal to (a) at every pair, (c) the 8-bit AVR in simavr, equal to (a).
// Every amplifier and range (tests/fixtures/codegen/thermocouples.ts) is invented for illustration.

import { beforeAll, describe, expect, it } from 'vitest';
import { planCompensated, simulateCompensated, type CompensatedInput, type CompensatedPlan } from '../../../server/src/codegen/compensated';
import { CodegenInputError } from '../../../server/src/sensors/conversion';
import { thermocoupleConversionInput, type TcCodegenInput } from '../../../server/src/sensors/thermocouple/codegen';
import { TC_TYPES, emf, kelvinAtEmf } from '../../../server/src/sensors/thermocouple/its90';
import { avrRows, hostRows, type Row, type Sweep } from '../../fixtures/codegen/compensated';
import { hasTool, missingTools } from '../../fixtures/codegen/toolchain';
import { TC_CASES } from '../../fixtures/codegen/thermocouples';

const CASES = TC_CASES;
const available = CASES.filter((c) => (TC_TYPES as readonly string[]).includes(c.type));
for (const c of CASES) if (!available.includes(c)) console.log(`thermocouple codegen: type ${c.type} skipped, not in the ITS-90 module yet`);

/** Exact model, degC (NaN where the EMF is beyond the reference function). */
function exactC(t: TcCodegenInput, code: number, cjUnits: number): number {
  const lsb = t.referenceV / 2 ** t.adcBits;
  const eMeas = ((code + 0.5) * lsb - t.outputOffsetV) / t.gain;
  return kelvinAtEmf(t.type, eMeas + emf(t.type, cjUnits / t.coldScale + 273.15)) - 273.15;
}

/** Cold-junction values: every 5 degC over the range and its ends. */
function coldGrid(t: TcCodegenInput): number[] {
  const out = new Set<number>();
  for (let c = t.coldLowC; c < t.coldHighC; c += 5) out.add(Math.round(c * t.coldScale));
  out.add(Math.round(t.coldHighC * t.coldScale));
  return [...out];
}

interface Case { t: TcCodegenInput; input: CompensatedInput; plan: CompensatedPlan; grid: number[]; codes: number[] }
const cases: Case[] = [];

/** Worst |error| vs the exact model over in-range pairs; throws on a pair outside the claimed error. */
function checkAgainstModel(k: Case, value: (code: number, cj: number) => { status: number; value: number }, codes: readonly number[]): number {
  const { t, plan } = k;
  const claimed = plan.maxErrorC + 1e-9;
  let worst = 0;
  for (const cj of k.grid) {
    for (const code of codes) {
      if (code < 1 || code > 2 ** t.adcBits - 2) continue;
      let T = exactC(t, code, cj);
      if (Number.isNaN(T)) T = ((code + 0.5) * t.referenceV) / 2 ** t.adcBits < t.outputOffsetV ? -Infinity : Infinity;
      const got = value(code, cj);
      const y = got.value / t.outputScale;
      const inside = T >= t.hotLowC && T <= t.hotHighC;
      if (inside) worst = Math.max(worst, Math.abs(y - T));
      // In range: within the claim whatever the status; a clamped status: the pinned end value,
      // and the model beyond (or within the claim of) that end.
      const ok =
        (!inside || Math.abs(y - T) <= claimed) &&
        (got.status === 0
          ? Math.abs(y - T) <= claimed
          : got.status === 1
            ? got.value === plan.outAtLow && T <= t.hotLowC + claimed
            : got.status === 2
              ? got.value === plan.outAtHigh && T >= t.hotHighC - claimed
              : false);
      if (!ok) throw new Error(`${t.channelName}: code ${code}, cj ${cj}: status ${got.status}, ${y} degC; model ${T} degC, claimed ${claimed}`);
    }
  }
  return worst;
}

describe.skipIf(available.length === 0)('thermocouple conversion: code + cold junction -> hot junction', () => {
  beforeAll(() => {
    for (const t of available) {
      const input = thermocoupleConversionInput(t);
      const plan = planCompensated(input, t.channelName.replace(/\W+/g, '_').toLowerCase());
      cases.push({ t, input, plan, grid: coldGrid(t), codes: Array.from({ length: 2 ** t.adcBits }, (_, c) => c) });
    }
  }, 900_000);

  it('(a) the simulated C arithmetic meets its claimed error, within the target, at every code and cold-junction temperature', () => {
    for (const k of cases) {
      const worst = checkAgainstModel(k, (code, cj) => simulateCompensated(k.plan, code, cj), k.codes);
      const p = k.plan;
      console.log(
        `thermocouple ${k.t.type} "${k.t.channelName}": codes ${p.codeLow}..${p.codeHigh}, EMF unit ${2 ** -p.k} uV; cold part ${p.ref.plan.design.kind}, ` +
          `hot ${p.hot.plan.design.kind} (${p.hot.plan.design.kind === 'table' ? p.hot.plan.design.entries.length : p.hot.plan.design.coefs.length}); ` +
          `claimed ${p.maxErrorC.toFixed(4)} degC (target ${k.t.errorTarget}), worst seen ${worst.toFixed(4)} degC; EMF rounding <= ${p.deltaQ.toFixed(3)} uV`,
      );
      expect(p.maxErrorC).toBeLessThanOrEqual(k.t.errorTarget);
      expect(worst).toBeLessThanOrEqual(p.maxErrorC + 1e-9);
    }
  });

  it("designs type B's cold-junction part, which falls and then rises over 0..50 degC, as a piecewise polynomial", () => {
    const k = cases.find((x) => x.t.type === 'B');
    expect(k).toBeDefined();
    // NIST Monograph 175 (1993), type B table in mV to three decimals, 0..50 degC every 10 degC:
    // 0.000, -0.002, -0.003, -0.002, -0.000, 0.002 (from memory).
    const table = [0, -2, -3, -2, 0, 2];
    table.forEach((uv, i) => expect(Math.abs(emf('B', i * 10 + 273.15) * 1e6 - uv)).toBeLessThanOrEqual(0.5));
    expect(k!.plan.ref.plan.design.kind).toBe('polynomial');
  });

  it('pins out-of-range cold-junction inputs to their range with THSC_REF_CLAMPED (4), and open-thermocouple codes give THSC_SENSOR_FAULT (3)', () => {
    for (const k of cases) {
      const p = k.plan;
      const mid = Math.floor((p.codeLow + p.codeHigh) / 2);
      for (const [cj, edge] of [[p.ref.low - 1, p.ref.low], [p.ref.high + 1, p.ref.high], [-32768, p.ref.low], [32767, p.ref.high]] as const) {
        const got = simulateCompensated(p, mid, cj);
        expect(got.status).toBe(4);
        expect(got.value).toBe(simulateCompensated(p, mid, edge).value);
      }
      if (k.t.faultAbove !== undefined) expect(simulateCompensated(p, 2 ** k.t.adcBits - 1, p.ref.low).status).toBe(3);
      // ADC end codes stand for every voltage beyond them: never in range.
      expect(simulateCompensated(p, 0, p.ref.low).status).toBe(1);
    }
  });

  it.skipIf(!hasTool('gcc'))('(b) host gcc, -Wconversion -Wsign-conversion and the sanitizers: equal to the simulation at every code and cold-junction value, in and out of range', () => {
    const sweeps: Sweep[] = cases.map((k) => ({
      plan: k.plan,
      refs: [...k.grid, k.plan.ref.low - 1, k.plan.ref.high + 1, ...(k.plan.ref.bits === 16 ? [-32768, 32767] : [-2147483648, 2147483647])],
    }));
    const rows = hostRows(cases.map((k) => k.input), sweeps);
    cases.forEach((k, i) => {
      const got = rows[i]!;
      expect(got.length).toBe(sweeps[i]!.refs.length * 2 ** k.t.adcBits);
      const bad = got.filter((r) => { const e = simulateCompensated(k.plan, r.code, r.ref); return e.status !== r.status || e.value !== r.value; });
      expect(bad.slice(0, 3), k.t.channelName).toEqual([]);
      const at = new Map(got.map((r) => [`${r.code} ${r.ref}`, r]));
      const worst = checkAgainstModel(k, (code, cj) => at.get(`${code} ${cj}`)!, k.codes);
      console.log(`host gcc: thermocouple ${k.t.type}: ${got.length} calls, max error vs the exact model ${worst.toFixed(4)} degC (claimed ${k.plan.maxErrorC.toFixed(4)})`);
    });
  }, 900_000);

  it.skipIf(missingTools(['avr-gcc', 'avr-size', 'simavr']).length > 0)('(c) atmega328p in simavr: equal to the simulation (bytes and cycles printed)', () => {
    for (const k of cases) {
      const p = k.plan;
      const top = 2 ** k.t.adcBits - 1;
      // 12-bit: every code; 16-bit: every 61st code and the range ends (simulated time).
      const stride = k.t.adcBits > 12 ? 61 : 1;
      const extra = [0, 1, p.codeLow - 1, p.codeLow, p.codeHigh, p.codeHigh + 1, top - 1, top].filter((c) => c >= 0 && c <= top);
      const refs = [p.ref.low, Math.round((p.ref.low + p.ref.high) / 2), p.ref.high, p.ref.high + 1];
      const { rows, bytes } = avrRows(k.input, { plan: p, refs, stride, codes: extra });
      expect(rows.length).toBe(refs.length * (Math.ceil((top + 1) / stride) + extra.length));
      const bad = rows.filter((r: Row) => { const e = simulateCompensated(p, r.code, r.ref); return e.status !== r.status || e.value !== r.value; });
      expect(bad.slice(0, 3), k.t.channelName).toEqual([]);
      const inRange = rows.filter((r) => r.status === 0).map((r) => r.cycles!);
      const mean = inRange.reduce((a, b) => a + b, 0) / inRange.length;
      console.log(`atmega328p: thermocouple ${k.t.type}: ${bytes} bytes added by one call, ${mean.toFixed(1)}/${Math.max(...inRange)} cycles mean/max in range, ${rows.length} calls equal to the simulation`);
      expect(bytes).toBeGreaterThan(0);
    }
  }, 900_000);

  it('says plainly when a target cannot be met (the EMF resolution alone exceeds it)', () => {
    const t = { ...available[0]!, errorTarget: 0.005 };
    expect(() => planCompensated(thermocoupleConversionInput(t), 'tight')).toThrow(CodegenInputError);
    expect(() => planCompensated(thermocoupleConversionInput(t), 'tight')).toThrow(/cannot be met/);
  });

  it('refuses a hot range outside the reference function with the range it takes', () => {
    const t = { ...available[0]!, hotHighC: 5000 };
    expect(() => thermocoupleConversionInput(t)).toThrow(/inside the reference function's/);
  });
});
