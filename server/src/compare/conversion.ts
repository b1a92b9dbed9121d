// A channel of any sensor kind as the code generator's input: in-range codes and the exact model
// inverse at the centre of each code (code + 0.5 LSB, the generator's contract in codegen/types.ts).
import type { ChannelDef } from '../model/types';
import type { ConversionInput } from '../codegen/types';
import { sense } from '../analysis/sense';
import { kelvinAtVolts, resistiveKelvinAtVolts } from '../analysis/inverse';

const ZERO_C = 273.15;

export interface ConversionOptions {
  outputScale?: number;
  errorTarget?: number;
  method?: ConversionInput['method'];
  specHash?: string;
}

/** The generator's input for a channel, or a message when the channel has no in-range code. */
export function conversionInputFor(c: ChannelDef, o: ConversionOptions = {}): ConversionInput | string {
  const bits = c.adc.bits;
  const lsb = c.adc.reference.value / 2 ** bits;
  const a = sense(c, c.lowK).volts;
  const b = sense(c, c.highK).volts;
  const top = 2 ** bits - 1;
  const codeLow = Math.max(0, Math.ceil(Math.min(a, b) / lsb - 0.5));
  const codeHigh = Math.min(top, Math.floor(Math.max(a, b) / lsb - 0.5));
  if (!(codeHigh > codeLow)) return `channel '${c.name}' spans fewer than two ADC codes over its range`;
  // Resistive sensors invert in closed form and stay exact a little past the range's ends; a junction
  // uses the bracketed search with a margin.
  const celsiusAtCode = c.sensor.kind === 'junction'
    ? (code: number) => kelvinAtVolts(c, (code + 0.5) * lsb, c.lowK - 30, c.highK + 30) - ZERO_C
    : (code: number) => resistiveKelvinAtVolts(c, (code + 0.5) * lsb) - ZERO_C;
  return {
    channelName: c.name,
    bits,
    codeLow,
    codeHigh,
    celsiusAtCode,
    outputScale: o.outputScale ?? 100,
    errorTarget: o.errorTarget ?? 0.02,
    method: o.method ?? 'auto',
    calibration: { mode: 'none', runtime: false },
    floatVariant: false,
    specHash: o.specHash ?? '00000000',
  };
}
