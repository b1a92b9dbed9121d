// The junction's own spreads in the error budget: IS, N and BF (BF not for a plain diode), each a
// relative spread stated on its parameter; a board's draw scales the parameter.
import { trimNumber } from '../../model/read-value';
import type { ElementContributor } from '../kind';
import type { JunctionDef } from './types';

const pct = (r: number) => `± ${trimNumber(r * 100, 3)} %`;

export function junctionContributors(j: JunctionDef): ElementContributor[] {
  const out: ElementContributor[] = [
    { id: 'IS', label: `IS spread ${pct(j.isTolerance)}`, amount: j.isTolerance },
    { id: 'N', label: `N spread ${pct(j.nTolerance ?? 0)}`, amount: j.nTolerance ?? 0 },
  ];
  if (j.params.kind !== 'diode') out.push({ id: 'BF', label: `BF spread ${pct(j.bfTolerance ?? 0)}`, amount: j.bfTolerance ?? 0 });
  return out.filter((c) => c.amount > 0);
}

export function perturbJunction(s: JunctionDef, d: ReadonlyMap<string, number>): JunctionDef {
  const IS = 1 + (d.get('IS') ?? 0);
  const N = 1 + (d.get('N') ?? 0);
  const BF = 1 + (d.get('BF') ?? 0);
  return { ...s, params: { ...s.params, IS: s.params.IS * IS, N: s.params.N * N, BF: s.params.BF * BF } };
}
