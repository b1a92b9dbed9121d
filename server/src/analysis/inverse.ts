// Exact model inverse: the temperature at which the channel's sensed voltage equals a value.
// Used by code generation and calibration as the reference every conversion is checked against.
import type { ChannelDef } from '../model/types';
import { sense } from './sense';

/**
 * Kelvin at which the sensed voltage is `volts`, searched in [lowK, highK] (the sensed voltage is
 * monotonic in T for every sensor kind). Bisection to bracket, then secant refinement; returns NaN only when
 * the voltage lies outside the bracket (callers clamp codes to the range first).
 */
export function kelvinAtVolts(c: ChannelDef, volts: number, lowK = c.lowK, highK = c.highK): number {
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
