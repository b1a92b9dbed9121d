// Two-input conversions: an ADC code plus a second integer input (a reference reading, such as
// the temperature another channel's generated function returns) -> temperature, integer only.
//
// The sensor's signal q (e.g. a voltage in uV) is linear in the code; the second input adds
// r(v) to it (compensation: the part of q the reference point takes away); the temperature is
// a monotonic function of the total. The C computes, with u = 2^-k units of q and G guard bits:
//   em  = floor((A (code - C0) + B) / 2^Q)         q of the code, in u / 2^G, fixed point
//   rv  = R((v - vLow) >> s)                        r(v) - rBase, in u / 2^G: a designed table or
//                                                   piecewise quadratic (generate.ts)
//   x   = floor((em + rv + 2^(G-1)) / 2^G)          total q in u, rounded, from X0 u
//   out = H(x)                                      temperature: a designed table or quadratic
// Both one-dimensional functions R and H come from the existing designer (generate.ts planOne),
// whose input is any integer over a range, and are checked there by exact simulation. This
// module bounds what the two roundings before H add, from exhaustive simulation of em over every
// in-range code and of R over every reference value, and states the sum as the claimed error.
// Nothing here knows which sensor it is: the sensor kind supplies q, r and the inverse.

import { INT32_MAX, asr, fitsInt32 } from './arith';
import { SHARED_IMPL, SHARED_STATUS, blockComment, dataCode, kernelCode, kernelHelpers, lit32, names, roundFraction, type ChannelPlan } from './emit';
import { commentLines } from './names';
import { SIZE_MODEL, kernelAt, planOne } from './design';
import { rounded, type Samples } from './samples';
import { CodegenInputError, type CompensatedInput } from '../sensors/conversion';
import type { ConversionInput } from './types';

export type { CompensatedInput } from '../sensors/conversion';

export function isCompensated(c: object): c is CompensatedInput {
  return 'compensation' in c;
}

export interface CompensatedPlan {
  name: string;
  ident: string;
  bits: number;
  scale: number;
  /** u = 2^-k units of q; G guard bits. */
  k: number;
  G: number;
  X0: number;
  xHigh: number;
  A: number;
  B: number;
  Q: number;
  C0: number;
  codeLow: number;
  codeHigh: number;
  faultBelow?: number;
  faultAbove?: number;
  ref: { low: number; high: number; shift: number; bits: 16 | 32; param: string; plan: ChannelPlan; samples: Samples; rBase: number };
  hot: { plan: ChannelPlan; samples: Samples };
  outBits: 16 | 32;
  outAtLow: number;
  outAtHigh: number;
  /** Largest |q error| of em and of R, and the bound on x u - q, in q units. */
  errEm: number;
  errRef: number;
  deltaQ: number;
  /** Largest design error of H alone, degC; the claimed error (H plus the rounding before it), degC. */
  designErrC: number;
  maxErrorC: number;
  errorTarget: number;
  qName: string;
  qUnit: string;
  describe: string[];
  note?: string;
  cautions?: readonly string[];
  /** Estimated linked bytes, 8-bit AVR and Cortex-M0: the two designed parts plus the combining code (design.ts SIZE_MODEL `combine`). */
  bytes: number;
  bytesM0: number;
}

export const REF_CLAMPED = 4;

function fail(c: CompensatedInput, field: string, msg: string): never {
  throw new CodegenInputError(String(c.channelName), field, msg);
}

