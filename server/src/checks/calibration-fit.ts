// calibration-outlier: a measured calibration point that the model, fitted to the other points,
// misses by more than the tolerance (calibration/fit.ts).
import type { CheckContext } from './context';
import { trimNumber } from './format';
import { fitMeasured } from '../calibration/fit';

export function checkCalibrationFit({ channel: c, sink }: CheckContext): void {
  if (!c.measured || c.measured.length === 0) return;
  const fit = fitMeasured(c);
  if (!fit || fit.outlier === null) return;
  const p = fit.points[fit.outlier]!;
  const m = c.measured[fit.outlier]!;
  sink.report('calibration-outlier', c.file, m.span,
    `code ${trimNumber(p.code, 6)} at ${trimNumber(p.celsius, 4)} °C disagrees with the other measured points: the model fitted to them reports ${trimNumber(p.celsius + p.leaveOneOutK!, 4)} °C for it (${trimNumber(p.leaveOneOutK!, 3)} K off, tolerance ${trimNumber(p.toleranceK, 3)} K); check the reference thermometer, settling and the code read`,
    { offK: p.leaveOneOutK });
}
