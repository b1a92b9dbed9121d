// supply-too-low: with the resistor shorted, can the supply push the window's minimum current
// through the junction at the cold end (where the junction voltage is highest)?
import { operatingPoint } from './physics';
import type { CheckContext } from '../../checks/context';
import { fmtA, fmtC, fmtV } from '../../checks/format';
import type { JunctionDef } from './types';

export function checkSupply({ channel: c, sink, reported }: CheckContext): void {
  if (c.bias.kind !== 'resistor') return;
  const need = operatingPoint((c.sensor as JunctionDef).params, { kind: 'current', amps: c.windowLowA }, c.lowK).volts;
  const supply = c.bias.supply.value;
  if (supply > need) return;
  reported.add('supply-too-low');
  sink.report('supply-too-low', c.file, c.bias.supply.span,
    `supply ${fmtV(supply)} cannot forward-bias the junction: it needs more than ${fmtV(need)} for ${fmtA(c.windowLowA)} at ${fmtC(c.lowK - 273.15)}; raise the supply or bias with a current source`,
    { neededVolts: need });
}
