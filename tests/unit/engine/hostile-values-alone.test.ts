// Extreme values in every numeric field (#17 items 8, 9, 10), the second half of the check of each
// extreme in each slot alone: the RTD's, the converter's, the channels' and the dynamics slots (the
// junction's and the thermistor's slots and the rest of the tests: hostile-values.test.ts; a file of
// its own so that both halves run side by side on a 2-core machine).
import { describe, it } from 'vitest';
import { OTHER_SLOTS, checkEachAlone } from '../helpers/extreme-values';

describe('extreme values in every numeric field', () => {
  it('each extreme in each RTD, converter, channel and dynamics slot alone: an error diagnostic or sound figures, never garbage', () => {
    checkEachAlone(OTHER_SLOTS);
  }, 600_000);
});
