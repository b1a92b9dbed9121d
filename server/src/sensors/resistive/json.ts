// Inputs of thermistor and RTD channels for the JSON report (base SI units), so that a report can
// be checked independently of this tool. `element`: the kind's own element figures.
import type { ChannelDef } from '../../model/types';

export function resistiveInputsJson(c: ChannelDef, element: Record<string, unknown>): Record<string, unknown> {
  return {
    element,
    ratiometric: c.ratiometric ?? false,
    amplifier: c.amplifier ?? null,
    wiring: c.wiring ? { wires: c.wiring.wires, leadOhms: c.wiring.leadOhms } : null,
    compareGroup: c.compareGroup ?? null,
  };
}
