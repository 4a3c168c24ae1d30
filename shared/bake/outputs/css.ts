/**
 * CSS linear() output (W3C CSS Easing Functions Level 2) for linear-kernel tables. The easing's input
 * is the progress (t − T₀)/(T_last − T₀) as a percentage, its output the normalised value
 * (v − min)/(max − min); the property animates from `min` to `max` over the duration. Both are printed
 * with 9 decimals (the baker keeps that round-off inside the budget). A jump is two stops at one position.
 */
import type { PackCurve } from './bin';
import { logicalEntries } from './entries';

export interface CssCurve { name: string; easing: string; from: number; to: number; start: number; duration: number }

function num(x: number): string {
  const s = x.toFixed(9).replace(/\.?0+$/, '');
  return s === '-0' ? '0' : s;
}

export function cssCurve({ name, table }: PackCurve): CssCurve {
  if (table.kernel !== 'linear') throw new Error(`curve "${name}": CSS linear() needs the linear kernel`);
  const e = logicalEntries(table);
  const n = e.times.length;
  let lo = Infinity, hi = -Infinity;
  for (const v of e.values) { if (v < lo) lo = v; if (v > hi) hi = v; }
  const R = hi - lo;
  const T0 = e.times[0], D = e.times[n - 1] - T0;
  const stops: string[] = [];
  for (let k = 0; k < n; k++) {
    const out = R > 0 ? (e.values[k] - lo) / R : 0;
    stops.push(`${num(out)} ${num(((e.times[k] - T0) / D) * 100)}%`);
  }
  return { name, easing: `linear(${stops.join(', ')})`, from: lo, to: hi, start: T0, duration: D };
}

/** A stylesheet with one custom property per curve and a comment saying how to use it. */
export function writeCss(curves: readonly PackCurve[]): string {
  const lines = [':root {'];
  for (const c of curves) {
    const r = cssCurve(c);
    const id = c.name.replace(/[^A-Za-z0-9_-]/g, '-');
    lines.push(`  /* ${c.name.replace(/\*\//g, '')}: animate from ${r.from} to ${r.to} over ${r.duration}s (curve time ${r.start}s) */`);
    lines.push(`  --tangentry-${id}: ${r.easing};`);
  }
  lines.push('}');
  return lines.join('\n') + '\n';
}
