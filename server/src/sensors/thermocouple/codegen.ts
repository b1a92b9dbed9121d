// Generated integer C for a thermocouple channel: ADC code + cold-junction temperature (as the
// cold-junction channel's own generated function returns it) -> hot-junction temperature.
// The generic two-input generator (codegen/compensated.ts) does the integer design; this module
// supplies the thermocouple's pieces (as a sensors/conversion.ts CompensatedInput):
//   q   = the thermocouple EMF in uV at the code's centre: (V_code - V_out_offset) / gain;
//   r   = EMF of the cold junction at its temperature, from the reference function (the EMF the
//         junction pair would give between 0 degC and the cold junction), so that
//   T_hot = inverse reference function of (q + r)
// (the law of intermediate temperatures; NIST Monograph 175 (1993), the ITS-90 thermocouple
// reference functions, E(T) with the reference junction at 0 degC).

import type { ChannelResult } from '../../analysis/types';
import { CodegenInputError, type CompensatedInput, type ConversionContext } from '../conversion';
import { faultLimits, sensorFaults } from '../../analysis/sensor-faults';
import { emf, kelvinAtEmf, referenceRange, type TcType } from './its90';
import { detectVolts } from './model';
import { coldJunctionChannel, type ThermocoupleDef } from './types';

const ZERO_C_K = 273.15;

/** What the generated thermocouple conversion needs, in the spec's units. */
export interface TcCodegenInput {
  channelName: string;
  type: TcType;
  /** Amplifier: nominal gain (V/V, > 0) and output voltage with zero EMF at its input (V). */
  gain: number;
  outputOffsetV: number;
  adcBits: number;
  referenceV: number;
  /** Hot-junction range of the channel, degC. */
  hotLowC: number;
  hotHighC: number;
  /** Cold-junction range the code is designed for, degC, and the cold-junction channel's output. */
  coldLowC: number;
  coldHighC: number;
  /** Units per degC of the cold-junction channel's output (100: hundredths), and its C type width. */
  coldScale: number;
  coldBits?: 16 | 32;
  /** Name of the cold-junction channel, for the header comment. */
  coldChannel?: string;
  outputScale: number;
  errorTarget: number;
  method?: 'auto' | 'table' | 'polynomial';
  optimise?: 'size' | 'speed' | 'balanced';
  /** Codes at or below / at or above that mean an open thermocouple (burnout pull-up or pull-down). */
  faultBelow?: number;
  faultAbove?: number;
  specHash: string;
  note?: string;
}

function fail(t: TcCodegenInput, field: string, msg: string): never {
  throw new CodegenInputError(String(t.channelName), field, msg);
}

/** EMF in uV at a temperature in degC (NaN outside the type's reference function). */
export function emfMicrovolts(type: TcType, celsius: number): number {
  return emf(type, celsius + ZERO_C_K) * 1e6;
}

/** The two-input generator input of a thermocouple channel; throws CodegenInputError with the range it accepts. */
export function thermocoupleConversionInput(t: TcCodegenInput): CompensatedInput {
  const range = referenceRange(t.type);
  const lowC = range.lowK - ZERO_C_K;
  const highC = range.highK - ZERO_C_K;
  const inRef = (c: number) => Number.isFinite(c) && c >= lowC && c <= highC;
  if (!inRef(t.hotLowC) || !inRef(t.hotHighC) || t.hotLowC >= t.hotHighC)
    fail(t, 'range', `type ${t.type}: the hot-junction range ${t.hotLowC} .. ${t.hotHighC} degC must rise and lie inside the reference function's ${+lowC.toFixed(2)} .. ${+highC.toFixed(2)} degC`);
  if (!inRef(t.coldLowC) || !inRef(t.coldHighC) || t.coldLowC > t.coldHighC)
    fail(t, 'cold junction', `type ${t.type}: the cold-junction range ${t.coldLowC} .. ${t.coldHighC} degC must lie inside the reference function's ${+lowC.toFixed(2)} .. ${+highC.toFixed(2)} degC`);
  if (!(Number.isFinite(t.gain) && t.gain > 0)) fail(t, 'gain', `must be a positive number, got ${t.gain}`);
  if (!(Number.isFinite(t.referenceV) && t.referenceV > 0)) fail(t, 'reference', `must be a positive voltage, got ${t.referenceV}`);
  if (!Number.isFinite(t.outputOffsetV)) fail(t, 'offset', `must be a finite voltage, got ${t.outputOffsetV}`);
  if (!Number.isInteger(t.coldScale) || t.coldScale < 1 || t.coldScale > 10000) fail(t, 'cold junction', `output scale must be an integer 1..10000, got ${t.coldScale}`);
  const qHigh = emfMicrovolts(t.type, t.hotHighC);
  const qLow = emfMicrovolts(t.type, t.hotLowC);
  // The EMF must rise over the range for the inverse to exist (type B's falls slightly below ~42 degC).
  if (!(qHigh > qLow) || emfMicrovolts(t.type, t.hotLowC + 0.01) <= qLow)
    fail(t, 'range', `type ${t.type}: the EMF does not rise over ${t.hotLowC} .. ${t.hotHighC} degC, so it has no inverse there; start the range higher`);
  const lowV = Math.round(t.coldLowC * t.coldScale);
  const highV = Math.round(t.coldHighC * t.coldScale);
  const coldBits = t.coldBits ?? (lowV >= -32768 && highV <= 32767 ? 16 : 32);
  const lsbV = t.referenceV / 2 ** t.adcBits;
  const coldName = t.coldChannel ? `channel ${t.coldChannel}` : 'the cold-junction channel';
  return {
    channelName: t.channelName,
    bits: t.adcBits,
    qPerCode: (lsbV / t.gain) * 1e6,
    qAtZero: (-t.outputOffsetV / t.gain) * 1e6,
    qName: 'thermocouple EMF',
    qUnit: 'uV',
    qLow,
    qHigh,
    celsiusAtQ: (q) => kelvinAtEmf(t.type, q * 1e-6) - ZERO_C_K,
    compensation: {
      param: 'cj',
      describe: [
        `Type ${t.type} thermocouple (ITS-90 reference functions, NIST Monograph 175), hot junction ${t.hotLowC} .. ${t.hotHighC} degC;`,
        `amplifier gain ${t.gain}, output offset ${t.outputOffsetV} V; ADC reference ${t.referenceV} V.`,
        `Call ${coldName}'s conversion first and pass its result as cj (cold-junction temperature`,
        `in 1/${t.coldScale} degC, designed for ${t.coldLowC} .. ${t.coldHighC} degC); check that channel's status too.`,
      ],
      low: lowV,
      high: highV,
      scale: t.coldScale,
      bits: coldBits,
      qAt: (v) => emfMicrovolts(t.type, v / t.coldScale),
    },
    ...(t.faultBelow !== undefined ? { faultBelow: t.faultBelow } : {}),
    ...(t.faultAbove !== undefined ? { faultAbove: t.faultAbove } : {}),
    outputScale: t.outputScale,
    errorTarget: t.errorTarget,
    method: t.method ?? 'auto',
    optimise: t.optimise ?? 'balanced',
    specHash: t.specHash,
    ...(t.note !== undefined ? { note: t.note } : {}),
  };
}

