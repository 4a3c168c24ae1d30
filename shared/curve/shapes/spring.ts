import { SAFETY } from '../extrema';
import { DEFAULTS, type EaseFamily, type ShapeParams } from './family';

/**
 * Damped spring, the closed form of the damped harmonic oscillator
 *   x'' = −(k/m)(x − 1) − (c/m)x',  x(0) = 0, x'(0) = v
 * over physical time τ (seconds). With y = x − 1, λ = c/(2m), ω0 = √(k/m), y(0) = −1, y'(0) = v:
 *   under-damped (λ < ω0), ωd = √(ω0² − λ²):  y = e^(−λτ)(−cos ωd τ + B sin ωd τ), B = (v − λ)/ωd
 *       = Re(K e^(rτ)), r = −λ + iωd, K = −1 − iB, so y^(n) = Re(K rⁿ e^(rτ)), |y^(n)| ≤ |K||r|ⁿ e^(−λτ);
 *   critically damped (|λ − ω0| ≤ 1e-8·ω0):  y = e^(−λτ)(−1 + Bτ), B = v − λ,
 *       y^(n) = e^(−λτ)[(−λ)ⁿ(−1 + Bτ) + n(−λ)^(n−1)B];
 *   over-damped, r₁,₂ = −λ ± √(λ² − ω0²):  y = C₁e^(r₁τ) + C₂e^(r₂τ), C₁ = (v + r₂)/(r₁ − r₂), C₂ = −1 − C₁.
 * Bounds use the triangle inequality with the decaying exponentials at the interval's start (rigorous).
 * (Textbook ODE solution, e.g. Boyce & DiPrima, Elementary Differential Equations §3.8 — from memory.)
 *
 * The spring's natural form is "out": out(s) = x(s·D) with D the segment duration. Its "in" form,
 * from which ./compose derives the others, is f(s) = 1 − x((1 − s)·D); so f(1) = 1 exactly but
 * f(0) = 1 − x(D) ≠ 0 in general — an unsettled spring leaves a value jump at the segment end
 * (out) or start (in), which curveBreaks reports.
 */
function lambdaOf(p: ShapeParams): number {
  return (p?.damping ?? DEFAULTS.damping) / (2 * (p?.mass ?? DEFAULTS.mass));
}
function omega0Of(p: ShapeParams): number {
  return Math.sqrt((p?.stiffness ?? DEFAULTS.stiffness) / (p?.mass ?? DEFAULTS.mass));
}
function velocityOf(p: ShapeParams): number {
  return p?.velocity ?? DEFAULTS.velocity;
}

/** y^(n)(τ) for y = x − 1 (n = 0..4), with λ = c/2m, ω0 = √(k/m), initial velocity v. */
export function springY(l: number, w0: number, v: number, n: number, tau: number): number {
  if (Math.abs(l - w0) <= 1e-8 * w0) {
    const B = v - l;
    const e = Math.exp(-l * tau);
    const ln = Math.pow(-l, n);
    const ln1 = n === 0 ? 0 : Math.pow(-l, n - 1);
    return e * (ln * (-1 + B * tau) + n * ln1 * B);
  }
  if (l < w0) {
    const wd = Math.sqrt(w0 * w0 - l * l);
    const B = (v - l) / wd;
    // z = K·rⁿ with K = −1 − iB, r = −λ + iωd.
    let zr = -1, zi = -B;
    for (let j = 0; j < n; j++) {
      const nr = zr * -l - zi * wd;
      zi = zr * wd + zi * -l;
      zr = nr;
    }
    const e = Math.exp(-l * tau);
    return e * (zr * Math.cos(wd * tau) - zi * Math.sin(wd * tau));
  }
  const mu = Math.sqrt(l * l - w0 * w0);
  const r1 = -l + mu, r2 = -l - mu;
  const C1 = (v + r2) / (r1 - r2);
  const C2 = -1 - C1;
  return C1 * Math.pow(r1, n) * Math.exp(r1 * tau) + C2 * Math.pow(r2, n) * Math.exp(r2 * tau);
}

/** An upper bound of |y^(n)| over τ ∈ [τ0, τ1], τ0 ≥ 0. */
function springYBound(l: number, w0: number, v: number, n: number, tau0: number, tau1: number): number {
  if (Math.abs(l - w0) <= 1e-8 * w0) {
    const B = v - l;
    const e = Math.exp(-l * tau0);
    return e * (Math.pow(l, n) * (1 + Math.abs(B) * tau1) + n * Math.pow(l, n - 1) * Math.abs(B));
  }
  if (l < w0) {
    const wd = Math.sqrt(w0 * w0 - l * l);
    const B = (v - l) / wd;
    return Math.hypot(1, B) * Math.pow(Math.hypot(l, wd), n) * Math.exp(-l * tau0);
  }
  const mu = Math.sqrt(l * l - w0 * w0);
  const r1 = -l + mu, r2 = -l - mu;
  const C1 = (v + r2) / (r1 - r2);
  const C2 = -1 - C1;
  return Math.abs(C1) * Math.pow(Math.abs(r1), n) * Math.exp(r1 * tau0)
    + Math.abs(C2) * Math.pow(Math.abs(r2), n) * Math.exp(r2 * tau0);
}

export const springFamily: EaseFamily = {
  value(s, order, params, duration) {
    const tau = (1 - s) * duration;
    // f(s) = −y((1 − s)D), f^(k)(s) = −(−D)^k y^(k)((1 − s)D).
    return -Math.pow(-duration, order) * springY(lambdaOf(params), omega0Of(params), velocityOf(params), order, tau);
  },
  bound(order, a, b, params, duration) {
    const l = lambdaOf(params), w0 = omega0Of(params), v = velocityOf(params);
    return Math.pow(duration, order) * springYBound(l, w0, v, order, (1 - b) * duration, (1 - a) * duration) * SAFETY;
  },
  breaks: [],
  inOutJoin: 2,
};
