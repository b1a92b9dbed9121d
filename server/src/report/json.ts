// The machine-readable report: per file its diagnostics (0-based line/character ranges) and, per
// channel, the sweep, a summary and every resolved input in base SI units, so that a report can be
// checked independently of this tool.
import { sensorFaults } from '../analysis/sensor-faults';
import type { Analysis } from '../analysis/result';
import type { Diagnostic } from '../diagnostics/diagnostic';
import type { ChannelResult } from '../analysis/types';
import { LineIndex } from '../syntax/line-index';
import { kindOf } from '../sensors/registry';
import { budgetSummaryJson } from '../budget/json';
import { kindCautions } from './caution';

// Raised when a field changes its meaning or unit or goes away; a reader ignores fields it does not
// know, so added fields (faults, dynamics, cautions, residuals) keep version 1.
export const REPORT_VERSION = 1;

export function diagnosticJson(d: Diagnostic, index: LineIndex) {
  return {
    code: d.code,
    severity: d.severity,
    message: d.message,
    file: d.file,
    range: { start: index.position(d.span.start), end: index.position(d.span.end) },
    ...(d.data ? { data: d.data } : {}),
  };
}

export function channelJson(r: ChannelResult) {
  const c = r.channel;
  const s = r.summary;
  return {
    name: c.name,
    sensorKind: c.sensor.kind,
    inputs: {
      units: 'SI base units: K, V, A, ohm, eV, K/W',
      sensor: { name: c.sensor.name, ...c.sensor.params, ratedLowK: c.sensor.ratedLowK, ratedHighK: c.sensor.ratedHighK, thetaJA: c.sensor.thetaJA },
      bias: c.bias.kind === 'current'
        ? { kind: 'current', amps: c.bias.amps.value, ampsTolerance: c.bias.amps.tolerance }
        : { kind: c.bias.kind, ...(c.bias.kind === 'divider' ? { position: c.bias.position } : {}), ohms: c.bias.ohms.value, ohmsTolerance: c.bias.ohms.tolerance, supplyVolts: c.bias.supply.value, supplyTolerance: c.bias.supply.tolerance },
      adc: { name: c.adc.name, bits: c.adc.bits, referenceVolts: c.adc.reference.value, referenceTolerance: c.adc.reference.tolerance, maxSourceOhms: c.adc.maxSourceOhms, sampleFarads: c.adc.sampleFarads },
      range: { lowK: c.lowK, highK: c.highK, stepK: c.stepK },
      resolutionKPerCount: c.resolutionKPerCount,
      accuracyK: c.accuracyK,
      thetaJA: c.thetaJA,
      conversion: c.conversion,
      ...(kindOf(c.sensor).reportInputs?.(c) ?? {}),
    },
    sweep: r.sweep.map((p) => ({
      celsius: round(p.celsius, 9),
      volts: p.volts,
      amps: p.amps,
      code: p.code,
      countsPerKelvin: p.countsPerKelvin,
      celsiusPerCount: p.celsiusPerCount,
      slopeVoltsPerKelvin: p.slope,
      selfHeatingK: p.selfHeatingK,
      sourceOhms: p.sourceOhms,
    })),
    summary: {
      points: s.points,
      voltsMin: s.voltsMin,
      voltsMax: s.voltsMax,
      ampsMin: s.ampsMin,
      ampsMax: s.ampsMax,
      codeMin: s.codeMin,
      codeMax: s.codeMax,
      lsbVolts: s.lsbVolts,
      worst: { celsius: round(s.worst.celsius, 9), countsPerKelvin: s.worst.countsPerKelvin, celsiusPerCount: s.worst.celsiusPerCount },
      selfHeatingMaxK: s.selfHeatingMaxK,
      sourceOhmsMax: s.sourceOhmsMax,
      nonlinearity: s.nonlinearity,
    },
    // Open and shorted sensor: the code each gives (volts null: driven to a source's compliance).
    faults: sensorFaults(c, s.codeMin, s.codeMax).map((x) => ({ fault: x.kind, what: x.what, volts: x.volts, code: x.code, distinct: x.distinct, assumption: x.assumption })),
    // Error budget summary (budget/json.ts); null when it could not be computed.
    budget: r.budget ? budgetSummaryJson(r.budget) : null,
  };
}

function round(v: number, digits: number): number {
  return Number(v.toFixed(digits));
}

export function analysisJson(a: Analysis, indexOf: (file: string) => LineIndex) {
  return {
    path: a.path,
    diagnostics: a.diagnostics.map((d) => diagnosticJson(d, indexOf(d.file))),
    channels: a.channels.map(channelJson),
    // The safety cautions of the sensor kinds in use, when they have any (report/caution.ts).
    ...((cautions) => (cautions.length ? { cautions } : {}))(kindCautions(a.channels.map((r) => r.channel))),
  };
}
