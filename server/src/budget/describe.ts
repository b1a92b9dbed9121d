// Words for budget settings, shared by diagnostics, hover and the CLI.
import type { CalSetting } from './types';
import { trimNumber } from '../model/read-value';

const c = (k: number) => `${trimNumber(k - 273.15, 4)} °C`;

export function describeSetting(s: CalSetting): string {
  if (s.mode === 'one-point') return `one-point calibration at ${c(s.kelvins[0]!)}`;
  if (s.mode === 'two-point') return `two-point calibration at ${c(s.kelvins[0]!)} and ${c(s.kelvins[1]!)}`;
  return 'no calibration';
}
