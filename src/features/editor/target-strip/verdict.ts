/**
 * The target strip's verdict for one bake: pass / near / over, always shown as a word and a colour.
 *
 * ratio = measured maximum error / the tolerance the table was baked to.
 *   pass: ratio ≤ 0.8;  near: 0.8 < ratio ≤ 1 (within budget, but above 80 % of it);  over: ratio > 1,
 *   the bake failed (no table of the profile's kind stays within tolerance), or the table is larger
 *   than the profile's byte cap.
 * The 80 % line is our own choice (it leaves a fifth of the budget for later edits); the baker fills
 * a budget by design, so an adaptive table usually lands in "near".
 */
export type Verdict = 'pass' | 'near' | 'over';

export const NEAR_FRACTION = 0.8;

export function verdictFor(maxError: number, tolerance: number, withinCap: boolean | null = null): Verdict {
  if (withinCap === false) return 'over';
  if (!(tolerance > 0) || !Number.isFinite(maxError)) return 'over';
  const r = maxError / tolerance;
  if (r > 1) return 'over';
  return r > NEAR_FRACTION ? 'near' : 'pass';
}

/** Scientific notation with 3 significant figures, as the brief asks for errors (4.73e-4). */
export function sci(x: number): string {
  if (x === 0) return '0';
  if (!Number.isFinite(x)) return String(x);
  return x.toExponential(2).replace('e+', 'e');
}

/** Bytes with a unit: 96 B, 21.6 kB (1 kB = 1000 B). */
export function bytesLabel(n: number): string {
  if (n < 1000) return `${n} B`;
  if (n < 1e6) return `${(n / 1000).toFixed(n < 1e4 ? 2 : 1)} kB`;
  return `${(n / 1e6).toFixed(2)} MB`;
}
