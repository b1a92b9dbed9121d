// The thermistor's element curve (Steinhart-Hart, physics/steinhart-hart.ts), its spreads for the
// error budget and the comparison, and its report inputs.
// Spreads: R (R25 or r_tolerance) and beta; the beta form's curve is rebuilt from the drawn beta
// (steinhart-hart.ts), every form scales its resistance by the drawn R.
import type { ChannelDef } from '../../model/types';
import type { ElementContributor, SensorSpread } from '../kind';
import { betaToSteinhartHart, shKelvinAt, shResistanceAt, shResistanceSlope } from '../../physics/steinhart-hart';
import { resistiveModel, elementRangeProblem } from '../resistive/model';
import { pct, spreadOver, trim } from '../resistive/sensor-spread';
import type { ThermistorDef } from './types';

const T25 = 298.15;

export const thermistorModel = resistiveModel<ThermistorDef>({
  at(s, kelvin) {
    const k = s.params.scale ?? 1;
    return { ohms: k * shResistanceAt(s.params, kelvin), slope: k * shResistanceSlope(s.params, kelvin) };
  },
  kelvinAt: (s, ohms) => shKelvinAt(s.params, ohms / (s.params.scale ?? 1)),
});

export function thermistorRangeProblem(s: ThermistorDef, lowK: number, highK: number): string | null {
  return elementRangeProblem(s, (k) => shResistanceAt(s.params, k), lowK, highK);
}

export function thermistorContributors(s: ThermistorDef): ElementContributor[] {
  const out: ElementContributor[] = [];
  out.push({ id: 'element-R', label: `${s.form === 'beta' ? 'R25' : 'thermistor R'} ${pct(s.r25.tolerance)}`, amount: s.r25.tolerance });
  if (s.beta) out.push({ id: 'element-beta', label: `beta ${pct(s.beta.tolerance)}`, amount: s.beta.tolerance });
  return out.filter((c) => c.amount > 0);
}

export function perturbThermistor(t: ThermistorDef, d: ReadonlyMap<string, number>): ThermistorDef {
  let params = t.params;
  const db = d.get('element-beta') ?? 0;
  if (t.beta && db !== 0) params = { ...params, ...betaToSteinhartHart(t.r25.value, t.beta.value * (1 + db), 298.15) };
  const dr = d.get('element-R') ?? 0;
  if (dr !== 0) params = { ...params, scale: (params.scale ?? 1) * (1 + dr) };
  return { ...t, params };
}

/**
 * Corners: R x (1 ± tol) and beta x (1 ± tol), where a beta error changes R by
 * exp(beta dBeta (1/T - 1/T25)) (the beta model).
 */
export function thermistorSpread(c: ChannelDef): SensorSpread {
  const s = c.sensor as ThermistorDef;
  const eR = s.r25.tolerance;
  const eB = s.beta?.tolerance ?? 0;
  const beta = s.beta?.value ?? 0;
  return spreadOver(c, {
    corners: [[-1, -1], [-1, 1], [1, -1], [1, 1]],
    basis: `R ± ${trim(eR * 100)} %` + (s.beta ? `, beta ± ${trim(eB * 100)} %` : ''),
    errorAt: (k, [sr, sb]) => {
      const r = thermistorModel.element.at(s, k).ohms * (1 + sr! * eR) * Math.exp(beta * sb! * eB * (1 / k - 1 / T25));
      return shKelvinAt(s.params, r) - k;
    },
  });
}

export function thermistorElementJson(s: ThermistorDef): Record<string, unknown> {
  return { form: s.form, r25Ohms: s.r25.value, r25Tolerance: s.r25.tolerance, ...(s.beta ? { betaK: s.beta.value, betaTolerance: s.beta.tolerance, betaLowK: s.beta.lowK, betaHighK: s.beta.highK } : {}) };
}
