// The rtd kind: a platinum element (IEC 60751) in a divider or on a current source.
import type { SensorKind } from '../kind';
import { rtdFaultVolts } from './faults';
import { block } from './block';
import { readRtd } from './read';
import { perturbRtd, rtdClassToleranceK, rtdContributors, rtdElementJson, rtdModel, rtdRangeProblem, rtdSpread } from './model';
import { checkLeadResistance } from './lead-resistance';
import { checkClassValidity } from './class-validity';
import { rtdHover } from './hover';
import { RESISTIVE_CHANNEL_FIELDS, resistiveBiasProblem } from '../resistive/model';
import { resistiveChannelLines } from '../resistive/hover';
import { resistiveInputsJson } from '../resistive/json';
import { formatSI } from '../../model/read-value';
import type { RtdDef } from './types';

export const rtd: SensorKind<RtdDef> = {
  name: 'rtd',
  a: 'an rtd',
  block,
  ratedRange: 'range',
  read: readRtd,
  ownValues: 'r0 and the class',
  channelFields: RESISTIVE_CHANNEL_FIELDS,
  twoCurrent: false,
  biasProblem: resistiveBiasProblem,
  rangeProblem: rtdRangeProblem,
  ...rtdModel,
  contributors: rtdContributors,
  perturb: perturbRtd,
  sensorSpread: rtdSpread,
  classToleranceK: rtdClassToleranceK,
  reportInputs: (c) => resistiveInputsJson(c, rtdElementJson(c.sensor as RtdDef)),
  faults: rtdFaultVolts,
  checks: { first: [], last: [checkLeadResistance, checkClassValidity] },
  hover: rtdHover,
  channelHoverLines: (r) => resistiveChannelLines(r, 'platinum: R rises with T'),
  summary: (s) => `platinum, R0 ${formatSI(s.params.R0, 'Ω')}${s.toleranceClass ? `, class ${s.toleranceClass}` : ''}`,
};
