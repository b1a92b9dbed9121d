// The spreads of a resistive sensor element as error-budget contributors, and a sensor perturbed by
// drawn values of them. Thermistor: R (R25 or r_tolerance) and beta; the beta form's curve is rebuilt
// from the drawn beta (steinhart-hart.ts), every form scales its resistance by the drawn R.
// RTD: R0 (the stated r0 tolerance plus the class's a, as a relative R0 error a x A) and the slope
// (the class's b as a relative error of A, since a change e of A moves the reading by about e t):
// our reading of the IEC 60751 class formula a + b|t| as two physical spreads.
import { trimNumber } from '../model/read-value';
import type { RtdDef, ThermistorDef } from '../model/types';
import { betaToSteinhartHart } from '../physics/steinhart-hart';
import { RTD_CLASSES } from '../physics/callendar-van-dusen';

export interface ElementContributor {
  id: string;
  label: string;
  /** Relative half-width. */
  amount: number;
}

const pct = (r: number) => `± ${trimNumber(r * 100, 3)} %`;

export function elementContributors(s: ThermistorDef | RtdDef): ElementContributor[] {
  const out: ElementContributor[] = [];
  if (s.kind === 'thermistor') {
    out.push({ id: 'element-R', label: `${s.form === 'beta' ? 'R25' : 'thermistor R'} ${pct(s.r25.tolerance)}`, amount: s.r25.tolerance });
    if (s.beta) out.push({ id: 'element-beta', label: `beta ${pct(s.beta.tolerance)}`, amount: s.beta.tolerance });
  } else {
    const cls = s.toleranceClass ? RTD_CLASSES[s.toleranceClass] : null;
    const r0 = s.r0.tolerance + (cls ? cls.a * s.params.A : 0);
    out.push({ id: 'element-R0', label: `R0 ${pct(r0)}${cls ? ` (class ${s.toleranceClass} at 0 °C${s.r0.tolerance ? ' + stated' : ''})` : ''}`, amount: r0 });
    if (cls) out.push({ id: 'element-slope', label: `class ${s.toleranceClass} slope ${pct(cls.b)}`, amount: cls.b });
  }
  return out.filter((c) => c.amount > 0);
}

/** The element with drawn relative errors (by contributor id; absent ids stay nominal). */
export function perturbElement<S extends ThermistorDef | RtdDef>(s: S, d: ReadonlyMap<string, number>): S {
  if (s.kind === 'thermistor') {
    const t = s as ThermistorDef;
    let params = t.params;
    const db = d.get('element-beta') ?? 0;
    if (t.beta && db !== 0) params = { ...params, ...betaToSteinhartHart(t.r25.value, t.beta.value * (1 + db), 298.15) };
    const dr = d.get('element-R') ?? 0;
    if (dr !== 0) params = { ...params, scale: (params.scale ?? 1) * (1 + dr) };
    return { ...t, params } as S;
  }
  const r = s as RtdDef;
  const d0 = d.get('element-R0') ?? 0;
  const da = d.get('element-slope') ?? 0;
  return { ...r, params: { ...r.params, R0: r.params.R0 * (1 + d0), A: r.params.A * (1 + da) } } as S;
}
