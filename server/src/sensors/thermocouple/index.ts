// The thermocouple kind: a letter-type thermocouple (IEC 60584-1, ITS-90 reference functions of
// NIST Monograph 175) through an amplifier, its cold junction measured by another channel of the spec.
import type { SensorKind } from '../kind';
import { block, channelBlockFields, CHANNEL_FIELDS } from './block';
import { readTcChannel, readThermocouple, tcBiasProblem } from './read';
import { perturbTc, perturbTcChannel, tcChannelContributors, tcClassToleranceK, tcContributors, tcKelvinAtVolts, tcRangeProblem, tcReportInputs, tcSense } from './model';
import { tcFaultVolts } from './faults';
import { checkClassRange, checkOpenOffset, checkSwing } from './checks';
import { TC_CAUTIONS, tcChannelLines, tcHover } from './hover';
import type { ThermocoupleDef } from './types';
import { tcConversionInput } from './codegen';

export const thermocouple: SensorKind<ThermocoupleDef> = {
  name: 'thermocouple',
  a: 'a thermocouple',
  block,
  ratedRange: 'range',
  read: readThermocouple,
  ownValues: 'the type and the class',
  channelFields: CHANNEL_FIELDS,
  channelBlockFields,
  readChannel: readTcChannel,
  twoCurrent: false,
  biasProblem: tcBiasProblem,
  rangeProblem: tcRangeProblem,
  sense: tcSense,
  kelvinAtVolts: tcKelvinAtVolts,
  contributors: tcContributors,
  perturb: perturbTc,
  channelContributors: tcChannelContributors,
  perturbChannel: perturbTcChannel,
  classToleranceK: tcClassToleranceK,
  reportInputs: tcReportInputs,
  faults: tcFaultVolts,
  checks: { first: [], last: [checkSwing, checkClassRange, checkOpenOffset] },
  hover: tcHover,
  channelHoverLines: tcChannelLines,
  summary: (s) => `type ${s.params.type}${s.toleranceClass ? `, class ${s.toleranceClass}` : ''}`,
  cautions: TC_CAUTIONS,
  conversionInput: tcConversionInput,
};
