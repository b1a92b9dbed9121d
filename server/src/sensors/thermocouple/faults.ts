// Faults of a thermocouple channel. Open thermocouple: the detection current (the channel's bias)
// has nowhere to go but the amplifier input, which it drives up until the amplifier's output sits at
// its upper swing (full scale without a stated swing). Shorted at the terminals (a pinched cable):
// the short becomes the hot junction, so the channel reads the terminals' own temperature, the cold
// junction: no EMF, the amplifier's output offset alone.
import type { ChannelDef } from '../../model/types';
import type { FaultVolts } from '../../analysis/sensor-faults';
import { tcChannel } from './types';

export function tcFaultVolts(c: ChannelDef): FaultVolts[] {
  const t = tcChannel(c);
  const scheme = c.bias.kind === 'current' ? 'the burnout current' : 'the pull-up';
  return [
    {
      kind: 'open',
      what: 'open thermocouple or lead',
      volts: t.swing && c.amplifier ? t.swing.highV : null,
      assumption: `${scheme} drives the amplifier input up until ${t.swing && c.amplifier ? 'the output sits at its upper swing' : 'the reading is at or above full scale'}`,
    },
    {
      kind: 'short',
      what: 'thermocouple shorted at the terminals',
      volts: c.amplifier?.offsetVolts ?? 0,
      assumption: 'the short is a new hot junction at the terminals, so the channel reads the cold-junction temperature (no EMF, the amplifier\'s output offset alone)',
    },
  ];
}
