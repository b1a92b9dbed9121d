// The caution printed under reports and generated code: one text, as terminal lines (CAUTION) and
// as a paragraph for a page that flows its own lines (CAUTION_PARAGRAPH: the comparison panel).
const LINES = [
  'Caution: these figures come from a model of the circuit. They are not a safety assessment.',
  'Do not rely on this channel alone for safety-critical or medical measurement; over-temperature',
  'protection needs a certified, independent device; keep mains-connected circuits isolated. Verify',
  'the built channel against a calibrated reference thermometer, and follow local codes, the',
  'applicable safety standards and licensed professional practice.',
];
export const CAUTION = LINES.join('\n');
export const CAUTION_PARAGRAPH = LINES.join(' ');
