// Exact model inverse: the temperature at which the channel's sensed voltage equals a value.
// Used by code generation and calibration as the reference every conversion is checked against.
import type { ChannelDef } from '../model/types';
import { sense } from './sense';
import { kindOf } from '../sensors/registry';

/**
 * Kelvin at which the sensed voltage is `volts`, searched in [lowK, highK] (the sensed voltage is
 * monotonic in T for every sensor kind). A kind with a closed-form inverse (sensors/kind.ts) answers
 * directly; otherwise bisection to bracket, then secant refinement; returns NaN only when
 * the voltage lies outside the bracket (callers clamp codes to the range first).
 */
export function kelvinAtVolts(c: ChannelDef, volts: number, lowK = c.lowK, highK = c.highK): number {
  const closed = kindOf(c.sensor).kelvinAtVolts;
  if (closed) {
    const k = closed(c, volts);
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
 * The sensor kind's closed-form inverse (thermistor and RTD channels: voltage -> resistance ->
 * temperature, sensors/resistive/model.ts), without the bracket; NaN when the kind has none or no
 * resistance fits.
 */
export function resistiveKelvinAtVolts(c: ChannelDef, volts: number): number {
  return kindOf(c.sensor).kelvinAtVolts?.(c, volts) ?? NaN;
}
