/**
 * CSS easing ⇄ curve document.
 *
 * To a curve (domain [0, 1], value = output progress):
 * - cubic-bezier(x1, y1, x2, y2) → one `bezier` segment, keys (0,0) and (1,1), handles (x1,y1), (x2,y2).
 *   Outside the domain the document uses `extend` with the key slopes set to the CSS end tangents
 *   (Level 1 §2.2: the line P0→P1, else P0→P2, else flat; P2→P3, else P1→P3, else flat).
 * - steps(n, pos) → `step` segments; a jump at 0 (jump-start, jump-both) is two keys at time 0.
 *   Outside [0,1] the document clamps; CSS steps() keeps stepping there (Level 1 §2.3), a
 *   difference that only shows for inputs outside [0,1].
 * - linear(...) → `linear` segments through the canonical control points; points sharing an
 *   input become a jump (only the first and last of such a run are reachable, per Level 2's
 *   evaluation); `extend` outside with the end segments' secant slopes, as linear() extrapolates
 *   (`clamp` after a jump at the end: linear() is constant there; a jump at the start is dropped,
 *   its first point is never the output).
 *
 * From a curve: see `curveToCss` for exactly what can be written.
 */
import { prepareCurve, type CurveDocument, type Key, type Segment } from '../curve';
import { type CssEasing, type LinearPoint, evaluateCssEasing, formatCssEasing, stepsEasing, type StepPosition } from './css-easing';

function key(time: number, value: number, slopeIn: number, slopeOut: number): Key {
  return { time, value, slopeIn, slopeOut, rule: 'manual', slopes: slopeIn === slopeOut ? 'joined' : 'split' };
}

function doc(name: string, keys: Key[], segments: Segment[], outside: 'clamp' | 'extend'): CurveDocument {
  return {
    format: 'tangentry.curve',
    version: 1,
    name,
    units: { time: 's', value: 'progress' },
    before: outside,
    after: outside,
    frameRate: 60,
    drives: 'other',
    tags: ['css-easing'],
    keys,
    segments,
  };
}

/** Convert a parsed CSS easing to a curve document on the domain [0, 1]. */
export function cssToCurve(e: CssEasing, name = formatCssEasing(e)): CurveDocument {
  if (e.kind === 'cubic-bezier') {
    const { x1, y1, x2, y2 } = e;
    const startSlope = x1 > 0 ? y1 / x1 : x2 > 0 ? y2 / x2 : 0;
    const endSlope = x2 < 1 ? (1 - y2) / (1 - x2) : x1 < 1 ? (1 - y1) / (1 - x1) : 0;
    return doc(name, [key(0, 0, startSlope, startSlope), key(1, 1, endSlope, endSlope)], [
      { kind: 'bezier', bezier: { h1: { time: x1, value: y1 }, h2: { time: x2, value: y2 } } },
    ], 'extend');
  }
  if (e.kind === 'steps') {
    const keys: Key[] = [];
    const n = e.steps;
    // Breakpoints are i/n; the value on [i/n, (i+1)/n) is the step easing there (right-continuous).
    keys.push(key(0, 0, 0, 0));
    const atZero = stepsEasing(n, e.position, 0);
    if (atZero !== 0) keys.push(key(0, atZero, 0, 0));
    for (let i = 1; i < n; i++) keys.push(key(i / n, stepsEasing(n, e.position, i / n), 0, 0));
    keys.push(key(1, 1, 0, 0));
    return doc(name, keys, keys.slice(1).map(() => ({ kind: 'step' as const })), 'clamp');
  }
  const pts = collapseRuns(e.points);
  // Level 2 evaluation never returns the first point's output when the second shares its input
  // (for x below it, and at it, the later point wins), so that point is dropped.
  // Before it linear() is constant at that later output: `clamp`.
  const jumpAtStart = pts.length > 2 && pts[0].input === pts[1].input;
  if (jumpAtStart) pts.shift();
  const keys = pts.map((p) => key(p.input, p.output, 0, 0));
  const segments: Segment[] = [];
  for (let i = 0; i + 1 < keys.length; i++) {
    const a = keys[i];
    const b = keys[i + 1];
    const secant = b.time > a.time ? (b.value - a.value) / (b.time - a.time) : 0;
    if (b.time > a.time) {
      a.slopeOut = secant;
      b.slopeIn = secant;
    }
    segments.push({ kind: 'linear' });
  }
  for (const k of keys) k.slopes = k.slopeIn === k.slopeOut ? 'joined' : 'split';
  const d = doc(name, keys, segments, 'extend');
  // Level 2: where the last two points share an input, linear() is constant after them at the last
  // point's output, which is what `clamp` gives.
  if (jumpAtStart) d.before = 'clamp';
  if (keys.length > 1 && keys[keys.length - 1].time === keys[keys.length - 2].time) d.after = 'clamp';
  return d;
}

