// The sweep of a single-bias junction channel, written straight into the sweep's columns. A large
// spec is mostly such channels (33,200 points for 200 channels): asking sense() per point makes
// several objects per point and checks the same parameters again each time. This loop runs the
// very same arithmetic (the number functions of physics/junction.ts, in junctionAtTemperature's
// and operatingPointAt's order), so every figure equals sense()'s bit for bit
// (tests/unit/physics/sweep-fast.test.ts), and it throws the same errors at the same point.
import {
  biasAmps,
  bjtDLnIsxDT,
  bjtIsx,
  betaFAt,
  checkBetaF,
  checkBias,
  checkParams,
  checkSatAmps,
  checkTemperature,
  dynamicOhmsAt,
  emissionVoltage,
  junctionVoltsAt,
  satAmpsAt,
  satLogSlope,
  slopeAtFixedAmps,
  sourceOhmsAt,
  terminalSlope,
  terminalVolts,
} from '../physics/junction';
import type { Bias, JunctionParams } from '../physics/types';

/** A sweep's figures as columns, one array per field of SensedPoint (analysis/sense.ts). */
export interface SensedColumns {
  volts: number[];
  amps: number[];
  slope: number[];
  powerW: number[];
  sourceOhms: number[];
}

/**
 * Appends, for each temperature, what sense() gives for a junction `p` under the one `bias`.
 * Checks in sense()'s order: at the first temperature that temperature, the parameters, IS(T),
 * BF(T), then the bias; at each later one the temperature, IS(T) and BF(T) (parameters and bias
 * are the same all along the sweep, so checking them again could not fail).
 */
export function senseJunctionColumns(p: JunctionParams, bias: Bias, kelvins: readonly number[], out: SensedColumns): void {
  const diode = p.kind === 'diode';
  const seriesOhms = p.RS;
  for (let i = 0; i < kelvins.length; i++) {
    const kelvin = kelvins[i]!;
    if (i === 0) checkParams(p, kelvin);
    else checkTemperature(kelvin);
    // junctionAtTemperature
    const satAmps = satAmpsAt(p, kelvin);
    const dLnSatDT = satLogSlope(p, kelvin);
    const nVt = emissionVoltage(p, kelvin);
    checkSatAmps(p, kelvin, satAmps);
    let isx = satAmps;
    let dLnIsxDT = dLnSatDT;
    if (!diode) {
      const betaF = betaFAt(p, kelvin);
      isx = bjtIsx(satAmps, betaF);
      dLnIsxDT = bjtDLnIsxDT(p, kelvin, dLnSatDT, betaF);
      checkBetaF(p, kelvin, betaF, isx);
    }
    // operatingPointAt
    if (i === 0) checkBias(bias);
    const amps = biasAmps(bias, isx, nVt, seriesOhms);
    const u = amps + isx;
    const junctionVolts = junctionVoltsAt(nVt, amps, isx);
    const volts = terminalVolts(junctionVolts, amps, seriesOhms);
    // sense()
    out.volts.push(volts);
    out.amps.push(amps);
    out.slope.push(terminalSlope(bias, seriesOhms, slopeAtFixedAmps(junctionVolts, kelvin, nVt, amps, u, dLnIsxDT), nVt, u));
    out.powerW.push(volts * amps);
    out.sourceOhms.push(sourceOhmsAt(bias, dynamicOhmsAt(nVt, u, seriesOhms)));
  }
}
