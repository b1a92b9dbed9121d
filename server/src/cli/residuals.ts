// The measured points' residual table, one rendering for `report` and `budget`.
import { escapeControls, fixedNumber, OUTLIER_RULE, residualRows, trimNumber, type ChannelDef } from '../engine';
import { table } from './text';
import { shown } from './verb';

/** The measured points' residuals (the spec's own and the bench data's), when the channel fits them. */
export function residualReport(c: ChannelDef): string {
  const res = residualRows(c);
  if (!res) return '';
  const { fit, rows } = res;
  const info = c.benchInfo;
  const from = info ? ` (bench data ${shown(c.benchData!.path)}: ${info.rows} rows, ${info.skipped} left out${info.otherBoards ? `, ${info.otherBoards} of other boards` : ''})` : '';
  const head = [
    '',
    '',
    `Measured points${from}: fit ${Object.entries(fit.parameters).map(([k, v]) => `${k} = ${trimNumber(v, 5)}`).join(', ')}, rms residual ${trimNumber(fit.rmsK, 3)} K`,
    `  residual: the fitted model's temperature for the code minus the reference; others' fit: the same with the model fitted to the other points.`,
    `  outliers: ${OUTLIER_RULE}.`,
    '',
  ];
  const body = rows.map((p) => [escapeControls(p.source), fixedNumber(p.celsius, 2), String(p.code), fixedNumber(p.residualK, 3), p.leaveOneOutK === null ? '-' : fixedNumber(p.leaveOneOutK, 3), fixedNumber(p.toleranceK, 3), p.outlier ? 'outlier' : '']);
  return head.join('\n') + table(['point', '°C', 'code', 'residual K', "others' fit K", 'tolerance K', ''], body);
}
