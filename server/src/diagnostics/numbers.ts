// Numbers as users read them. Imports nothing, so the plot panel's browser bundle can use it too.
/**
 * What every output shows for a figure that could not be computed: trimNumber, fixedNumber and
 * formatSI are the one way figures reach users (text, hover, report, comparison, plot labels), and
 * none of them can show NaN, Infinity or -0. JSON keeps numbers (JSON.stringify writes null for a
 * non-finite one, so it stays valid JSON).
 */
export const NO_FIGURE = 'n/a';

/** Formats a base-unit value for messages: 4700 ohm -> "4.7 kΩ". */
export function formatSI(value: number, unit: string, digits = 3): string {
  if (!Number.isFinite(value)) return NO_FIGURE;
  if (value === 0) return `0 ${unit}`;
  const prefixes: [number, string][] = [[1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f'], [1e-18, 'a']];
  const abs = Math.abs(value);
  for (const [scale, p] of prefixes) {
    if (abs >= scale * 0.9995) return `${trimNumber(value / scale, digits)} ${p}${unit}`;
  }
  return `${value.toExponential(digits - 1)} ${unit}`;
}

/** `digits` significant digits, no trailing zeros; never NaN, Infinity or -0. */
export function trimNumber(v: number, digits: number): string {
  if (!Number.isFinite(v)) return NO_FIGURE;
  const r = Number(v.toPrecision(digits));
  // Only a value far outside every stated domain gets here; its digits would say nothing.
  if (Math.abs(r) >= 1e100) return r > 0 ? 'over 1e99' : 'below -1e99';
  return r === 0 ? '0' : String(r);
}

/** A fixed number of decimals (table columns); never NaN, Infinity or -0. */
export function fixedNumber(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return NO_FIGURE;
  const s = v.toFixed(decimals);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}