function validate(c: CompensatedInput): void {
  if (typeof c.channelName !== 'string') fail(c, 'channelName', 'must be a string');
  if (!Number.isInteger(c.bits) || c.bits < 1 || c.bits > 16) fail(c, 'bits', `must be an integer 1..16, got ${c.bits}`);
  if (!(Number.isFinite(c.qPerCode) && c.qPerCode > 0)) fail(c, 'gain', `${c.qName} per code must be positive and finite (got ${c.qPerCode} ${c.qUnit}); a non-inverting amplifier of positive gain`);
  if (!Number.isFinite(c.qAtZero)) fail(c, 'offset', `must be finite, got ${c.qAtZero}`);
  if (!(Number.isFinite(c.qLow) && Number.isFinite(c.qHigh) && c.qHigh > c.qLow)) fail(c, 'range', `the ${c.qName} of the range must rise from its cold to its hot end (got ${c.qLow} .. ${c.qHigh} ${c.qUnit})`);
  if (!Number.isInteger(c.outputScale) || c.outputScale < 1 || c.outputScale > 10000) fail(c, 'outputScale', `must be an integer 1..10000, got ${c.outputScale}`);
  if (!Number.isFinite(c.errorTarget) || c.errorTarget <= 0 || c.errorTarget > 100) fail(c, 'errorTarget', `must be a number in (0, 100] degC, got ${c.errorTarget}`);
  if (!['auto', 'table', 'polynomial'].includes(c.method)) fail(c, 'method', `must be auto, table or polynomial, got ${String(c.method)}`);
  const r = c.compensation;
  if (!/^[a-z][a-z0-9_]{0,30}$/.test(r.param) || ['code', 'out', 'x', 'status'].includes(r.param)) fail(c, 'compensation', `parameter name '${r.param}' is not a free C identifier`);
  const [tMin, tMax] = r.bits === 16 ? [-32768, 32767] : [-2147483648, 2147483647];
  if (!Number.isInteger(r.low) || !Number.isInteger(r.high) || r.low > r.high || r.low < tMin || r.high > tMax)
    fail(c, 'compensation', `reference range ${r.low} .. ${r.high} must be integers inside int${r.bits}_t, low <= high`);
  if (r.high - r.low > 2 ** 22) fail(c, 'compensation', `reference range too wide (${r.high - r.low + 1} values, at most ${2 ** 22 + 1})`);
  const top = 2 ** c.bits - 1;
  if (c.faultBelow !== undefined && (!Number.isInteger(c.faultBelow) || c.faultBelow < 0 || c.faultBelow > top)) fail(c, 'faultBelow', `must be an integer 0..${top}`);
  if (c.faultAbove !== undefined && (!Number.isInteger(c.faultAbove) || c.faultAbove < 0 || c.faultAbove > top)) fail(c, 'faultAbove', `must be an integer 0..${top}`);
}

/** em for one code, exactly as the C computes it. */
function emAt(p: Pick<CompensatedPlan, 'A' | 'B' | 'Q' | 'C0'>, code: number): number {
  return asr(p.A * (code - p.C0) + p.B, p.Q);
}

function refAt(p: CompensatedPlan, v: number): number {
  const i = Math.floor((v - p.ref.low) / 2 ** p.ref.shift);
  return rounded(p.ref.samples, kernelAt(p.ref.plan.design, p.ref.samples, i));
}

function hotAt(p: CompensatedPlan, x: number): number {
  return rounded(p.hot.samples, kernelAt(p.hot.plan.design, p.hot.samples, x));
}

/** Status and output of the generated function, exactly as the C computes them (any code, any reference value of its C type). */
export function simulateCompensated(p: CompensatedPlan, code: number, v: number): { status: number; value: number } {
  if (p.faultBelow !== undefined && code <= p.faultBelow) return { status: 3, value: p.outAtLow };
  if (p.faultAbove !== undefined && code >= p.faultAbove) return { status: 3, value: p.outAtHigh };
  let status = 0;
  let w = v;
  if (w < p.ref.low) { w = p.ref.low; status = REF_CLAMPED; }
  else if (w > p.ref.high) { w = p.ref.high; status = REF_CLAMPED; }
  const cold = { status: status || 1, value: p.outAtLow };
  const hot = { status: status || 2, value: p.outAtHigh };
  if (code < p.codeLow) return cold;
  if (code > p.codeHigh) return hot;
  const sum = emAt(p, code) + refAt(p, w);
  const x = asr(sum + 2 ** (p.G - 1), p.G);
  if (x < 0) return cold;
  if (x > p.xHigh) return hot;
  return { status, value: hotAt(p, x) };
}

/** Plans by input object and identifier: the source and the header of one run design once. */
const planned = new WeakMap<CompensatedInput, Map<string, CompensatedPlan>>();

