// Hover of a thermistor definition: its curve as given, the Steinhart-Hart coefficients it is held
// in (1/T = A + B ln R + C (ln R)^3), rated range, dissipation, and R at the range ends of its channels.
import type { Analysis } from '../../analysis/result';
import * as f from '../../analysis/figures';
import { dissipation, endsTable, sci, tol } from '../resistive/hover';
import type { ThermistorDef } from './types';

export function thermistorHover(a: Analysis, s: ThermistorDef): string {
  const p = s.params;
  const curve = s.form === 'beta' && s.beta
    ? `R25 ${f.ohms(s.r25.value)}${tol(s.r25.tolerance)}; β ${f.trimNumber(s.beta.value, 5)} K${tol(s.beta.tolerance)} (between ${f.kelvinToCelsius(s.beta.lowK)} and ${f.kelvinToCelsius(s.beta.highK)})`
    : `R at 25 °C ${f.ohms(s.r25.value)}${tol(s.r25.tolerance)}; curve from ${s.form === 'points' ? 'three measured points (exact Steinhart-Hart fit)' : 'Steinhart-Hart coefficients'}`;
  return [
    `**thermistor ${s.name}** (NTC)`,
    curve,
    `Steinhart-Hart: A ${sci(p.A)}, B ${sci(p.B)}, C ${sci(p.C)} (1/T = A + B ln R + C (ln R)³, R in Ω)`,
    `Rated ${f.kelvinToCelsius(s.ratedLowK)} .. ${f.kelvinToCelsius(s.ratedHighK)}; ${dissipation(s.thetaJA)}`,
    endsTable(a, s),
  ].join('\n\n');
}
