/**
 * An independent check of a baked table: the source evaluated densely with the curve engine's own
 * `evaluate` (shared/curve), the decoded table rebuilt here with its own lerp / cubic Hermite code
 * (basis h00 = 2s³−3s²+1, h10 = s³−2s²+s, h01 = −2s³+3s², h11 = s³−s²: glTF 2.0 Appendix C; REFERENCES.md
 * interpolation section), nothing of shared/bake's evaluator or measure used.
 */
import { evaluate, prepareCurve, type CurveDocument } from '../../../shared/curve';

export interface DecodedTable {
  kernel: 'linear' | 'hermite';
  times: ArrayLike<number>;
  values: ArrayLike<number>;
  slopes: ArrayLike<number> | null;
}

/** Every decoded number finite? */
export function allFinite(t: DecodedTable): boolean {
  const ok = (xs: ArrayLike<number> | null) => !xs || Array.prototype.every.call(xs, (x: number) => Number.isFinite(x));
  return ok(t.times) && ok(t.values) && (t.kernel === 'linear' || ok(t.slopes));
}

/**
 * max |source − table| at n + 1 float32 times equally spaced over the domain (the runtime sees float32
 * times only), plus every entry time. Table evaluation is right-continuous (the largest k with T_k ≤ t)
 * and clamps outside [T_0, T_{N−1}]. NaN anywhere returns Infinity.
 */
export function denseTableError(doc: CurveDocument, tab: DecodedTable, n = 20_000): { max: number; at: number } {
  const c = prepareCurve(doc);
  const A = c.times[0], B = c.times[c.count - 1];
  const T = tab.times, V = tab.values, M = tab.slopes, N = T.length;
  const ts: number[] = [];
  for (let j = 0; j <= n; j++) ts.push(Math.fround(A + ((B - A) * j) / n));
  for (let k = 0; k < N; k++) ts.push(T[k]);
  ts.sort((x, y) => x - y);
  let max = 0, at = A, k = 0;
  for (const t of ts) {
    let p: number;
    if (t < T[0]) p = V[0];
    else if (t >= T[N - 1]) p = V[N - 1];
    else {
      while (k + 1 < N - 1 && T[k + 1] <= t) k++;
      const H = T[k + 1] - T[k];
      const s = (t - T[k]) / H;
      if (tab.kernel === 'linear' || !M) p = (1 - s) * V[k] + s * V[k + 1];
      else {
        const s2 = s * s, s3 = s2 * s;
        p = (2 * s3 - 3 * s2 + 1) * V[k] + (s3 - 2 * s2 + s) * H * M[k] + (-2 * s3 + 3 * s2) * V[k + 1] + (s3 - s2) * H * M[k + 1];
      }
    }
    const e = Math.abs(evaluate(c, t) - p);
    if (!(e <= max)) { max = e === e ? e : Infinity; at = t; }
  }
  return { max, at };
}
