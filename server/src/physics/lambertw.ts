// Principal branch W0 of the Lambert W function (w e^w = x) for real x >= 0, plus a
// log-domain form W0(exp(L)) that never forms exp(L), so arguments far beyond the double
// range (exp(1e6)) are fine.
//
// Method sources:
// - Definition, Taylor series at 0 (eq. 3.1) and the asymptotic expansion for large
//   argument (eq. 4.19): R. M. Corless, G. H. Gonnet, D. E. G. Hare, D. J. Jeffrey,
//   D. E. Knuth, "On the Lambert W function", Adv. Comput. Math. 5 (1996) 329-359.
// - Starting value for moderate x: S. Winitzki, "Uniform approximations for transcendental
//   functions", ICCSA 2003, LNCS 2667, 780-789: W(x) ~ ln(1+x) (1 - ln(1+ln(1+x)) / (2+ln(1+x))).
// - Refinement: the fourth-order iteration of F. N. Fritsch, R. E. Shafer, W. P. Crowley,
//   "Solution of the transcendental equation w e^w = x", Commun. ACM 16(2) (1973) 123-124:
//     z = ln(x/w) - w,  q = 2(1+w)(1+w+2z/3),  e = z/(1+w) * (q-z)/(q-2z),  w <- w(1+e).
//   It needs only ln(x/w), which in the log domain is L - ln(w): no exp, no overflow.

/** Below this x the Taylor series x - x^2 + 3/2 x^3 is exact to double (next term 8/3 x^4). */
const SERIES_LIMIT = 1e-6;
/** Above this L the log-domain iteration is used; below it exp(L) <= e is formed directly. */
const LOG_DOMAIN_FROM = 1;
/** A correction this small means the next one would be ~1e-20: stop. */
const CONVERGED = 1e-5;
const MAX_STEPS = 12;

// Relative correction e of the Fritsch step, written with r = z/q so that q = 2(1+w)(1+w+2z/3)
// is never formed (it overflows for w above ~1e154): (q-z)/(q-2z) = (1-r)/(1-2r).
function fritschFactor(w: number, z: number): number {
  const w1 = 1 + w;
  const r = z / (2 * w1) / (w1 + (2 / 3) * z);
  return ((z / w1) * (1 - r)) / (1 - 2 * r);
}

// Built outside lambertW0, as the junction checks build theirs (sensors/junction/physics.ts): there a
// template literal in a hot function slowed the sweep under V8 even with the throw never taken.
function negativeArgumentError(x: number): RangeError {
  return new RangeError(`lambertW0: argument must be a number >= 0 (got ${x})`);
}

/**
 * W0(x) for x >= 0, relative accuracy about 1e-16. W0(+Infinity) = +Infinity.
 * Throws RangeError for NaN or x < 0 (the lower branch region is not needed here).
 */
export function lambertW0(x: number): number {
  if (!(x >= 0)) throw negativeArgumentError(x);
  if (x === Infinity) return Infinity;
  if (x < SERIES_LIMIT) return x * (1 - x * (1 - 1.5 * x));
  if (x > Math.E) return lambertW0OfExp(Math.log(x));
  // 1e-6 <= x <= e, so 1e-6 < W <= 1: Winitzki start, then Fritsch steps on ln(x/w) - w
  // (x/w is close to e^w, so the log of the ratio carries no cancellation).
  const lx = Math.log1p(x);
  let w = lx * (1 - Math.log1p(lx) / (2 + lx));
  for (let i = 0; i < MAX_STEPS; i++) {
    const e = fritschFactor(w, Math.log(x / w) - w);
    w *= 1 + e;
    if (!(Math.abs(e) > CONVERGED)) break;
  }
  return w;
}

/**
 * W0(exp(L)) for any L (L = -Infinity gives 0, L = +Infinity gives +Infinity), without
 * overflow. Relative accuracy about 1e-16 given an exact L.
 */
export function lambertW0OfExp(L: number): number {
  if (L !== L) throw new RangeError('lambertW0OfExp: argument is NaN');
  if (L <= LOG_DOMAIN_FROM) {
    // exp(L) <= e: no overflow; below about -745 it underflows to 0, as does W0 = e^L (1 - ...).
    return lambertW0(Math.exp(L));
  }
  if (L === Infinity) return Infinity;
  // Corless et al. eq. 4.19, with L1 = L, L2 = ln L, first four terms.
  const l2 = Math.log(L);
  let w = L - l2 + l2 / L + (l2 * (l2 - 2)) / (2 * L * L);
  for (let i = 0; i < MAX_STEPS; i++) {
    const e = fritschFactor(w, L - Math.log(w) - w);
    w *= 1 + e;
    if (!(Math.abs(e) > CONVERGED)) break;
  }
  return w;
}