/** Keep only the first and the last point of each run sharing one input (the others are never reached). */
function collapseRuns(points: readonly LinearPoint[]): LinearPoint[] {
  const out: LinearPoint[] = [];
  for (let i = 0; i < points.length; i++) {
    const p = points[i];
    const prev = out[out.length - 1];
    const prev2 = out[out.length - 2];
    if (prev && prev2 && prev.input === p.input && prev2.input === p.input) out[out.length - 1] = { ...p };
    else out.push({ ...p });
  }
  return out;
}

export type CurveToCssResult =
  | { ok: true; css: string; easing: CssEasing; notes: string[] }
  | { ok: false; reason: string };

/** Resolved slopes of the keys, value units per second; defaults to prepareCurve(doc)'s (slope rules applied). */
export interface SlopeSource {
  slopesIn: ArrayLike<number>;
  slopesOut: ArrayLike<number>;
}

const POLY_SHAPES: Record<string, [number, number, number, number] | undefined> = {
  // f(u) written in Bernstein form with x(s) = s (handles at 1/3, 2/3): y-control points
  // are [f(0), f(0) + f'(0)/3, f(1) − f'(1)/3, f(1)] for a cubic f (exact for degree ≤ 3).
  'quad/in': [1 / 3, 0, 2 / 3, 1 / 3], // u²: f'(0)=0, f'(1)=2
  'quad/out': [1 / 3, 2 / 3, 2 / 3, 1], // 1 − (1−u)²: f'(0)=2, f'(1)=0
  'cubic/in': [1 / 3, 0, 2 / 3, 0], // u³: f'(0)=0, f'(1)=3
  'cubic/out': [1 / 3, 1, 2 / 3, 1], // 1 − (1−u)³: f'(0)=3, f'(1)=0
};

/**
 * Write a curve as a CSS easing when that is exact (up to the shortest decimal form of each number):
 * - time is normalised to u = (t − t₀)/(t_last − t₀); if the first value is not 0 or the last not 1,
 *   values are normalised to (v − v₀)/(v_last − v₀) (an easing is a progress map) — reported in notes;
 *   when v₀ = v_last only linear() can be written, with the values unchanged;
 * - one `bezier` segment → cubic-bezier(); one `hermite` segment → cubic-bezier(1/3, y1, 2/3, y2),
 *   the exact Bézier form of the cubic (y1 = m₀·h/3, y2 = 1 − m₁·h/3 in normalised units);
 *   one quad/cubic in/out `shape` → cubic-bezier (those are cubic polynomials);
 * - `step` segments that match steps(n, position) exactly → steps();
 * - any mix of `step` and `linear` segments → linear() (a flat step is a stop with two percentages);
 * - anything else is refused with the reason.
 * Outside the domain CSS extends the end tangents (cubic-bezier, linear()) or keeps stepping; when the
 * curve's `before`/`after` differ from that, a note says so.
 */
