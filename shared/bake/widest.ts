/**
 * The widest next interval of the adaptive layout: the largest width w in (0, span) whose measured
 * error err(w) meets the target, to a relative precision PRECISION (a passing width lo and a failing
 * width hi with hi − lo ≤ PRECISION·lo), with few measurements.
 *
 * The interpolation error of one interval grows about as w^p (p = 2 linear, 4 hermite where the source
 * is smooth; other powers near kinks), so each step predicts where err(w) = target from the figures at
 * hand: from one failing width by the model, from a passing and a failing width by the power through
 * both (clamped to [0.5, 8]). The prediction is pulled a hair inside (the next passing width should
 * land just below the crossing), then the width just above the best passing one is tried, which usually
 * closes the bracket in two more steps. Every fourth step, and whenever the bracket did not halve in the
 * last two, the step is a bisection instead (the error need not be monotone in w), so the search ends
 * within about log₂(span/(PRECISION·w)) + a few steps at worst.
 */

/** Relative precision of the widest width. */
export const PRECISION = 2e-3;
/** Steps before the search settles for the best passing width found. */
const MAX_STEPS = 40;

/**
 * err(w): the error figure of the interval of width w (+Infinity when w cannot be measured); err(span)
 * is known to fail. h: the first width to try; p: the expected power; minWidth: below this no width
 * is tried. Returns the widest passing width found, or −1 when none ≥ minWidth passes.
 */
export function widestWidth(err: (w: number) => number, target: number, h: number, span: number, p: number, minWidth: number): number {
  let lo = 0, eLo = 0, hi = span, eHi = Infinity;
  let w = Math.min(Math.max(h, minWidth), span / 2);
  let lastWidth = hi;
  let slow = 0;
  for (let step = 0; step < MAX_STEPS; step++) {
    const e = err(w);
    if (e <= target) { lo = w; eLo = e; } else { hi = w; eHi = e === e ? e : Infinity; }
    if (lo > 0 && hi - lo <= PRECISION * lo) break;
    const width = hi - lo;
    slow = width > 0.5 * lastWidth ? slow + 1 : 0;
    lastWidth = width;
    let next: number;
    if (lo === 0) {
      // nothing passes yet: shrink by the model from the failing width (at least 2×, at most 64×)
      const r = Number.isFinite(eHi) && eHi > 0 ? hi * Math.pow(target / eHi, 1 / p) : hi / 2;
      next = Math.min(hi / 2, Math.max(hi / 64, r * (1 - PRECISION / 4)));
      if (next < minWidth) {
        if (hi <= minWidth) return -1;
        next = minWidth;
      }
    } else if (step % 4 === 3 || slow >= 2) {
      next = 0.5 * (lo + hi);
      slow = 0;
    } else {
      let q = p;
      if (eLo > 0 && Number.isFinite(eHi) && eHi > eLo) q = Math.min(8, Math.max(0.5, Math.log(eHi / eLo) / Math.log(hi / lo)));
      const r = eLo > 0 ? lo * Math.pow(target / eLo, 1 / q) : Number.isFinite(eHi) && eHi > 0 ? hi * Math.pow(target / eHi, 1 / q) : 0.5 * (lo + hi);
      // just inside the crossing, but at least a step above lo and below hi
      next = Math.min(hi * (1 - PRECISION / 2), Math.max(lo * (1 + PRECISION / 2), r * (1 - PRECISION / 4)));
    }
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    w = next;
  }
  return lo > 0 ? lo : -1;
}
