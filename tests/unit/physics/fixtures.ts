// Illustrative junction parameters (invented, typical small-signal orders of magnitude; not
// copied from any vendor's datasheet or model library).
import type { JunctionParams } from '../../../server/src/physics/types';

export const INVENTED_NPN: JunctionParams = {
  kind: 'npn', IS: 1e-14, N: 1, BF: 100, EG: 1.11, XTI: 3, XTB: 1.5, TNOM: 300.15, RS: 0,
};

export const INVENTED_DIODE: JunctionParams = {
  kind: 'diode', IS: 2.5e-9, N: 1.8, BF: 1, EG: 1.11, XTI: 3, XTB: 0, TNOM: 300.15, RS: 0,
};
