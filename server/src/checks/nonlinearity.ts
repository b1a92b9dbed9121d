// nonlinearity: a straight-line conversion's worst deviation against the accuracy target.
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { trimNumber } from './format';

export function checkNonlinearity({ channel: c, result, sink }: CheckContext): void {
  if (c.conversion !== 'line' || c.accuracyK === null) return;
  const nl = result.summary.nonlinearity.bestFitK;
  if (nl <= c.accuracyK) return;
  sink.report('nonlinearity', c.file, fieldSpan(c, 'conversion'),
    `a best-fit straight line deviates by up to ${trimNumber(nl, 3)} K over the range, more than the ±${trimNumber(c.accuracyK, 3)} K target; use \`conversion = table\` or narrow the range`);
}
