// source-impedance: impedance of the sensor node against the ADC's stated maximum.
// A capacitor Cext at the pin recharges the sample capacitor Cs; charge sharing leaves an error of
// V * Cs / (Cs + Cext), within half an LSB when Cext >= Cs * (2^(bits+1) - 1) (charge conservation).
import type { CheckContext } from './context';
import { fieldSpan } from './context';
import { fmtOhm, formatSI } from './format';

export function checkSourceImpedance({ channel: c, result, sink }: CheckContext): void {
  const max = c.adc.maxSourceOhms;
  if (max === null) return;
  const z = result.summary.sourceOhmsMax;
  if (z <= max) return;
  const cs = c.adc.sampleFarads;
  const cap = cs !== null ? cs * (2 ** (c.adc.bits + 1) - 1) : null;
  const fix = cap !== null
    ? `add a capacitor of at least ${formatSI(cap, 'F')} from the ADC pin to ground (then sample no faster than it recharges), or buffer the node`
    : `add a capacitor at the ADC pin of at least 2^(bits+1) times the sampling capacitance (state sample_cap to size it), or buffer the node`;
  sink.report('source-impedance', c.file, fieldSpan(c, 'adc'),
    `source impedance seen by the ADC is up to ${fmtOhm(z)}, above the ${fmtOhm(max)} '${c.adc.name}' allows; ${fix}`,
    cap !== null ? { capacitorFarads: cap } : undefined);
}