/** One of the two one-input designs inside a two-input conversion: 16-bit input from 0, no trim, no float variant. */
function innerInput(c: CompensatedInput, channelName: string, codeHigh: number, celsiusAtCode: (code: number) => number, outputScale: number, errorTarget: number, method: ConversionInput['method']): ConversionInput {
  return { channelName, bits: 16, codeLow: 0, codeHigh, celsiusAtCode, outputScale, errorTarget, method, optimise: c.optimise ?? 'balanced', calibration: { mode: 'none', runtime: false }, floatVariant: false, specHash: '' };
}

/** The design: unit, guard bits, the two designed functions, the fixed-point line, the code range and the claimed error. */
export function planCompensated(c: CompensatedInput, ident: string): CompensatedPlan {
  const mine = planned.get(c) ?? new Map<string, CompensatedPlan>();
  const hit = mine.get(ident);
  if (hit) return hit;
  const p = designCompensated(c, ident);
  mine.set(ident, p);
  planned.set(c, mine);
  return p;
}

function designCompensated(c: CompensatedInput, ident: string): CompensatedPlan {
  validate(c);
  const r = c.compensation;
  const top = 2 ** c.bits - 1;
  // u: the finest power-of-two unit of q whose in-range totals fit 0..65535 (the designer's input).
  // The grid reaches a unit or two beyond both ends of the range, so a total inside the range is
  // never pinned by the rounding alone.
  let k = 10;
  while (k > -8 && Math.ceil(c.qHigh * 2 ** k) - Math.floor(c.qLow * 2 ** k) + 2 > 65535) k--;
  const X0 = Math.floor(c.qLow * 2 ** k) - 1;
  const xHigh = Math.ceil(c.qHigh * 2 ** k) + 1 - X0;
  if (xHigh < 1 || xHigh > 65535) fail(c, 'range', `the ${c.qName} span ${c.qHigh - c.qLow} ${c.qUnit} cannot be represented`);
  const u = 2 ** -k;
  const G = Math.max(2, Math.min(4, 13 - k));
  const refScale = 2 ** (G + k);
  if (refScale > 10000 || refScale < 1) fail(c, 'range', `the ${c.qName} unit ${u} ${c.qUnit} is outside what the generator handles`);

  // --- R: the reference's contribution, relative to rBase (its mid value on the grid of u / 2^G).
  const nRef = r.high - r.low + 1;
  const shift = Math.max(0, Math.ceil(Math.log2(nRef / 65536)));
  const iMax = Math.floor((r.high - r.low) / 2 ** shift);
  const qAtV = (v: number) => {
    const q = r.qAt(v);
    if (!Number.isFinite(q)) fail(c, 'compensation', `the reference value ${v} (${+(v / r.scale).toFixed(4)} degC) has no ${c.qName}; narrow the reference range`);
    return q;
  };
  const mid = (qAtV(r.low) + qAtV(r.high)) / 2;
  const rBase = Math.round(mid * refScale) / refScale;
  const bucketCentre = (i: number) => Math.min(r.high, r.low + i * 2 ** shift + (2 ** shift - 1) / 2);
  let refSpan = 0;
  for (const v of [r.low, r.high, Math.round((r.low + r.high) / 2)]) refSpan = Math.max(refSpan, Math.abs(qAtV(v) - rBase));
  if (refSpan > 9000) fail(c, 'compensation', `the reference's ${c.qName} varies by ${(2 * refSpan).toFixed(0)} ${c.qUnit} over its range ${r.low}..${r.high}; narrow the reference range`);
  const refInput: ConversionInput = { ...innerInput(c, `${c.channelName} (reference)`, iMax, (i) => qAtV(bucketCentre(i)) - rBase, refScale, u / 8, 'auto'), anyShape: true };
  const refOne = planOne(refInput, `${ident}_ref`);

  // --- em: the code's q in u / 2^G from X0 u, on a line with Q fraction bits, about the middle code.
  const C0 = Math.floor(top / 2) + 1;
  const aReal = c.qPerCode * refScale;
  const bReal = (c.qPerCode * (C0 + 0.5) + c.qAtZero + rBase) * refScale - X0 * 2 ** G;
  let line: { A: number; B: number; Q: number; C0: number } | undefined;
  for (let Q = 30; Q >= 0 && !line; Q--) {
    const A = Math.round(aReal * 2 ** Q);
    const B = Math.round(bReal * 2 ** Q) + (Q > 0 ? 2 ** (Q - 1) : 0);
    if (!fitsInt32(A) || !fitsInt32(B) || A <= 0) continue;
    const ends = [A * (0 - C0) + B, A * (top - C0) + B];
    if (ends.every((e) => Math.abs(e) < INT32_MAX / 2)) line = { A, B, Q, C0 };
  }
  if (!line) fail(c, 'gain', `${c.qName} per code ${c.qPerCode} ${c.qUnit} cannot be held in 32-bit fixed point`);

  // --- The reference's outputs over every value (exhaustive: also their extremes and error).
  const refPlanShell = { ref: { low: r.low, high: r.high, shift, plan: refOne.plan, samples: refOne.samples } } as CompensatedPlan;
  let refMin = Infinity;
  let refMax = -Infinity;
  let errRef = 0;
  for (let v = r.low; v <= r.high; v++) {
    const rv = refAt(refPlanShell, v);
    refMin = Math.min(refMin, rv);
    refMax = Math.max(refMax, rv);
    errRef = Math.max(errRef, Math.abs((rv * u) / 2 ** G - (qAtV(v) - rBase)));
  }
  const xOf = (em: number, rv: number) => asr(em + rv + 2 ** (G - 1), G);
  // In-range codes: those some reference value can put inside 0..xHigh; never the ADC's end codes
  // (they stand for every voltage beyond them) nor fault codes.
  let codeLow = Math.max(1, c.faultBelow !== undefined ? c.faultBelow + 1 : 1);
  let codeHigh = Math.min(top - 1, c.faultAbove !== undefined ? c.faultAbove - 1 : top - 1);
  while (codeLow <= codeHigh && xOf(emAt(line, codeLow), refMax) < 0) codeLow++;
  while (codeHigh >= codeLow && xOf(emAt(line, codeHigh), refMin) > xHigh) codeHigh--;
  if (codeLow > codeHigh) fail(c, 'range', `no ADC code of the converter reaches the range (${c.qName} ${c.qLow.toFixed(1)} .. ${c.qHigh.toFixed(1)} ${c.qUnit}); check the gain, offset and reference`);
  let errEm = 0;
  for (let code = codeLow; code <= codeHigh; code++) {
    const em = emAt(line, code);
    for (const v of [em + refMin, em + refMax]) if (!fitsInt32(v + 2 ** (G - 1))) fail(c, 'gain', 'intermediate exceeds 32 bits');
    const want = c.qPerCode * (code + 0.5) + c.qAtZero + rBase - X0 * u;
    errEm = Math.max(errEm, Math.abs((em * u) / 2 ** G - want));
  }
  const deltaQ = u / 2 + errEm + errRef;

  // --- H: temperature at the total, designed to what the roundings before it leave of the target.
  // Beyond the range the model itself, or held flat where it has no value (past the sensor's tables).
  const hotModel = (x: number) => {
    const q = (X0 + x) * u;
    const t = c.celsiusAtQ(q);
    return Number.isFinite(t) ? t : c.celsiusAtQ(Math.min(c.qHigh, Math.max(c.qLow, q)));
  };
  let slopeMax = 0;
  {
    const step = Math.max(1, Math.floor(xHigh / 4096));
    for (let x = 0; x + step <= xHigh + step; x += step) {
      const a = hotModel(Math.min(x, xHigh - 1));
      const b = hotModel(Math.min(x, xHigh - 1) + 1);
      if (Number.isFinite(a) && Number.isFinite(b)) slopeMax = Math.max(slopeMax, Math.abs(b - a) / u);
    }
  }
  let designTarget = c.errorTarget - deltaQ * slopeMax * 1.02;
  const tooCoarse = () =>
    fail(c, 'errorTarget', `${c.errorTarget} degC cannot be met: resolving the ${c.qName} to ${u} ${c.qUnit} (with the ADC line and the reference function) costs up to ${(deltaQ * slopeMax).toFixed(4)} degC alone, ${(slopeMax * u).toFixed(4)} degC per ${u} ${c.qUnit} where the sensor is least sensitive; raise the target (at least ${(deltaQ * slopeMax + 1 / c.outputScale).toFixed(3)} degC) or narrow the range`);
  for (let attempt = 0; attempt < 4; attempt++) {
    if (designTarget * c.outputScale < 0.5) tooCoarse();
    const hotInput = innerInput(c, c.channelName, xHigh, hotModel, c.outputScale, designTarget, c.method);
    const hotOne = planOne(hotInput, `${ident}_hot`);
    const hs = hotOne.samples;
    // Claimed error: design error at x plus the slope near x times the bound on x u - q.
    const f = (x: number) => hs.ideal[x]! / c.outputScale;
    let claimed = 0;
    let designErr = 0;
    const m = Math.ceil(deltaQ / u) + 1;
    const slopes = new Float64Array(xHigh);
    for (let x = 0; x < xHigh; x++) slopes[x] = Math.abs(f(x + 1) - f(x)) / u;
    for (let x = 0; x <= xHigh; x++) {
      const e = Math.abs(hotAt({ hot: { plan: hotOne.plan, samples: hs } } as CompensatedPlan, x) / c.outputScale - f(x));
      designErr = Math.max(designErr, e);
      let s = 0;
      for (let j = Math.max(0, x - m); j <= Math.min(xHigh - 1, x + m); j++) s = Math.max(s, slopes[j]!);
      claimed = Math.max(claimed, e + deltaQ * s);
    }
    if (claimed <= c.errorTarget + 1e-12) {
      const plan: CompensatedPlan = {
        name: c.channelName,
        ident,
        bits: c.bits,
        scale: c.outputScale,
        k,
        G,
        X0,
        xHigh,
        ...line,
        codeLow,
        codeHigh,
        ...(c.faultBelow !== undefined ? { faultBelow: c.faultBelow } : {}),
        ...(c.faultAbove !== undefined ? { faultAbove: c.faultAbove } : {}),
        ref: { low: r.low, high: r.high, shift, bits: r.bits, param: r.param, plan: refOne.plan, samples: refOne.samples, rBase },
        hot: { plan: hotOne.plan, samples: hs },
        outBits: hotOne.plan.outBits,
        outAtLow: 0,
        outAtHigh: 0,
        errEm,
        errRef,
        deltaQ,
        designErrC: designErr,
        maxErrorC: claimed,
        errorTarget: c.errorTarget,
        qName: c.qName,
        qUnit: c.qUnit,
        describe: r.describe,
        ...(c.note !== undefined ? { note: c.note } : {}),
        ...(c.cautions?.length ? { cautions: c.cautions } : {}),
        bytes: refOne.bytes + hotOne.bytes + SIZE_MODEL.avr.combine,
        bytesM0: refOne.bytesM0 + hotOne.bytesM0 + SIZE_MODEL.m0.combine,
      };
      plan.outAtLow = hotAt(plan, 0);
      plan.outAtHigh = hotAt(plan, xHigh);
      return plan;
    }
    designTarget -= claimed - c.errorTarget + 0.25 / c.outputScale;
  }
  return tooCoarse();
}

