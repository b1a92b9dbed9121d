import { describe, expect, it } from 'vitest';
import { BOLTZMANN, ELEMENTARY_CHARGE, ZERO_CELSIUS_K, thermalVoltage } from '../../../server/src/physics/constants';

describe('physical constants', () => {
  it('uses the exact SI 2019 values', () => {
    // BIPM SI Brochure, 9th ed. (2019), Table 1: k and e are exact by definition.
    expect(BOLTZMANN).toBe(1.380649e-23);
    expect(ELEMENTARY_CHARGE).toBe(1.602176634e-19);
    // SI Brochure 9th ed. (2019), 2.3.1: t/degC = T/K - 273.15.
    expect(ZERO_CELSIUS_K).toBe(273.15);
  });

  it('thermal voltage at 300 K is 25.852 mV', () => {
    // kT/q from the SI Brochure 9th ed. (2019) exact constants: 25.851999786... mV
    // (evaluated to 20 digits with mpmath 1.3.0).
    expect(thermalVoltage(300)).toBeCloseTo(0.025852, 6);
    expect(Math.abs(thermalVoltage(300) - 0.025851999786435532) / 0.025852).toBeLessThan(1e-15);
  });
});
