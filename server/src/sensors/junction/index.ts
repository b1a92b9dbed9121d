// The junction kind: a diode-connected transistor or a diode read at one or two bias currents.
import type { SensorKind } from '../kind';
import { junctionFaultVolts } from './faults';
import { block } from './block';
import { readJunction, junctionBiasProblem } from './read';
import { senseJunction } from './model';
import { junctionContributors, perturbJunction } from './spread';
import { fitJunction } from './fit';
import { checkSupply } from './supply';
import { checkBiasWindow } from './bias-window';
import { checkTwoCurrent } from './two-current';
import { junctionBiasLines, junctionHover, junctionSummary } from './hover';
import type { JunctionDef } from './types';

export const junction: SensorKind<JunctionDef> = {
  name: 'junction',
  a: 'a junction',
  block,
  ratedRange: 'junction range',
  read: readJunction,
  // The bias current range the junction law holds in (model/schema.ts `current_window`).
  channelFields: ['current_window'],
  twoCurrent: true,
  biasProblem: junctionBiasProblem,
  sense: senseJunction,
  contributors: junctionContributors,
  perturb: perturbJunction,
  fit: fitJunction,
  // Supply before the bias window, which defers to it; both before self-heating at the same span.
  faults: junctionFaultVolts,
  checks: { first: [checkSupply, checkBiasWindow], last: [checkTwoCurrent] },
  hover: junctionHover,
  biasHoverLines: junctionBiasLines,
  summary: junctionSummary,
  reportInputs: (c) => ({ currentWindow: { lowA: c.windowLowA, highA: c.windowHighA } }),
};