function lit(v: number, bits: 16 | 32): string {
  return bits === 32 ? lit32(v) : `${v}`;
}

function headComment(p: CompensatedPlan): string {
  const hd = p.hot.plan.design;
  const rd = p.ref.plan.design;
  const what = (d: typeof hd) =>
    d.kind === 'table'
      ? d.shift === 0
        ? `direct table of ${d.entries.length} int${d.entryBits} values`
        : `table of ${d.entries.length} int${d.entryBits} points every ${2 ** d.shift}, linear interpolation`
      : `piecewise quadratic, ${d.coefs.length} segment(s) of ${2 ** d.shift}, int32 coefficients`;
  const u = 2 ** -p.k;
  const fn = `${p.ident}_code_to_temp`;
  const lines = [
    `Channel ${commentLines(p.name, 1)[0] ?? ''}: ${p.bits}-bit ADC code and ${p.ref.param} -> temperature in 1/${p.scale} degC.`,
    ...p.describe,
    `Integer arithmetic: the code's ${p.qName} on a 32-bit fixed-point line, plus the ${p.ref.param} part`,
    `(${what(rd)}), rounded to ${u} ${p.qUnit}, then temperature (${what(hd)}).`,
    `In range: codes ${p.codeLow}..${p.codeHigh} and ${p.ref.param} ${p.ref.low}..${p.ref.high}; a code stands for the centre of its step.`,
    `Max error vs the exact model over every in-range code and ${p.ref.param}: ${p.maxErrorC.toFixed(4)} degC (target ${p.errorTarget} degC);`,
    `the temperature function alone ${p.designErrC.toFixed(4)} degC, the ${p.qName} rounding before it up to ${p.deltaQ.toFixed(3)} ${p.qUnit}.`,
    'From an exact simulation of this integer arithmetic; the quantisation of the code comes on top.',
    `${fn}() returns THSC_IN_RANGE; THSC_CLAMPED_COLD / THSC_CLAMPED_HOT outside the range, the output then`,
    `pinned to exactly ${p.outAtLow} / ${p.outAtHigh} (never wrapped); THSC_REF_CLAMPED when ${p.ref.param} is outside`,
    `${p.ref.low}..${p.ref.high}: it is pinned to that range and the output is not a trustworthy temperature.`,
    ...(p.faultBelow !== undefined || p.faultAbove !== undefined
      ? [
          `THSC_SENSOR_FAULT: ${[...(p.faultBelow !== undefined ? [`codes <= ${p.faultBelow}`] : []), ...(p.faultAbove !== undefined ? [`codes >= ${p.faultAbove}`] : [])].join(' and ')} (an open sensor's codes); checked first.`,
          'SAFETY: on THSC_SENSOR_FAULT or THSC_REF_CLAMPED put the load in its safe state (heater off,',
          'alarm raised); do not act on the value. Treat repeated clamped readings the same way.',
        ]
      : [
          'No code of this channel is set apart as a sensor fault: detect an open sensor another way',
          'before acting on the value. SAFETY: on THSC_REF_CLAMPED put the load in its safe state.',
        ]),
  ];
  return blockComment(lines, p.note, p.cautions);
}

