// The caution printed under reports and generated code (as terminal lines, CAUTION, and as a
// paragraph for a page that flows its own lines, CAUTION_PARAGRAPH), and the cautions of the sensor kinds in use
// (sensors/kind.ts `cautions`: a thermocouple's mains isolation and independent cut-out, say).
import type { ChannelDef } from '../model/types';
import { kindOf } from '../sensors/registry';

const LINES = [
  'Caution: these figures come from a model of the circuit. They are not a safety assessment.',
  'Do not rely on this channel alone for safety-critical or medical measurement; over-temperature',
  'protection needs a certified, independent device; keep mains-connected circuits isolated. Verify',
  'the built channel against a calibrated reference thermometer, and follow local codes, the',
  'applicable safety standards and licensed professional practice.',
];
export const CAUTION = LINES.join('\n');
export const CAUTION_PARAGRAPH = LINES.join(' ');

/** The cautions of the kinds of these channels, each once, in the order met. */
export function kindCautions(channels: readonly ChannelDef[]): string[] {
  const out = new Set<string>();
  for (const c of channels) for (const line of kindOf(c.sensor).cautions ?? []) out.add(line);
  return [...out];
}

/** The same as one paragraph (the comparison panel flows its own lines). */
export function cautionParagraphFor(channels: readonly ChannelDef[]): string {
  return [CAUTION_PARAGRAPH, ...kindCautions(channels)].join(' ');
}

/** CAUTION followed by the cautions of the kinds of these channels, wrapped as CAUTION is. */
export function cautionFor(channels: readonly ChannelDef[]): string {
  return [CAUTION, ...kindCautions(channels).map((l) => wrap(l, 98))].join('\n');
}

/** Breaks text between words into lines of at most `width` characters (a longer word keeps its own line). */
export function wrap(text: string, width: number): string {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    if (line && line.length + 1 + word.length > width) {
      lines.push(line);
      line = word;
    } else line = line ? `${line} ${word}` : word;
  }
  if (line) lines.push(line);
  return lines.join('\n');
}
