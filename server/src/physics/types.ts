// Inputs of the junction physics, all in base SI units (kelvin, volts, amps, ohms, eV).
// The model layer builds these from a spec; the physics never sees syntax.

export type JunctionKind = 'npn' | 'pnp' | 'diode';

export interface JunctionParams {
  kind: JunctionKind;
  /** Saturation current at TNOM, A. */
  IS: number;
  /** Emission coefficient (SPICE N for a diode, NF for a BJT). */
  N: number;
  /** Forward current gain at TNOM; ignored for a plain diode. */
  BF: number;
  /** Activation energy, eV. */
  EG: number;
  /** Saturation-current temperature exponent. */
  XTI: number;
  /** BF temperature exponent (SPICE XTB); 0 keeps BF constant. */
  XTB: number;
  /** Nominal (parameter-extraction) temperature, K. */
  TNOM: number;
  /** Lumped series resistance, ohm (diode RS, or RB/BF + RE folded by the user). */
  RS: number;
}

export type Bias =
  | { kind: 'resistor'; supply: number; ohms: number }
  | { kind: 'current'; amps: number };

/** One solved operating point of a biased junction at one temperature. */
export interface OperatingPoint {
  /** Temperature, K. */
  kelvin: number;
  /** Terminal current through the junction, A. */
  amps: number;
  /** Voltage the ADC sees: junction voltage plus the drop on RS, V. */
  volts: number;
  /** Intrinsic junction voltage (without the RS drop), V. */
  junctionVolts: number;
  /** dV/dT of `volts`, V/K (exact, by implicit differentiation). */
  slope: number;
  /** Small-signal resistance of the junction plus RS, ohm. */
  dynamicOhms: number;
}
