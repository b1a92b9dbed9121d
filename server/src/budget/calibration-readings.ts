// What a calibration reading adds: the trim is fitted to the board's own readings at the
// calibration temperatures, and those readings are not perfect. Each carries the converter's
// quantisation (± 0.5 LSB, less after oversampling) and its INL at that code, and the reference
// thermometer the board is compared with has its own uncertainty (channel field `cal_reference`).
// A reading error moves the firmware's reported value at that point, a reference error moves the
// "true" value the trim aims at; the trim passes both on to every temperature (one point: as they
// are; two points: weighted by where the temperature lies between the points, larger outside them).
import type { ChannelDef } from '../model/types';
import { trimNumber } from '../model/read-value';
import type { Contributor } from '../analysis/budget-types';

/** Calibration-reading contributors, from the reading ones (their LSB bounds) and the channel's `cal_reference`. */
export function calibrationContributors(c: ChannelDef, reading: Contributor[]): Contributor[] {
  const out: Contributor[] = [];
  for (const r of reading) {
    out.push({ id: `cal-${r.id}`, label: `calibration readings: ${r.label}`, scope: 'calibration', amount: r.amount, unit: r.unit });
  }
  const ref = c.calReferenceK ?? 0;
  if (ref > 0) out.push({ id: 'cal-reference', label: `reference thermometer ± ${trimNumber(ref, 3)} K`, scope: 'calibration', amount: ref, unit: 'K' });
  return out;
}

/** Shifts of one calibration (per calibration point, K): on the reported value and on the reference's. */
export interface CalShift {
  rep: Float64Array;
  ref: Float64Array;
}

/**
 * Every corner of the box of calibration-reading errors of one mode: each point's reported value at
 * either end of its bound (the sum of the chosen LSB contributors, converted with the slope there)
 * and each point's reference at either end. The trim is monotonic in each of these (a straight line
 * through two points moves one way as either point moves), so its extremes are at these corners.
 * `use` picks the contributors (all for the band, one for its one-at-a-time swing).
 */
export function calCorners(cal: Contributor[], use: boolean[], kPerLsbAtPoints: number[]): CalShift[] {
  const J = kPerLsbAtPoints.length;
  let lsb = 0;
  let ref = 0;
  cal.forEach((k, i) => {
    if (!use[i]) return;
    if (k.unit === 'K') ref += k.amount;
    else lsb += k.amount;
  });
  const dims: { j: number; side: 'rep' | 'ref'; bound: number }[] = [];
  for (let j = 0; j < J; j++) {
    const r = lsb * Math.abs(kPerLsbAtPoints[j]!);
    if (r > 0) dims.push({ j, side: 'rep', bound: r });
    if (ref > 0) dims.push({ j, side: 'ref', bound: ref });
  }
  const out: CalShift[] = [];
  for (let idx = 0; idx < 2 ** dims.length; idx++) {
    const s: CalShift = { rep: new Float64Array(J), ref: new Float64Array(J) };
    dims.forEach((d, i) => (s[d.side][d.j] = (idx >> i) & 1 ? d.bound : -d.bound));
    out.push(s);
  }
  return out;
}
