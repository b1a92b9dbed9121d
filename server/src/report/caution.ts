// The caution printed under reports and generated code.
export const CAUTION = [
  'Caution: these figures come from a model of the circuit. They are not a safety assessment.',
  'Do not rely on this channel alone for safety-critical or medical measurement; over-temperature',
  'protection needs a certified, independent device; keep mains-connected circuits isolated. Verify',
  'the built channel against a calibrated reference thermometer, and follow local codes, the',
  'applicable safety standards and licensed professional practice.',
].join('\n');
