// Faults of a junction channel (diode or transistor): what the ADC pin sees with the junction (or
// one of its leads) open, or shorted. Pure function of the resolved channel.
import type { ChannelDef } from '../../model/types';
import type { FaultVolts } from '../../analysis/sensor-faults';

const COMPLIANCE = 'a current source with no load rises to its compliance voltage, taken as at or above the ADC reference (full scale)';

export function junctionFaultVolts(c: ChannelDef): FaultVolts[] {
  const b = c.bias;
  if (c.secondBias) {
    // Two readings at two currents, the difference converted: an open junction puts both readings
    // at the same rail (the supply through the resistor, or the source's compliance), a short puts
    // both at 0 V; either way the difference is 0 V.
    return [
      { kind: 'open', what: 'open junction or lead', volts: 0, assumption: 'both readings sit at the same rail, so their difference is 0 V' },
      { kind: 'short', what: 'shorted junction or leads', volts: 0, assumption: 'both readings are 0 V, so their difference is 0 V' },
    ];
  }
  const open: FaultVolts = b.kind === 'current'
    ? { kind: 'open', what: 'open junction or lead', volts: null, assumption: COMPLIANCE }
    : { kind: 'open', what: 'open junction or lead', volts: b.supply.value, assumption: 'no current flows, so the bias resistor pulls the ADC pin to the supply (ADC input current neglected)' };
  return [open, { kind: 'short', what: 'shorted junction or leads', volts: 0, assumption: 'the ADC pin is tied to ground' }];
}
