// dynamics-incomplete, response-missed, filter-infeasible: the channel's response and noise targets
// against its sensor's time constant and the firmware filters (analysis/dynamics.ts has the figures).
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { channelDynamics } from '../analysis/dynamics';

export function checkDynamics({ channel: c, result, sink }: CheckContext): void {
  const d = channelDynamics(result);
  if (!d) return;
  const at = (names: string[]) => fieldSpan(c, names.find((n) => c.fieldSpans[n]) ?? 'time_constant');
  if (d.missing.length > 0) {
    const asked = ['settling', 'ramp_lag', 'noise_limit', 'sample_period', 'time_constant'].filter((n) => c.fieldSpans[n]);
    sink.report('dynamics-incomplete', c.file, at(asked),
      `channel '${c.name}' states ${asked.join(', ')} but the dynamics figures also need ${d.missing.join('; ')}: no filter is chosen and the response is not checked until then`);
    return;
  }
  if (!d.shortfall) return;
  if (d.shortfall.kind === 'response') {
    sink.report('response-missed', c.file, at(['ramp_lag', 'settling']), `channel '${c.name}': ${d.shortfall.message}`);
  } else {
    sink.report('filter-infeasible', c.file, at(['noise_limit']), `channel '${c.name}': ${d.shortfall.message}`);
  }
}
