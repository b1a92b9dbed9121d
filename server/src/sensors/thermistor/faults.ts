// Faults of a thermistor channel: an open element or lead (R -> infinity) and a shorted element or
// cable (R = 0, uncompensated leads still in series), through the channel's divider or source.
import { resistiveChain } from '../resistive/model';
import type { ChannelDef } from '../../model/types';
import { chainFaultVolts } from '../../physics/resistive-chain';
import type { FaultVolts } from '../../analysis/sensor-faults';

export function thermistorFaultVolts(c: ChannelDef): FaultVolts[] {
  const v = chainFaultVolts(resistiveChain(c));
  const amp = c.amplifier ? '; the amplifier output is taken as held between 0 V and the reference' : '';
  return [
    {
      kind: 'open',
      what: 'open thermistor or lead',
      volts: v.open,
      assumption: v.open === null
        ? `a current source with no load rises to its compliance voltage, taken as at or above the ADC reference (full scale)${amp}`
        : `no current flows in the thermistor, so the divider node goes to the ${c.bias.kind === 'divider' && c.bias.position === 'below' ? 'ground' : 'supply'} side${amp}`,
    },
    { kind: 'short', what: 'shorted thermistor or cable', volts: v.short, assumption: `the thermistor reads 0 ohm, the uncompensated lead resistance still in series${amp}` },
  ];
}
