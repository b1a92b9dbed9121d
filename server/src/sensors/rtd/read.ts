// Reads an rtd block: R0, the Callendar-Van Dusen coefficients (IEC 60751 by default), the class and
// element build, rated range and dissipation; the curve must rise and invert over the rated range.
import type { BlockReader } from '../../model/block-reader';
import { trimNumber } from '../../model/read-value';
import { CVD_HIGH_C, CVD_LOW_C, IEC60751, cvdCelsiusAt, cvdResistance, type RtdClass } from '../../physics/callendar-van-dusen';
import { shown } from '../../diagnostics/shown';
import type { DefBase } from '../../model/types';
import { readDissipation } from '../resistive/read';
import type { RtdDef } from './types';

const ZERO_C = 273.15;

export function readRtd(r: BlockReader, base: DefBase): RtdDef | null {
  const r0 = r.quantity('r0');
  const A = r.quantity('cvd_a', IEC60751.A);
  const B = r.quantity('cvd_b', IEC60751.B);
  const C = r.quantity('cvd_c', IEC60751.C);
  const cls = r.terms('class') ? (r.choice('class', 'B') as RtdClass) : null;
  const element = r.terms('element') ? (r.choice('element', 'film') as 'film' | 'wire') : null;
  const rated = r.range('rated', [CVD_LOW_C + ZERO_C, CVD_HIGH_C + ZERO_C]);
  const theta = readDissipation(r, 2.5e-3);
  if (!r.ok || !r0 || !A || !B || !C || !rated || theta === null) return null;
  const k = { A: A.value, B: B.value, C: C.value };
  // The curve must rise over the rated range (dR/dt > 0) for the reading to have one temperature.
  const name = r.ref.node.name;
  const tLow = rated.low - ZERO_C;
  const tHigh = rated.high - ZERO_C;
  if (!(k.A > 0) || !(k.A + 2 * k.B * tHigh > 0) || !(k.A + 2 * k.B * tLow > 0) || !(cvdResistance(r0.value, k, tLow) > 0)) {
    r.sink.report('out-of-domain', r.ref.file, name.span, `rtd '${shown(name.text)}': with these coefficients the resistance does not rise steadily and stay positive over the rated ${trimNumber(tLow, 4)} °C .. ${trimNumber(tHigh, 4)} °C`);
    return null;
  }
  if (!Number.isFinite(cvdCelsiusAt(r0.value, k, cvdResistance(r0.value, k, tHigh)))) {
    r.sink.report('out-of-domain', r.ref.file, name.span, `rtd '${shown(name.text)}': the coefficients cannot be inverted at ${trimNumber(tHigh, 4)} °C`);
    return null;
  }
  return { kind: 'rtd', ...base, params: { kind: 'platinum', R0: r0.value, ...k }, r0, toleranceClass: cls, element, ratedLowK: rated.low, ratedHighK: rated.high, thetaJA: theta };
}
