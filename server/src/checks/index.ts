// The channel checks, in the order they run: the sensor kind's first checks (bias rules: supply
// before bias window, which defers to it), the common ones below, then the kind's own
// (sensors/<kind>/, `checks`).
import type { CheckContext } from './context';
import { checkClip } from './clip';
import { checkResolution } from './resolution';
import { checkSelfHeating } from './self-heating';
import { checkNonlinearity } from './nonlinearity';
import { checkRated } from './rated';
import { checkSourceImpedance } from './source-impedance';
import { checkOversampling } from './oversampling';
import { checkAccuracy } from './accuracy';
import { checkCalibrationFit } from './calibration-fit';
import { checkSaturation } from './saturation';
import { checkSensorFault } from './sensor-fault';
import { checkDynamics } from './dynamics';
import type { ChannelDef } from '../model/types';
import { kindOf } from '../sensors/registry';

type Check = (ctx: CheckContext) => void;

const COMMON: readonly Check[] = [
  checkClip,
  checkSaturation,
  checkSensorFault,
  checkResolution,
  checkSelfHeating,
  checkNonlinearity,
  checkRated,
  checkSourceImpedance,
  checkOversampling,
  checkAccuracy,
  checkCalibrationFit,
  checkDynamics,
];

const byKind = new Map<string, readonly Check[]>();

/** The checks of a channel, in order. */
export function channelChecks(c: ChannelDef): readonly Check[] {
  const kind = kindOf(c.sensor);
  let list = byKind.get(kind.name);
  if (!list) byKind.set(kind.name, (list = [...kind.checks.first, ...COMMON, ...kind.checks.last]));
  return list;
}
