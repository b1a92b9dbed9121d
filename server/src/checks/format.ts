// Number formatting shared by diagnostic messages and hovers.
import { formatSI, trimNumber } from '../model/read-value';

export const fmtV = (v: number) => formatSI(v, 'V');
export const fmtA = (v: number) => formatSI(v, 'A');
export const fmtOhm = (v: number) => formatSI(v, 'Ω');
export const fmtC = (celsius: number) => `${trimNumber(celsius, 4)} °C`;
export { formatSI, trimNumber };
