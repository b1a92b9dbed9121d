// Reads a junction block: SPICE parameters (defaults as SPICE's where it has one), rated range and
// thermal resistance; spreads given on IS, N and BF feed the error budget.
import type { BlockReader } from '../../model/block-reader';
import type { DefBase } from '../../model/types';
import type { JunctionDef } from './types';

const ZERO_C = 273.15;

export function readJunction(r: BlockReader, base: DefBase): JunctionDef | null {
  const kind = r.choice('kind', 'npn') as JunctionDef['params']['kind'];
  const IS = r.quantity('IS');
  const N = r.quantity('N', 1);
  const BF = r.quantity('BF', 100);
  const EG = r.quantity('EG', 1.11);
  const XTI = r.quantity('XTI', 3);
  const XTB = r.quantity('XTB', 0);
  const TNOM = r.quantity('TNOM', 27 + ZERO_C);
  const RS = r.quantity('RS', 0);
  const rated = r.range('rated', [-55 + ZERO_C, 150 + ZERO_C]);
  const theta = r.quantity('theta_ja', 500);
  if (!r.ok || !IS || !N || !BF || !EG || !XTI || !XTB || !TNOM || !RS || !rated || !theta) return null;
  return {
    kind: 'junction',
    ...base,
    params: { kind, IS: IS.value, N: N.value, BF: BF.value, EG: EG.value, XTI: XTI.value, XTB: XTB.value, TNOM: TNOM.value, RS: RS.value },
    isTolerance: IS.tolerance,
    nTolerance: N.tolerance,
    bfTolerance: BF.tolerance,
    ratedLowK: rated.low,
    ratedHighK: rated.high,
    thetaJA: theta.value,
  };
}

/** A junction is biased by a resistor or a current source (or two of them, two-current). */
export function junctionBiasProblem(_s: JunctionDef, bias: { kind: string }): string | null {
  return bias.kind === 'divider' ? 'a divider bias is for a thermistor or an rtd; bias a junction with `resistor R from V` or `current I`' : null;
}
