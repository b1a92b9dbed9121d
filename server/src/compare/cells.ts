// The one text rendering of a comparison row's figures, shared by the CLI's table
// (cli/commands/compare.ts) and the editor's comparison panel (thermoscribe/compareData).
import type { CompareRow } from './compare';
import { trimNumber } from '../model/read-value';

export const COMPARE_HEADERS = ['channel', 'sensor', 'worst resolution', 'error', 'after cal', 'class', 'self-heat', 'parts', 'code'] as const;

/** What the figures mean; printed under the CLI's tables and shown under the panel's. */
export const COMPARE_EXPLAIN = [
  'Error: worst case over the range from the error budget (circuit, reference, ADC and the element\'s own',
  'spread: thermistor R25/beta, RTD R0 and IEC 60751 class). "after cal" is after a one-point (offset)',
  'calibration. Parts and code bytes are estimates (code: 8-bit AVR, -Os). A "minus" note gives the spread',
  'of the difference of two channels on one converter, whose reference, offset, gain and INL curve are',
  'drawn once per board, so that what they cause alike cancels.',
];

const k = (v: number | null) => (v === null ? 'n/a' : `±${trimNumber(v, 3)} K`);

/** The row's cells, in the order of COMPARE_HEADERS. */
export function compareCells(r: CompareRow): string[] {
  return [
    r.channel,
    r.sensor,
    `${trimNumber(r.worstCPerCount, 3)} °C @ ${trimNumber(r.worstAtC, 4)} °C`,
    k(r.errorBeforeK),
    k(r.errorAfterK),
    r.classToleranceK === null ? '-' : k(r.classToleranceK),
    `${trimNumber(r.selfHeatingMaxK * 1000, 3)} mK`,
    String(r.parts),
    r.codeBytes === null ? 'n/a' : `${r.codeBytes} B`,
  ];
}
