// calibration-outlier: a measured calibration point that the model, fitted to the other points,
// misses by more than the tolerance (calibration/fit.ts), or two points at one temperature whose
// codes disagree. Also: a point outside the sensor's rated range (the model cannot be fitted
// there: an error, so no code is generated from it) and points on a kind the fit does not cover.
import type { CheckContext } from './context';
import { fmtC, trimNumber } from './format';
import { fieldSpan } from './context';
import { sense } from '../analysis/sense';
import { ZERO_CELSIUS_K } from '../physics/constants';
import { fitMeasured, pointSource } from '../calibration/fit';
import { kindOf } from '../sensors/registry';

export function checkCalibrationFit({ channel: c, sink }: CheckContext): void {
  if (!c.measured || c.measured.length === 0) return;
  const s = c.sensor;
  const kind = kindOf(s);
  if (!kind.fit) {
    sink.report('measured-unused', c.file, c.fieldSpans['measured'] ?? c.benchData?.span ?? fieldSpan(c, 'measured'),
      `the measured points are not used on a ${s.kind} channel: the model is not fitted to them, and neither the error budget nor generated code reflects them; state the part's own values (${kind.ownValues ?? 'from its datasheet'}) instead`);
    return;
  }
  let unusable = false;
  for (const m of c.measured) {
    if (m.kelvin < s.ratedLowK || m.kelvin > s.ratedHighK) {
      unusable = true;
      sink.report('out-of-domain', c.file, m.span,
        `measured: the point at ${fmtC(m.kelvin - ZERO_CELSIUS_K)}${pointSource(m)} lies outside the rated range of '${s.name}' (${fmtC(s.ratedLowK - ZERO_CELSIUS_K)} .. ${fmtC(s.ratedHighK - ZERO_CELSIUS_K)}), where the model cannot be fitted; remove the point or correct its temperature`);
    }
  }
  if (unusable) return;
  // Two points at one temperature: they should give codes within the tolerance of each other.
  const lsb = c.adc.reference.value / 2 ** c.adc.bits;
  const tolK = c.accuracyK !== null ? c.accuracyK / 2 : 0.25;
  for (let i = 0; i < c.measured.length; i++) {
    for (let j = 0; j < i; j++) {
      const a = c.measured[j]!;
      const b = c.measured[i]!;
      if (Math.abs(a.kelvin - b.kelvin) > 0.01) continue;
      let slope: number;
      try {
        slope = Math.abs(sense(c, a.kelvin).slope);
      } catch {
        continue;
      }
      const offK = (Math.abs(a.code - b.code) * lsb) / slope;
      if (offK <= Math.max(tolK, (2 * lsb) / slope)) continue;
      sink.report('calibration-outlier', c.file, b.span,
        `codes ${trimNumber(a.code, 6)}${pointSource(a)} and ${trimNumber(b.code, 6)}${pointSource(b)} were both read at ${trimNumber(a.kelvin - ZERO_CELSIUS_K, 4)} °C, ${trimNumber(Math.abs(a.code - b.code), 6)} counts (${trimNumber(offK, 3)} K) apart; at most one is right: check the reference thermometer, settling and the code read`,
        { offK });
      return;
    }
  }
  const fit = fitMeasured(c);
  if (!fit || fit.outlier === null) return;
  const p = fit.points[fit.outlier]!;
  const m = c.measured[fit.outlier]!;
  sink.report('calibration-outlier', c.file, m.span,
    `code ${trimNumber(p.code, 6)} at ${trimNumber(p.celsius, 4)} °C${pointSource(m)} disagrees with the other measured points: the model fitted to them reports ${trimNumber(p.celsius + p.leaveOneOutK!, 4)} °C for it (${trimNumber(p.leaveOneOutK!, 3)} K off, tolerance ${trimNumber(p.toleranceK, 3)} K); check the reference thermometer, settling and the code read`,
    { offK: p.leaveOneOutK });
}
