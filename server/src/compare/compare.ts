// Side-by-side comparison of alternative channel designs for one measurement. Channels with the same
// `compare_group` are compared; a file that names no group compares all its channels.
// Figures: worst resolution, error before and after a one-point calibration (the error budget, whose
// contributors include the element's own spread, budget/contributors.ts + the sensor kind's; the
// element spread alone when the budget cannot be computed), self-heating, an estimated parts count
// and the generated conversion code's size.
import type { Analysis } from '../analysis/result';
import type { ChannelResult } from '../analysis/types';
import type { ModeBudget } from '../analysis/budget-types';
import { generatorInput, generatableResults } from '../codegen/channel-input';
import { generateC } from '../codegen';
import { kindOf } from '../sensors/registry';
import { pairedDifference, type PairedDifference } from '../budget/paired';
import { trimNumber } from '../model/read-value';

export interface CompareRow {
  channel: string;
  sensor: string;
  /** Worst °C per ADC count over the range. */
  worstCPerCount: number;
  worstAtC: number;
  /** Worst-case error with no calibration, K (null when not computable). */
  errorBeforeK: number | null;
  /** Worst-case error after a one-point calibration at the range centre, K. */
  errorAfterK: number | null;
  /** IEC 60751 class tolerance at the worst end of the range, K (RTDs with a class). */
  classToleranceK: number | null;
  selfHeatingMaxK: number;
  /** Estimated parts on the board for the channel (sensor, bias parts, amplifier). */
  parts: number;
  /** Generated conversion code, estimated flash bytes (8-bit AVR, -Os) and method. */
  codeBytes: number | null;
  codeMethod: string | null;
  notes: string[];
}

export interface CompareGroup {
  name: string;
  rows: CompareRow[];
  /** Pairs of channels on one converter: the spread of their difference, converter drawn once per board. */
  differences: PairedDifference[];
}

/** Groups of the analysis: by compare_group, or one group of every channel when none is named. */
export function compareGroups(a: Analysis): CompareGroup[] {
  const named = a.channels.filter((r) => r.channel.compareGroup !== undefined);
  const groups = new Map<string, ChannelResult[]>();
  if (named.length === 0) groups.set('(all channels)', [...a.channels]);
  for (const r of named) {
    const g = r.channel.compareGroup!;
    groups.set(g, [...(groups.get(g) ?? []), r]);
  }
  const codeOk = new Set(generatableResults(a.channels, a.diagnostics));
  return [...groups].map(([name, rs]) => {
    const rows = rs.map((r) => compareRow(r, codeOk.has(r), a.path));
    const differences: PairedDifference[] = [];
    for (let i = 0; i < rs.length; i++) {
      for (let j = i + 1; j < rs.length; j++) {
        let d: PairedDifference | null = null;
        try {
          d = pairedDifference(rs[i]!.channel, rs[j]!.channel);
        } catch {
          d = null; // a channel the budget cannot model has its own note already
        }
        if (!d) continue;
        differences.push(d);
        rows[i]!.notes.push(differenceNote(d));
      }
    }
    return { name, rows, differences };
  });
}

/** The note of a pair on one converter: the difference's spread with the converter shared, and drawn apart. */
export function differenceNote(d: PairedDifference): string {
  const k = (x: number) => `±${trimNumber(x, 3)} K`;
  return `minus ${d.b} (same converter: ${[...d.shared, ...(d.sharedInl ? ['INL curve'] : [])].join(', ')} drawn once per board): the difference spreads ${k(d.sharedK)} ` +
    `(Monte Carlo 1-99 %, uncalibrated, ${trimNumber(d.lowC, 4)} .. ${trimNumber(d.highC, 4)} °C); with the converter drawn apart for each channel it would be ${k(d.independentK)}`;
}

function modeOf(r: ChannelResult, mode: 'none' | 'one-point'): ModeBudget | null {
  let b: ChannelResult['budget'];
  try {
    b = r.worstCaseBudget ?? r.budget;
  } catch {
    return null;
  }
  return b?.modes.find((m) => m.setting.mode === mode) ?? null;
}

export function compareRow(r: ChannelResult, generatable: boolean, specPath: string): CompareRow {
  const c = r.channel;
  const s = r.summary;
  const notes: string[] = [];
  const kind = kindOf(c.sensor);
  const spread = kind.sensorSpread?.(c) ?? null;
  const none = modeOf(r, 'none');
  const one = modeOf(r, 'one-point');
  if (!none || !one) notes.push(spread ? `error budget not available: sensor spread only (${spread.basis})` : 'error budget not available');
  else if (spread) notes.push(`error budget, sensor spread included (${spread.basis})`);
  const before = none ? none.worstAbsK : spread?.beforeK ?? null;
  const after = one ? one.worstAbsK : spread?.afterOnePointK ?? null;
  const classTol = kind.classToleranceK?.(c) ?? null;
  let codeBytes: number | null = null;
  let codeMethod: string | null = null;
  if (generatable) {
    try {
      const g = generateC([generatorInput(r, specPath)], { fileStem: 'compare' }).channels[0]!;
      codeBytes = g.bytesEstimate;
      codeMethod = `${g.method}, ${g.entries} ${g.method === 'table' ? 'entries' : 'segments'}`;
    } catch (err) {
      notes.push(`no code: ${err instanceof Error ? err.message : String(err)}`);
    }
  } else notes.push('no code: the channel has errors or a converter over 16 bits');
  return {
    channel: c.name,
    sensor: `${c.sensor.kind} ${c.sensor.name}`,
    worstCPerCount: s.worst.celsiusPerCount,
    worstAtC: s.worst.celsius,
    errorBeforeK: before,
    errorAfterK: after,
    classToleranceK: classTol,
    selfHeatingMaxK: s.selfHeatingMaxK,
    parts: partsCount(r),
    codeBytes,
    codeMethod,
    notes,
  };
}

/**
 * Parts on the board, estimated: the sensor; a resistor (divider or junction bias) or a current
 * source (counted as one part); a second bias part for the two-current method; an amplifier as an
 * op-amp and two gain resistors, plus a reference for a non-zero offset.
 */
export function partsCount(r: ChannelResult): number {
  const c = r.channel;
  let n = 2;
  if (c.secondBias) n += 1;
  if (c.amplifier) n += 3 + (c.amplifier.offsetVolts !== 0 ? 1 : 0);
  return n;
}