const REF_STATUS = `#ifndef THSC_REF_CLAMPED
#define THSC_REF_CLAMPED   4u /* reference input outside its designed range: pinned to it; not a trustworthy temperature */
#endif`;

function declarations(p: CompensatedPlan): string {
  const up = p.ident.toUpperCase();
  return [
    `#ifndef ${up}_DECLARED`,
    `#define ${up}_DECLARED 1`,
    `#define ${up}_SCALE ${p.scale} /* output units per degC */`,
    `typedef int${p.outBits}_t ${p.ident}_temp_t;`,
    `uint8_t ${p.ident}_code_to_temp(uint16_t code, int${p.ref.bits}_t ${p.ref.param}, ${p.ident}_temp_t *out);`,
    '#endif',
  ].join('\n');
}

export function emitCompensatedHeader(p: CompensatedPlan): string {
  return `${headComment(p)}\n#include <stdint.h>\n${SHARED_STATUS}\n${REF_STATUS}\n${declarations(p)}\n`;
}

/** A designed one-dimensional function as a static C function of a uint16_t. */
function kernelFunction(plan: ChannelPlan, fn: string, what: string): string {
  const n = names(plan);
  const k = kernelCode(plan, n);
  return [`/* ${what} */`, `static int32_t ${fn}(uint16_t code)`, '{', ...k.decl, ...k.body, ...roundFraction(plan, k.wide), '    return kernel;', '}'].join('\n');
}

