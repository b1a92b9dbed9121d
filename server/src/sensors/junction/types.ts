// The junction's definition: SPICE parameters with their spreads (physics/types.ts JunctionParams).
import type { JunctionParams } from '../../physics/types';
import type { SensorDefBase } from '../../model/types';

export interface JunctionDef extends SensorDefBase {
  kind: 'junction';
  params: JunctionParams;
  /** Relative spread of IS when given (IS = 10 fA ± 50 %). */
  isTolerance: number;
  /** Relative spreads of N and BF when given (error budget); absent or 0 when none. */
  nTolerance?: number;
  bfTolerance?: number;
}