export function curveToCss(d: CurveDocument, slopes?: SlopeSource): CurveToCssResult {
  const keys = d.keys;
  const n = keys.length;
  if (n < 2) return { ok: false, reason: `a CSS easing needs at least two keys; the curve has ${n}` };
  const t0 = keys[0].time;
  const t1 = keys[n - 1].time;
  const h = t1 - t0;
  if (!(h > 0)) return { ok: false, reason: 'the curve has an empty domain (first and last key at the same time)' };
  const v0 = keys[0].value;
  const v1 = keys[n - 1].value;
  const notes: string[] = [];
  const normaliseValues = v0 !== 0 || v1 !== 1;
  const canNormalise = v1 !== v0;
  if (normaliseValues && canNormalise) notes.push(`values normalised from [${v0}, ${v1}] to progress [0, 1]`);
  if (t0 !== 0 || t1 !== 1) notes.push(`time normalised from [${t0}, ${t1}] s to progress [0, 1]`);
  const U = (t: number) => (t - t0) / h;
  const V = (v: number) => (normaliseValues && canNormalise ? (v - v0) / (v1 - v0) : v);
  const vScale = normaliseValues && canNormalise ? v1 - v0 : 1;
  const resolved = slopes ?? prepareCurve(d);
  const slopeIn = (i: number) => resolved.slopesIn[i];
  const slopeOut = (i: number) => resolved.slopesOut[i];
  const kinds = d.segments.map((s) => s.kind);

  if (n === 2 && (kinds[0] === 'bezier' || kinds[0] === 'hermite' || kinds[0] === 'shape')) {
    if (!canNormalise) return { ok: false, reason: 'cubic-bezier() runs from 0 to 1: a single curved segment with equal end values cannot be written' };
    let e: CssEasing | null = null;
    const seg = d.segments[0];
    if (seg.kind === 'bezier' && seg.bezier) {
      const { h1, h2 } = seg.bezier;
      e = { kind: 'cubic-bezier', x1: U(h1.time), y1: V(h1.value), x2: U(h2.time), y2: V(h2.value) };
    } else if (seg.kind === 'hermite') {
      e = { kind: 'cubic-bezier', x1: 1 / 3, y1: (slopeOut(0) * h) / (3 * vScale), x2: 2 / 3, y2: 1 - (slopeIn(1) * h) / (3 * vScale) };
    } else if (seg.kind === 'shape' && seg.shape) {
      const cp = POLY_SHAPES[`${seg.shape.family}/${seg.shape.ease}`];
      if (!cp) return { ok: false, reason: `shape ${seg.shape.family} ${seg.shape.ease} is not a cubic polynomial, so no cubic-bezier() equals it; fit it to keys first` };
      e = { kind: 'cubic-bezier', x1: cp[0], y1: cp[1], x2: cp[2], y2: cp[3] };
    }
    if (!e || e.kind !== 'cubic-bezier') return { ok: false, reason: 'segment 0 lacks its bezier handles or shape' };
    if (!(e.x1 >= 0 && e.x1 <= 1 && e.x2 >= 0 && e.x2 <= 1)) return { ok: false, reason: 'a bezier handle time lies outside its segment' };
    if (d.before !== 'extend' || d.after !== 'extend') notes.push(`outside [0,1] CSS extends the end tangents; the curve uses ${d.before}/${d.after}`);
    return { ok: true, css: formatCssEasing(e), easing: e, notes };
  }

  const bad = kinds.findIndex((k) => k !== 'step' && k !== 'linear');
  if (bad >= 0) {
    return { ok: false, reason: `segment ${bad} is ${kinds[bad]}: CSS writes a curved piece only as one cubic-bezier() for the whole easing; this curve has ${n - 1} segments` };
  }

  // Piecewise-linear points (normalised): a step segment [t_k, t_k+1) holds v_k up to t_k+1.
  const pts: LinearPoint[] = [];
  for (let i = 0; i < n; i++) {
    const p = { input: U(keys[i].time), output: V(keys[i].value) };
    const last = pts[pts.length - 1];
    if (!last || last.input !== p.input || last.output !== p.output) pts.push(p);
    if (i + 1 < n && kinds[i] === 'step' && keys[i + 1].time > keys[i].time && keys[i + 1].value !== keys[i].value) {
      pts.push({ input: U(keys[i + 1].time), output: p.output });
    }
  }
  if (pts.length === 1) pts.push({ input: 1, output: pts[0].output });

  if (kinds.every((k) => k === 'step')) {
    const steps = matchSteps(pts);
    if (steps) {
      if (d.before !== 'clamp' || d.after !== 'clamp') notes.push(`outside [0,1] CSS steps() keeps stepping; the curve uses ${d.before}/${d.after}`);
      return { ok: true, css: formatCssEasing(steps), easing: steps, notes };
    }
  }
  const e: CssEasing = { kind: 'linear', points: pts };
  if (pts.length === 2 && pts[0].input === 0 && pts[0].output === 0 && pts[1].input === 1 && pts[1].output === 1 && d.before === 'extend' && d.after === 'extend') {
    return { ok: true, css: 'linear', easing: e, notes };
  }
  const firstFlat = pts[1].output === pts[0].output || pts[1].input === pts[0].input;
  const lastFlat = pts[pts.length - 1].output === pts[pts.length - 2].output || pts[pts.length - 1].input === pts[pts.length - 2].input;
  if ((d.before !== 'extend' && !firstFlat) || (d.after !== 'extend' && !lastFlat)) {
    notes.push(`outside [0,1] linear() extends its end segments; the curve uses ${d.before}/${d.after}`);
  }
  return { ok: true, css: formatCssEasing(e), easing: e, notes };
}

/** Find steps(n, position) whose output equals the piecewise-constant points exactly on [0,1]. */
function matchSteps(pts: readonly LinearPoint[]): CssEasing | null {
  const positions: StepPosition[] = ['jump-end', 'jump-start', 'jump-none', 'jump-both'];
  // Breakpoints: inputs where the output changes.
  const breaks = new Set<number>();
  for (let i = 1; i < pts.length; i++) if (pts[i].input === pts[i - 1].input) breaks.add(pts[i].input);
  const inner = [...breaks].filter((x) => x > 0 && x < 1).length;
  const candidates = new Set([inner, inner + 1, inner - 1].filter((c) => c >= 1));
  const probe = (x: number) => {
    // value of the piecewise-constant function (right-continuous)
    let v = pts[0].output;
    for (const p of pts) if (p.input <= x) v = p.output;
    return v;
  };
  for (const c of candidates) {
    for (const pos of positions) {
      if (pos === 'jump-none' && c < 2) continue;
      const e: CssEasing = { kind: 'steps', steps: c, position: pos };
      // Both functions are piecewise constant: they agree on [0,1] iff they agree at every breakpoint
      // of either and at the midpoint between consecutive breakpoints.
      const xs = [...new Set([...pts.map((p) => p.input), ...Array.from({ length: c + 1 }, (_, i) => i / c)])]
        .filter((x) => x >= 0 && x <= 1).sort((a, b) => a - b);
      let same = true;
      for (let i = 0; i < xs.length && same; i++) {
        const probes = i + 1 < xs.length ? [xs[i], 0.5 * (xs[i] + xs[i + 1])] : [xs[i]];
        for (const x of probes) if (evaluateCssEasing(e, x) !== probe(x)) same = false;
      }
      if (same) return e;
    }
  }
  return null;
}
