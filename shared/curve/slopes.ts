import type { Key } from './types';

/**
 * Slope rules, recomputed from the keys' times and values whenever a neighbour moves.
 * Notation: δ⁻ = (v_i − v_{i−1})/(t_i − t_{i−1}) and δ⁺ = (v_{i+1} − v_i)/(t_{i+1} − t_i) are the
 * one-sided secants (chord slopes) to the previous and next key. A key whose neighbour shares its
 * time (a jump) treats that side as missing: slope rules never look across a jump. A key missing
 * one side uses the other side's secant where a rule needs both; a key with neither gets 0.
 *
 * - `manual`: the stored slopes. `joined` keys use slopeOut for both sides (the schema requires
 *   slopeIn === slopeOut for joined manual keys, so a valid document is unchanged).
 * - `zero`: 0 and 0.
 * - `secant`: in = δ⁻, out = δ⁺, always one-sided — a secant key is a slope break by
 *   definition, so `joined` does not apply to it. Between two secant keys a hermite segment is
 *   exactly the chord.
 * - `catmull-rom` (cardinal, Catmull & Rom 1974 for uneven spacing):
 *   m_i = (1 − c)(v_{i+1} − v_{i−1})/(t_{i+1} − t_{i−1}), tension c = key.tension ?? 0;
 *   an end key (or one beside a jump) uses (1 − c)·(its one-sided secant);
 *   `split` keys use in = (1 − c)δ⁻, out = (1 − c)δ⁺.
 * - `monotone` (Fritsch & Carlson 1980, SIAM J. Numer. Anal. 17(2):238–246): start from
 *   m_i = (δ⁻ + δ⁺)/2, or 0 where δ⁻·δ⁺ ≤ 0 (a local extremum); end keys take their one-sided
 *   secant. Then for each interval k in order: if δ_k = 0 set m_k = m_{k+1} = 0, else with
 *   α = m_k/δ_k, β = m_{k+1}/δ_k, if α² + β² > 9 scale both by τ = 3/√(α² + β²). Intervals are
 *   processed in place left to right; scaling only shrinks slopes, so earlier intervals stay inside
 *   the circle. These slopes are computed over all keys' values (as if every key were monotone)
 *   and then taken by the monotone keys; the no-overshoot guarantee holds on segments whose two
 *   keys are both monotone. `split` monotone keys use in = δ⁻, out = δ⁺ (α = 1 or β = 1 with the
 *   neighbour's ≤ 3 stays in Fritsch–Carlson's monotone square [0, 3]²).
 */
export function resolveSlopes(keys: readonly Key[]): Key[] {
  const n = keys.length;
  const left = new Float64Array(n).fill(NaN);
  const right = new Float64Array(n).fill(NaN);
  for (let i = 0; i + 1 < n; i++) {
    const dt = keys[i + 1].time - keys[i].time;
    if (dt > 0) {
      const d = (keys[i + 1].value - keys[i].value) / dt;
      right[i] = d;
      left[i + 1] = d;
    }
  }
  const needsMonotone = keys.some((k) => k.rule === 'monotone' && k.slopes === 'joined');
  const mono = needsMonotone ? monotoneSlopes(keys, left, right) : null;

  return keys.map((k, i) => {
    const dl = left[i];
    const dr = right[i];
    const inSec = Number.isNaN(dl) ? (Number.isNaN(dr) ? 0 : dr) : dl;
    const outSec = Number.isNaN(dr) ? (Number.isNaN(dl) ? 0 : dl) : dr;
    let slopeIn: number;
    let slopeOut: number;
    switch (k.rule) {
      case 'manual':
        slopeOut = k.slopeOut;
        slopeIn = k.slopes === 'joined' ? k.slopeOut : k.slopeIn;
        break;
      case 'zero':
        slopeIn = slopeOut = 0;
        break;
      case 'secant':
        slopeIn = inSec;
        slopeOut = outSec;
        break;
      case 'catmull-rom': {
        const f = 1 - (k.tension ?? 0);
        if (k.slopes === 'split') {
          slopeIn = f * inSec;
          slopeOut = f * outSec;
        } else if (!Number.isNaN(dl) && !Number.isNaN(dr)) {
          slopeIn = slopeOut = (f * (keys[i + 1].value - keys[i - 1].value)) / (keys[i + 1].time - keys[i - 1].time);
        } else {
          slopeIn = slopeOut = f * inSec; // one-sided secant (inSec === outSec here)
        }
        break;
      }
      case 'monotone':
        if (k.slopes === 'split') {
          slopeIn = inSec;
          slopeOut = outSec;
        } else {
          slopeIn = slopeOut = mono ? mono[i] : 0;
        }
        break;
    }
    return { ...k, slopeIn: slopeIn + 0, slopeOut: slopeOut + 0 };
  });
}

/** Fritsch–Carlson slopes for every key (see resolveSlopes); left/right are the one-sided secants (NaN = none). */
function monotoneSlopes(keys: readonly Key[], left: Float64Array, right: Float64Array): Float64Array {
  const n = keys.length;
  const m = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const dl = left[i];
    const dr = right[i];
    if (Number.isNaN(dl)) m[i] = Number.isNaN(dr) ? 0 : dr;
    else if (Number.isNaN(dr)) m[i] = dl;
    else m[i] = dl * dr <= 0 ? 0 : (dl + dr) / 2;
  }
  for (let k = 0; k + 1 < n; k++) {
    const d = right[k];
    if (Number.isNaN(d)) continue; // a jump: no interval
    if (d === 0) {
      m[k] = 0;
      m[k + 1] = 0;
      continue;
    }
    const a = m[k] / d;
    const b = m[k + 1] / d;
    const r = a * a + b * b;
    if (r > 9) {
      const tau = 3 / Math.sqrt(r);
      m[k] = tau * a * d;
      m[k + 1] = tau * b * d;
    }
  }
  return m;
}
