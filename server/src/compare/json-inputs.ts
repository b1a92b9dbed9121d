// Inputs of thermistor and RTD channels for the JSON report (base SI units), so that a report can
// be checked independently of this tool. Empty for a junction channel.
import type { ChannelDef } from '../model/types';

export function resistiveInputsJson(c: ChannelDef): Record<string, unknown> {
  const s = c.sensor;
  if (s.kind === 'junction') return {};
  const element = s.kind === 'thermistor'
    ? { form: s.form, r25Ohms: s.r25.value, r25Tolerance: s.r25.tolerance, ...(s.beta ? { betaK: s.beta.value, betaTolerance: s.beta.tolerance, betaLowK: s.beta.lowK, betaHighK: s.beta.highK } : {}) }
    : { r0Ohms: s.r0.value, r0Tolerance: s.r0.tolerance, toleranceClass: s.toleranceClass };
  return {
    element,
    ratiometric: c.ratiometric ?? false,
    amplifier: c.amplifier ?? null,
    wiring: c.wiring ? { wires: c.wiring.wires, leadOhms: c.wiring.leadOhms } : null,
    compareGroup: c.compareGroup ?? null,
  };
}
