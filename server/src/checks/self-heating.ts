// self-heating: dissipation times thermal resistance against a share of the accuracy target.
import type { CheckContext } from './context';
import { fmtC, trimNumber } from './format';

/** Share of the accuracy target that self-heating may take (a design rule of ours). */
export const SELF_HEATING_SHARE = 0.1;

export function checkSelfHeating({ channel: c, result, sink }: CheckContext): void {
  if (c.accuracyK === null) return;
  const rise = result.summary.selfHeatingMaxK;
  const limit = SELF_HEATING_SHARE * c.accuracyK;
  if (rise <= limit) return;
  const at = result.summary.at.selfHeatingMax;
  sink.report('self-heating', c.file, c.bias.span,
    `self-heating is ${trimNumber(rise * 1000, 3)} mK at ${fmtC(at.celsius)} (${trimNumber(at.volts * at.amps * 1e3, 3)} mW × ${trimNumber(c.thetaJA, 4)} K/W), over ${SELF_HEATING_SHARE * 100} % of the ±${trimNumber(c.accuracyK, 3)} K target (${trimNumber(limit * 1000, 3)} mK); lower the bias current or improve the thermal path`);
}
