/**
 * The sparkline of a curve card: the curve sampled at `n` evenly spaced times over its domain with
 * evaluateMany (shared/curve), scaled into a width × height box (value axis up), as an SVG path.
 * A jump (two keys at one time) shows as a vertical stroke because the sample just after it
 * takes the later key's value. A constant curve sits in the middle of the box.
 */
import { evaluateMany, prepareCurve, type CurveDocument } from '../../../../shared/curve';

export interface Sparkline {
  d: string;
  min: number;
  max: number;
}

export function sparklinePath(doc: CurveDocument, width = 120, height = 36, n = 96, pad = 2): Sparkline {
  return sparklinePaths([doc], width, height, n, pad)[0]!;
}

/**
 * Several curves on one scale (an overlay of two versions): shared time span (the union of domains)
 * and shared value range, so the paths can be compared by eye.
 */
export function sparklinePaths(docs: readonly CurveDocument[], width = 120, height = 36, n = 96, pad = 2): Sparkline[] {
  let t0 = Infinity;
  let t1 = -Infinity;
  for (const d of docs) {
    t0 = Math.min(t0, d.keys[0]!.time);
    t1 = Math.max(t1, d.keys[d.keys.length - 1]!.time);
  }
  const span = t1 > t0 ? t1 - t0 : 1;
  const times = new Float64Array(n);
  for (let i = 0; i < n; i++) times[i] = t0 + (span * i) / (n - 1);
  const values = docs.map((d) => evaluateMany(prepareCurve(d), times));
  let min = Infinity;
  let max = -Infinity;
  for (const v of values) {
    for (let i = 0; i < n; i++) {
      if (v[i]! < min) min = v[i]!;
      if (v[i]! > max) max = v[i]!;
    }
  }
  const range = max - min;
  const y = (x: number) => (range > 0 ? pad + (height - 2 * pad) * (1 - (x - min) / range) : height / 2);
  const x = (i: number) => pad + ((width - 2 * pad) * i) / (n - 1);
  return values.map((v) => {
    let d = '';
    for (let i = 0; i < n; i++) d += `${i === 0 ? 'M' : 'L'}${x(i).toFixed(2)} ${y(v[i]!).toFixed(2)}`;
    return { d, min, max };
  });
}
