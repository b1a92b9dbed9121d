// Sensor faults: the ADC code an open or a shorted sensor gives in its channel's circuit, and
// whether that code can be told from a code of the designed range. The voltages come from each
// kind's own module (sensors/<kind>/faults.ts, the kind's `faults`); this file turns voltages into
// codes.
import { adcCode } from './sweep';
import type { ChannelDef } from '../model/types';
import { kindOf } from '../sensors/registry';

/** One fault as a kind module describes it. */
export interface FaultVolts {
  kind: 'open' | 'short';
  /** What breaks, in a few words ("open thermistor or lead"). */
  what: string;
  /**
   * Voltage at the ADC pin, V, before the converter's limits; null: driven to a source's
   * compliance voltage, taken as at or above the reference (full scale).
   */
  volts: number | null;
  /** The assumption behind the figure, in one sentence. */
  assumption: string;
}

export interface SensorFault extends FaultVolts {
  /** ADC code the fault gives (0 .. 2^bits - 1). */
  code: number;
  /**
   * false when a temperature of the range gives the same code (the code lies within the sweep's
   * codes, the saturated end codes included): the firmware cannot tell the fault from it.
   */
  distinct: boolean;
}

function faultVolts(c: ChannelDef): FaultVolts[] {
  return kindOf(c.sensor).faults(c);
}

/**
 * The in-range ADC codes a conversion may trust: the sweep's codes without the two ends of the
 * converter's scale. Code 0 stands for every voltage below 1 LSB and code 2^bits - 1 for every one
 * above (2^bits - 1) LSB, so a reading there may come from any temperature beyond (saturation).
 * null when no code is left.
 */
export function usableCodes(bits: number, codeMin: number, codeMax: number): { low: number; high: number } | null {
  const low = Math.max(codeMin, 1);
  const high = Math.min(codeMax, 2 ** bits - 2);
  return low <= high ? { low, high } : null;
}

/** The open and shorted sensor faults of a channel, with their codes, given its sweep's code span. */
export function sensorFaults(c: ChannelDef, codeMin: number, codeMax: number): SensorFault[] {
  const vref = c.adc.reference.value;
  const top = 2 ** c.adc.bits - 1;
  return faultVolts(c).map((f) => {
    const code = f.volts === null || !Number.isFinite(f.volts) ? top : adcCode(f.volts, vref, c.adc.bits);
    return { ...f, code, distinct: code < codeMin || code > codeMax };
  });
}

/** One line per fault for hovers and reports: what breaks, its code, whether it stands apart, why. */
export function describeFaults(faults: readonly SensorFault[]): string[] {
  return faults.map((f) =>
    `${f.what}: code ${f.code}${f.distinct ? '' : ' — a temperature of the range reads the same code, so the fault cannot be seen'} (assumes ${f.assumption})`);
}

/**
 * Fault tests of the conversion: a value is taken as a fault when it is at least as near a fault's
 * code as the range end on that side (common practice, no source: the nearer explanation wins, and
 * a tie goes to the safe side). A fault whose code is in range is left out; one on a saturated end
 * code that the range also reaches is kept, the safe side (fault-in-range warns of both).
 */
export function faultLimits(faults: readonly SensorFault[], codeLow: number, codeHigh: number, n: number): { faultBelow?: number; faultAbove?: number } {
  let faultBelow: number | undefined;
  let faultAbove: number | undefined;
  const w = 2 ** n;
  for (const f of faults) {
    const first = f.code * w;
    const last = (f.code + 1) * w - 1;
    if (first > codeHigh) {
      const t = Math.max(codeHigh + 1, Math.ceil((codeHigh + first) / 2));
      faultAbove = faultAbove === undefined ? t : Math.min(faultAbove, t);
    } else if (last < codeLow) {
      const t = Math.min(codeLow - 1, Math.floor((codeLow + last) / 2));
      faultBelow = faultBelow === undefined ? t : Math.max(faultBelow, t);
    }
  }
  return { ...(faultBelow !== undefined ? { faultBelow } : {}), ...(faultAbove !== undefined ? { faultAbove } : {}) };
}
