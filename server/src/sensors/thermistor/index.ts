// The thermistor kind: an NTC element in a divider or on a current source.
import type { SensorKind } from '../kind';
import { thermistorFaultVolts } from './faults';
import { block } from './block';
import { readThermistor } from './read';
import { perturbThermistor, thermistorContributors, thermistorElementJson, thermistorModel, thermistorRangeProblem, thermistorSpread } from './model';
import { checkDividerOptimum } from './divider-optimum';
import { checkBetaExtrapolated } from './beta-extrapolated';
import { thermistorHover } from './hover';
import { RESISTIVE_CHANNEL_FIELDS, resistiveBiasProblem } from '../resistive/model';
import { resistiveChannelLines } from '../resistive/hover';
import { resistiveInputsJson } from '../resistive/json';
import { formatSI, trimNumber } from '../../model/read-value';
import type { ThermistorDef } from './types';

export const thermistor: SensorKind<ThermistorDef> = {
  name: 'thermistor',
  a: 'a thermistor',
  block,
  ratedRange: 'range',
  read: readThermistor,
  ownValues: 'r25 and beta, or point_1..point_3',
  channelFields: RESISTIVE_CHANNEL_FIELDS,
  twoCurrent: false,
  biasProblem: resistiveBiasProblem,
  rangeProblem: thermistorRangeProblem,
  ...thermistorModel,
  contributors: thermistorContributors,
  perturb: perturbThermistor,
  sensorSpread: thermistorSpread,
  reportInputs: (c) => resistiveInputsJson(c, thermistorElementJson(c.sensor as ThermistorDef)),
  faults: thermistorFaultVolts,
  checks: { first: [], last: [checkDividerOptimum, checkBetaExtrapolated] },
  hover: thermistorHover,
  channelHoverLines: (r) => resistiveChannelLines(r, 'NTC: R falls with T'),
  summary: (s) => `NTC, R at 25 °C ${formatSI(s.r25.value, 'Ω')}${s.beta ? `, beta ${trimNumber(s.beta.value, 5)} K` : ''}`,
};
