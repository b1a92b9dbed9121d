// The channel checks, run in this order (supply before bias window, which defers to it).
import type { CheckContext } from './context';
import { checkSupply } from './supply';
import { checkBiasWindow } from './bias-window';
import { checkClip } from './clip';
import { checkResolution } from './resolution';
import { checkSelfHeating } from './self-heating';
import { checkNonlinearity } from './nonlinearity';
import { checkRated } from './rated';
import { checkSourceImpedance } from './source-impedance';
import { checkTwoCurrent } from './two-current';
import { checkOversampling } from './oversampling';
import { checkAccuracy } from './accuracy';
import { checkCalibrationFit } from './calibration-fit';
import { checkDividerOptimum } from './divider-optimum';
import { checkLeadResistance } from './lead-resistance';
import { checkBetaExtrapolated } from './beta-extrapolated';
import { checkClassValidity } from './class-validity';
import { checkSaturation } from './saturation';
import { checkSensorFault } from './sensor-fault';

export const CHANNEL_CHECKS: ((ctx: CheckContext) => void)[] = [
  checkSupply,
  checkBiasWindow,
  checkClip,
  checkSaturation,
  checkSensorFault,
  checkResolution,
  checkSelfHeating,
  checkNonlinearity,
  checkRated,
  checkSourceImpedance,
  checkTwoCurrent,
  checkOversampling,
  checkAccuracy,
  checkCalibrationFit,
  checkDividerOptimum,
  checkLeadResistance,
  checkBetaExtrapolated,
  checkClassValidity,
];
