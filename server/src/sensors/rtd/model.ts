// The RTD's element curve (Callendar-Van Dusen, physics/callendar-van-dusen.ts: closed form at and
// above 0 °C, Newton below), its spreads for the error budget and the comparison, and its report
// inputs. Spreads: R0 (the stated r0 tolerance plus the class's a, as a relative R0 error a x A) and
// the slope (the class's b as a relative error of A, since a change e of A moves the reading by
// about e t): our reading of the IEC 60751 class formula a + b|t| as two physical spreads.
import type { ChannelDef } from '../../model/types';
import type { ElementContributor, SensorSpread } from '../kind';
import { RTD_CLASSES, classToleranceC, cvdCelsiusAt, cvdResistance, cvdSlope } from '../../physics/callendar-van-dusen';
import { resistiveModel, elementRangeProblem } from '../resistive/model';
import { pct, spreadOver, trim } from '../resistive/sensor-spread';
import type { RtdDef } from './types';

const ZERO_C = 273.15;

export const rtdModel = resistiveModel<RtdDef>({
  at(s, kelvin) {
    const t = kelvin - 273.15;
    return { ohms: cvdResistance(s.params.R0, s.params, t), slope: cvdSlope(s.params.R0, s.params, t) };
  },
  kelvinAt: (s, ohms) => cvdCelsiusAt(s.params.R0, s.params, ohms) + 273.15,
});

export function rtdRangeProblem(s: RtdDef, lowK: number, highK: number): string | null {
  return elementRangeProblem(s, (k) => cvdResistance(s.params.R0, s.params, k - ZERO_C), lowK, highK);
}

export function rtdContributors(s: RtdDef): ElementContributor[] {
  const out: ElementContributor[] = [];
  const cls = s.toleranceClass ? RTD_CLASSES[s.toleranceClass] : null;
  const r0 = s.r0.tolerance + (cls ? cls.a * s.params.A : 0);
  out.push({ id: 'element-R0', label: `R0 ${pct(r0)}${cls ? ` (class ${s.toleranceClass} at 0 °C${s.r0.tolerance ? ' + stated' : ''})` : ''}`, amount: r0 });
  if (cls) out.push({ id: 'element-slope', label: `class ${s.toleranceClass} slope ${pct(cls.b)}`, amount: cls.b });
  return out.filter((c) => c.amount > 0);
}

export function perturbRtd(r: RtdDef, d: ReadonlyMap<string, number>): RtdDef {
  const d0 = d.get('element-R0') ?? 0;
  const da = d.get('element-slope') ?? 0;
  return { ...r, params: { ...r.params, R0: r.params.R0 * (1 + d0), A: r.params.A * (1 + da) } };
}

/**
 * Corners: the class taken as an R0 spread of a (K at 0 °C, times A) and a slope spread of b (K per
 * K of |t|), plus any R0 tolerance stated on r0.
 */
export function rtdSpread(c: ChannelDef): SensorSpread {
  const s = c.sensor as RtdDef;
  const cls = s.toleranceClass ? RTD_CLASSES[s.toleranceClass] : { a: 0, b: 0 };
  const e0 = cls.a * s.params.A + s.r0.tolerance;
  const eb = cls.b;
  return spreadOver(c, {
    corners: [[-1, -1], [-1, 1], [1, -1], [1, 1]],
    basis: `${s.toleranceClass ? `IEC 60751 class ${s.toleranceClass}` : 'no class stated'}${s.r0.tolerance ? `, R0 ± ${trim(s.r0.tolerance * 100)} %` : ''}`,
    errorAt: (k, [s0, sb]) => {
      const t = k - 273.15;
      const r = rtdModel.element.at(s, k).ohms * (1 + s0! * e0) + s.params.R0 * s.params.A * eb * sb! * t;
      return cvdCelsiusAt(s.params.R0, s.params, r) + 273.15 - k;
    },
  });
}

/** Largest class tolerance at the range ends, K (null without a class). */
export function rtdClassToleranceK(c: ChannelDef): number | null {
  const cls = (c.sensor as RtdDef).toleranceClass;
  if (!cls) return null;
  return Math.max(classToleranceC(cls, c.lowK - 273.15), classToleranceC(cls, c.highK - 273.15));
}

export function rtdElementJson(s: RtdDef): Record<string, unknown> {
  return { r0Ohms: s.r0.value, r0Tolerance: s.r0.tolerance, toleranceClass: s.toleranceClass };
}