/** Default code error of a thermocouple channel when the spec states none, degC: a rule of ours (well under the tightest IEC 60584-1 class, 0.5 degC). */
export const TC_CODE_ERROR_C = 0.1;

/**
 * The kind's `conversionInput`: a thermocouple channel of the spec as the two-input generator's
 * input. Removes the amplifier's nominal gain and output offset and the open-detection offset the
 * model adds (model.ts); the cold-junction range and output unit are its channel's own.
 */
export function tcConversionInput(r: ChannelResult, ctx: ConversionContext): CompensatedInput {
  const c = r.channel;
  const s = c.sensor as ThermocoupleDef;
  const cj = coldJunctionChannel(c);
  const own = ctx.options(c);
  const cold = ctx.options(cj);
  if (c.oversamplingBits) throw new CodegenInputError(c.name, 'oversamplingBits', 'the thermocouple conversion takes one ADC reading; oversampling is not generated for it yet');
  const gain = c.amplifier?.gain ?? 1;
  const offsetV = (c.amplifier?.offsetVolts ?? 0) + gain * detectVolts(c);
  const coldLowC = cj.lowK - ZERO_C_K;
  const coldHighC = cj.highK - ZERO_C_K;
  // The cold-junction function pins its output near its range ends (within its code error): a
  // margin of that error keeps an in-range reading from being taken as out of range.
  const margin = (cold.errorC ?? 0.02) + 1 / cold.outputScale;
  // Its C type: int16_t while its outputs fit (codegen/design.ts picks the same way, with room for a two-point trim).
  const trimFactor = cj.calibration?.mode === 'two-point' ? 2 : 1;
  const coldMax = Math.max(Math.abs(coldLowC), Math.abs(coldHighC)) + 60;
  const coldBits: 16 | 32 = coldMax * cold.outputScale * trimFactor + 2 <= 32767 ? 16 : 32;
  // Codes a working thermocouple can give: hot range against the cold-junction range.
  const lsb = c.adc.reference.value / 2 ** c.adc.bits;
  const volts = (hotK: number, coldK: number) => gain * (emf(s.params.type, hotK) - emf(s.params.type, coldK)) + offsetV;
  const code = (v: number) => Math.min(2 ** c.adc.bits - 1, Math.max(0, Math.floor(v / lsb)));
  const codeMin = code(volts(c.lowK, cj.highK));
  const codeMax = code(volts(c.highK, cj.lowK));
  const faults = sensorFaults(c, codeMin, codeMax);
  const limits = faultLimits(faults, Math.max(1, codeMin), Math.min(2 ** c.adc.bits - 2, codeMax), 0);
  const notes = [
    ...ctx.notes,
    ...faults.map((f) => `${f.what[0]!.toUpperCase()}${f.what.slice(1)}: ADC code ${f.code}${f.distinct ? '' : ' (a temperature of the range gives it too: cannot be told apart)'}; assumes ${f.assumption}.`),
    ...(own.floatVariant ? ['No float variant is generated for a thermocouple channel.'] : []),
    ...(c.calibration && c.calibration.mode !== 'none' ? ['The board calibration of the spec is not applied by this code: trim the result in your firmware.'] : []),
  ];
  return thermocoupleConversionInput({
    channelName: c.name,
    type: s.params.type,
    gain,
    outputOffsetV: offsetV,
    adcBits: c.adc.bits,
    referenceV: c.adc.reference.value,
    hotLowC: c.lowK - ZERO_C_K,
    hotHighC: c.highK - ZERO_C_K,
    coldLowC: coldLowC - margin,
    coldHighC: coldHighC + margin,
    coldScale: cold.outputScale,
    coldBits,
    coldChannel: cj.name,
    outputScale: own.outputScale,
    errorTarget: own.errorC ?? TC_CODE_ERROR_C,
    method: own.method,
    optimise: own.optimise,
    ...limits,
    specHash: ctx.specHash,
    note: notes.join(' '),
  });
}
