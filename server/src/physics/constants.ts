// Physical constants, exact by definition in the revised SI (BIPM, "The International
// System of Units", SI Brochure, 9th edition, 2019, Table 1).

/** Boltzmann constant k, J/K (exact, SI 2019). */
export const BOLTZMANN = 1.380649e-23;

/** Elementary charge q, C (exact, SI 2019). */
export const ELEMENTARY_CHARGE = 1.602176634e-19;

/** k/q, V/K. */
export const BOLTZMANN_OVER_CHARGE = BOLTZMANN / ELEMENTARY_CHARGE;

/** 0 degC in kelvin (exact, SI Brochure 9th ed., 2.3.1). */
export const ZERO_CELSIUS_K = 273.15;

/** Thermal voltage kT/q in volts at `kelvin`. No domain check: callers validate T > 0. */
export function thermalVoltage(kelvin: number): number {
  return BOLTZMANN_OVER_CHARGE * kelvin;
}
