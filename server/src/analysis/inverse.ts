// Exact model inverse: the temperature at which the channel's sensed voltage equals a value.
// Used by code generation and calibration as the reference every conversion is checked against.
import type { ChannelDef } from '../model/types';
import { sense, resistiveChain } from './sense';
import { chainOhmsAt } from '../physics/resistive-chain';
import { shKelvinAt } from '../physics/steinhart-hart';
import { cvdCelsiusAt } from '../physics/callendar-van-dusen';

/**
 * Kelvin at which the sensed voltage is `volts`, searched in [lowK, highK] (the sensed voltage is
 * monotonic in T for every sensor kind). Bisection to bracket, then secant refinement; returns NaN only when
 * the voltage lies outside the bracket (callers clamp codes to the range first).
 */
export function kelvinAtVolts(c: ChannelDef, volts: number, lowK = c.lowK, highK = c.highK): number {
  if (c.sensor.kind !== 'junction') {
    const k = resistiveKelvinAtVolts(c, volts);
    // Same contract as the search below: NaN outside the bracket (a hair of slack for rounding).
    const slack = 1e-9 * (highK - lowK);
    return k >= lowK - slack && k <= highK + slack ? Math.min(highK, Math.max(lowK, k)) : NaN;
  }
  const f = (k: number) => sense(c, k).volts - volts;
  let a = lowK;
  let b = highK;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (Math.sign(fa) === Math.sign(fb)) return NaN;
  // Illinois variant of regula falsi (Dowell & Jarratt, BIT 11, 1971): superlinear, always bracketed.
  let side = 0;
  for (let i = 0; i < 200; i++) {
    const m = (a * fb - b * fa) / (fb - fa);
    const fm = f(m);
    if (Math.abs(b - a) < 1e-12 * Math.max(1, Math.abs(m)) || fm === 0) return m;
    if (Math.sign(fm) === Math.sign(fb)) {
      b = m;
      fb = fm;
      if (side === -1) fa /= 2;
      side = -1;
    } else {
      a = m;
      fa = fm;
      if (side === 1) fb /= 2;
      side = 1;
    }
  }
  return (a + b) / 2;
}

/**
 * Thermistor and RTD channels in closed form: voltage -> sensor resistance (the excitation and the
 * amplifier undone, resistive-chain.ts), then resistance -> temperature: the Steinhart-Hart equation
 * itself for a thermistor, the Callendar-Van Dusen inverse for an RTD (quadratic root at and above
 * 0 °C, Newton on the full equation below; callendar-van-dusen.ts). NaN when no resistance fits.
 */
export function resistiveKelvinAtVolts(c: ChannelDef, volts: number): number {
  const s = c.sensor;
  if (s.kind === 'junction') return NaN;
  const ohms = chainOhmsAt(resistiveChain(c), volts);
  if (!(ohms > 0)) return NaN;
  return s.kind === 'thermistor' ? shKelvinAt(s.params, ohms / (s.params.scale ?? 1)) : cvdCelsiusAt(s.params.R0, s.params, ohms) + 273.15;
}