export function emitCompensatedSource(p: CompensatedPlan, header?: string): string {
  const id = p.ident;
  const own = header ? [`#include "${header}" /* this channel's types, prototypes and status codes */`] : ['#include <stdint.h>', SHARED_STATUS, REF_STATUS, declarations(p)];
  const outT = `${id}_temp_t`;
  const rb = p.ref.bits;
  const U = rb === 16 ? 'uint16_t' : 'uint32_t';
  const lowU = rb === 16 ? `${(p.ref.low + 65536) % 65536}u` : `${(p.ref.low >>> 0)}UL`;
  const refLit = (v: number) => (rb === 16 ? `${v}` : lit32(v));
  const idx = `(uint16_t)((${U})((${U})${p.ref.param} - ${lowU})${p.ref.shift > 0 ? ` >> ${p.ref.shift}` : ''})`;
  const ret = (v: string, st: string) => [`        *out = (${outT})${lit(Number(v), p.outBits)};`, ...(st === 'status' ? [] : [`        if (status == THSC_IN_RANGE) status = ${st};`]), '        return status;'];
  const fn = [
    `uint8_t ${id}_code_to_temp(uint16_t code, int${rb}_t ${p.ref.param}, ${outT} *out)`,
    '{',
    '    uint8_t status = THSC_IN_RANGE;',
    '    int32_t x;',
    ...(p.faultBelow !== undefined ? [`    if (code ${p.faultBelow === 0 ? '== 0u' : `<= ${p.faultBelow}u`}) { *out = (${outT})${lit(p.outAtLow, p.outBits)}; return THSC_SENSOR_FAULT; }`] : []),
    ...(p.faultAbove !== undefined ? [`    if (code ${p.faultAbove === 65535 ? '== 65535u' : `>= ${p.faultAbove}u`}) { *out = (${outT})${lit(p.outAtHigh, p.outBits)}; return THSC_SENSOR_FAULT; }`] : []),
    `    if (${p.ref.param} < ${refLit(p.ref.low)}) { ${p.ref.param} = ${refLit(p.ref.low)}; status = THSC_REF_CLAMPED; }`,
    `    else if (${p.ref.param} > ${refLit(p.ref.high)}) { ${p.ref.param} = ${refLit(p.ref.high)}; status = THSC_REF_CLAMPED; }`,
    `    if (code < ${p.codeLow}u) {`,
    ...ret(String(p.outAtLow), 'THSC_CLAMPED_COLD'),
    '    }',
    `    if (code > ${p.codeHigh}u) {`,
    ...ret(String(p.outAtHigh), 'THSC_CLAMPED_HOT'),
    '    }',
    `    /* ${p.qName} of the code plus the ${p.ref.param} part, in 1/${2 ** p.G} of ${2 ** -p.k} ${p.qUnit}; then rounded to ${2 ** -p.k} ${p.qUnit} */`,
    `    x = THSC_ASR32((int32_t)${lit32(p.A)} * ((int32_t)code - (int32_t)${lit32(p.C0)}) + (int32_t)${lit32(p.B)}, ${p.Q}) + ${id}_ref_part(${idx});`,
    `    x = THSC_ASR32(x + ${2 ** (p.G - 1)}L, ${p.G});`,
    '    if (x < 0L) {',
    ...ret(String(p.outAtLow), 'THSC_CLAMPED_COLD'),
    '    }',
    `    if (x > ${p.xHigh}L) {`,
    ...ret(String(p.outAtHigh), 'THSC_CLAMPED_HOT'),
    '    }',
    `    *out = (${outT})${id}_inverse((uint16_t)x);`,
    '    return status;',
    '}',
  ];
  const parts = [
    headComment(p),
    ...own,
    SHARED_IMPL,
    ...new Set([...kernelHelpers(p.ref.plan), ...kernelHelpers(p.hot.plan)]),
    dataCode(p.ref.plan, names(p.ref.plan)),
    dataCode(p.hot.plan, names(p.hot.plan)),
    kernelFunction(p.ref.plan, `${id}_ref_part`, `${p.qName} of the ${p.ref.param} minus ${p.ref.rBase} ${p.qUnit}, in 1/${2 ** p.G} of ${2 ** -p.k} ${p.qUnit}, from (${p.ref.param} - (${p.ref.low})) >> ${p.ref.shift}`),
    kernelFunction(p.hot.plan, `${id}_inverse`, `temperature in 1/${p.scale} degC from the total ${p.qName} x, in ${2 ** -p.k} ${p.qUnit} from ${p.X0 * 2 ** -p.k} ${p.qUnit}`),
    fn.join('\n'),
  ];
  return `${parts.join('\n')}\n`;
}
