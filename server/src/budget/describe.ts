// Words for budget settings, shared by diagnostics, hover and the CLI.
import type { CalSetting } from '../analysis/budget-types';
import { trimNumber } from '../diagnostics/numbers';

const c = (k: number) => `${trimNumber(k - 273.15, 4)} °C`;

export function describeSetting(s: CalSetting): string {
  if (s.mode === 'one-point') return `one-point calibration at ${c(s.kelvins[0]!)}`;
  if (s.mode === 'two-point') return `two-point calibration at ${c(s.kelvins[0]!)} and ${c(s.kelvins[1]!)}`;
  return 'no calibration';
}

/** What the two share columns are, said wherever they are shown. */
export const SHARES_EXPLAINED =
  'Swing: the error moved by that input alone at either end of its tolerance; share of swings: that swing over the sum of every input\'s swing at this temperature (a linear share of the worst case, not of the variance); variance share: the Monte Carlo\'s squared correlation of the boards\' error with that input (- where not separable: the calibration readings\' INL is under the INL).';
