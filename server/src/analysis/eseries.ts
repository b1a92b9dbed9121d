// Preferred resistor values of IEC 60063 (E24 series, 5 %), used to suggest buildable values.
// The 24 mantissas are the standard's E24 list (values from memory, the widely printed table).
export const E24 = [1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1];

/** The E24 value nearest to `ohms` on a logarithmic scale. */
export function nearestE24(ohms: number): number {
  if (!(ohms > 0) || !Number.isFinite(ohms)) return ohms;
  const decade = Math.floor(Math.log10(ohms));
  let best = ohms;
  let bestErr = Infinity;
  for (const d of [decade - 1, decade, decade + 1]) {
    for (const m of E24) {
      // Round to 3 significant digits so that 4.7 * 10^3 is exactly 4700.
      const v = d >= 1 ? Math.round(m * 10) * 10 ** (d - 1) : Math.round(m * 10) / 10 ** (1 - d);
      const err = Math.abs(Math.log(v / ohms));
      if (err < bestErr) {
        bestErr = err;
        best = v;
      }
    }
  }
  return best;
}
