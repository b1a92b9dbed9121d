// Hover of an rtd definition. alpha = (R100 - R0) / (100 °C · R0), the mean temperature coefficient
// over 0..100 °C defined in IEC 60751 (0.00385 /°C for the standard's coefficients); class tolerance
// ±(a + b|t|) from physics/callendar-van-dusen.ts (IEC 60751 table, from memory).
import type { Analysis } from '../../analysis/result';
import { classToleranceC, cvdResistance, RTD_CLASSES } from '../../physics/callendar-van-dusen';
import * as f from '../../analysis/figures';
import { dissipation, endsTable, sci, tol } from '../resistive/hover';
import type { RtdDef } from './types';

/** Mean temperature coefficient between 0 °C and 100 °C: (R100 - R0) / (100 · R0), 1/°C. */
export function rtdAlpha(s: RtdDef): number {
  const r0 = s.params.R0;
  return (cvdResistance(r0, s.params, 100) - r0) / (100 * r0);
}

export function rtdHover(a: Analysis, s: RtdDef): string {
  const p = s.params;
  const cls = s.toleranceClass;
  const r0 = p.R0;
  const nominal = r0 === 100 || r0 === 1000 ? `, Pt${r0}` : '';
  const classLine = cls
    ? (() => {
      const k = RTD_CLASSES[cls];
      return `IEC 60751 class ${cls}: ±(${k.a} + ${k.b}|t|) °C, ±${f.trimNumber(classToleranceC(cls, 0), 3)} °C at 0 °C; ` +
        `valid ${k.wireLowC} .. ${k.wireHighC} °C wire-wound, ${k.filmLowC} .. ${k.filmHighC} °C film (from memory)`;
    })()
    : 'No IEC 60751 class stated';
  return [
    `**rtd ${s.name}** (platinum${nominal})`,
    `R0 ${f.ohms(r0)}${tol(s.r0.tolerance)}; Callendar-Van Dusen A ${sci(p.A)} /°C, B ${sci(p.B)} /°C², C ${sci(p.C)} /°C⁴ (below 0 °C)`,
    `α = (R100 − R0)/(100 °C · R0) = ${f.trimNumber(rtdAlpha(s), 5)} /°C (R100 ${f.ohms(cvdResistance(r0, p, 100))})`,
    classLine,
    `Rated ${f.kelvinToCelsius(s.ratedLowK)} .. ${f.kelvinToCelsius(s.ratedHighK)}; ${dissipation(s.thetaJA)}`,
    endsTable(a, s, cls ? (c) => `±${f.trimNumber(classToleranceC(cls, c), 3)} °C` : undefined),
  ].join('\n\n');
}
