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
  const c = prepareCurve(doc);
  const t0 = doc.keys[0]!.time;
  const t1 = doc.keys[doc.keys.length - 1]!.time;
  const span = t1 > t0 ? t1 - t0 : 1;
  const times = new Float64Array(n);
  for (let i = 0; i < n; i++) times[i] = t0 + (span * i) / (n - 1);
  const v = evaluateMany(c, times);
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    if (v[i]! < min) min = v[i]!;
    if (v[i]! > max) max = v[i]!;
  }
  const range = max - min;
  const y = (x: number) => (range > 0 ? pad + (height - 2 * pad) * (1 - (x - min) / range) : height / 2);
  const x = (i: number) => pad + ((width - 2 * pad) * i) / (n - 1);
  let d = '';
  for (let i = 0; i < n; i++) d += `${i === 0 ? 'M' : 'L'}${x(i).toFixed(2)} ${y(v[i]!).toFixed(2)}`;
  return { d, min, max };
}
