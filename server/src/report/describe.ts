// One-line descriptions of a channel's parts, shared by the CLI report and the hover.
import type { ChannelDef } from '../model/types';
import { formatSI } from '../model/read-value';

/** "constant current 20 µA", "resistor 270 kΩ from 3.3 V", "divider, fixed 10 kΩ above the sensor from 3.3 V (ratiometric)". */
export function describeBias(c: ChannelDef): string {
  const b = c.bias;
  const second = c.secondBias;
  if (second) {
    // Two-current (delta-VBE) channel: the same junction read at two bias settings.
    const one = (x: typeof second) => (x.kind === 'current' ? formatSI(x.amps.value, 'A') : `${formatSI(x.ohms.value, 'Ω')} from ${formatSI(x.supply.value, 'V')}`);
    return `two currents, ${one(b)} and ${one(second)} (difference read)`;
  }
  if (b.kind === 'current') return `constant current ${formatSI(b.amps.value, 'A')}`;
  const head = b.kind === 'divider' ? `divider, fixed ${formatSI(b.ohms.value, 'Ω')} ${b.position} the sensor` : `resistor ${formatSI(b.ohms.value, 'Ω')}`;
  return `${head} from ${formatSI(b.supply.value, 'V')}${c.ratiometric ? ' (ratiometric)' : ''}`;
}

/** "junction 'generic_npn' (npn)", "rtd 'chamber_pt' (platinum)". */
export function describeSensor(c: ChannelDef): string {
  return `${c.sensor.kind} '${c.sensor.name}' (${c.sensor.params.kind})`;
}
