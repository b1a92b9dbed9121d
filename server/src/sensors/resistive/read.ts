// What the resistive kinds (thermistor, rtd) read alike: the dissipation constant.
import type { BlockReader } from '../../model/block-reader';
import { noExtra, spanOf, formatSI } from '../../model/read-value';
import { readUnit } from '../../model/units';

/** Reads `x mW/K` (power per kelvin) and returns K/W; the dissipation constant of a sensor. */
export function readDissipation(r: BlockReader, fallbackWPerK: number): number | null {
  const terms = r.terms('dissipation');
  if (!terms) return 1 / fallbackWPerK;
  const ctx = r.ctx('dissipation');
  const q = terms[0];
  const bad = () => {
    r.sink.report('bad-value', r.ref.file, spanOf(terms), 'dissipation takes a power per kelvin such as `1.5 mW/K`');
    r.ok = false;
    return null;
  };
  if (!q || q.kind !== 'quantity' || !q.unit || !noExtra(terms, 1, ctx)) return bad();
  const [num, den] = q.unit.text.split('/');
  if (!num || !den) return bad();
  const n = readUnit(num);
  const d = readUnit(den);
  if (typeof n === 'string' || typeof d === 'string' || n.dimension !== 'power' || d.dimension !== 'temperature' || d.offset !== 0) return bad();
  const wPerK = (q.number.value * n.scale) / d.scale;
  if (!(wPerK >= 1e-6 && wPerK <= 10)) {
    r.sink.report('out-of-domain', r.ref.file, q.span, `dissipation must be from 0.001 mW/K to 10 W/K (found ${formatSI(wPerK, 'W/K')})`);
    r.ok = false;
    return null;
  }
  return 1 / wPerK;
}
