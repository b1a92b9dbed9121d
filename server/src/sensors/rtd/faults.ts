// Faults of an RTD channel: an open element or lead (R -> infinity; on 3 and 4 wires an open lead
// of the excitation path, taken the same) and a shorted element or cable (R = 0, uncompensated
// leads still in series), through the channel's source or divider.
import { resistiveChain } from '../resistive/model';
import type { ChannelDef } from '../../model/types';
import { chainFaultVolts } from '../../physics/resistive-chain';
import type { FaultVolts } from '../../analysis/sensor-faults';

export function rtdFaultVolts(c: ChannelDef): FaultVolts[] {
  const v = chainFaultVolts(resistiveChain(c));
  const amp = c.amplifier ? '; the amplifier output is taken as held between 0 V and the reference' : '';
  const wires = c.wiring && c.wiring.wires > 2 ? `; on ${c.wiring.wires} wires an open sense lead is not modelled (it leaves the reading floating)` : '';
  return [
    {
      kind: 'open',
      what: 'open RTD or excitation lead',
      volts: v.open,
      assumption: (v.open === null
        ? 'a current source with no load rises to its compliance voltage, taken as at or above the ADC reference (full scale)'
        : `no current flows in the RTD, so the divider node goes to the ${c.bias.kind === 'divider' && c.bias.position === 'below' ? 'ground' : 'supply'} side`) + amp + wires,
    },
    { kind: 'short', what: 'shorted RTD or cable', volts: v.short, assumption: `the element reads 0 ohm, the uncompensated lead resistance still in series${amp}` },
  ];
}
