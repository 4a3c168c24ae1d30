/**
 * Curve documents → one glTF 2.0 asset (one node and one weights track per curve; see gltf-write.ts).
 *
 * Per curve (glTF 2.0 §3.11, Appendix C):
 * - only `step` segments → STEP; only `linear` → LINEAR; anything else → CUBICSPLINE, where a
 *   hermite segment k writes out-tangent b_k = slopeOut_k and in-tangent a_{k+1} = slopeIn_{k+1}
 *   (value units per second, as Appendix C), a linear segment writes its secant as both tangents.
 *   These are exact up to float32 rounding of times, values and tangents.
 * - `bezier` and `shape` segments are first converted to hermite keys by fitCurve (./fit-curve.ts)
 *   within `tolerance` (value units); the report says how many keys that took and the error.
 * - A jump (two keys at one time) or a step segment inside a LINEAR/CUBICSPLINE track is written
 *   as an extra key one float32 step (the next lower float32 time) before the jump, holding the
 *   left value: the jump becomes a ramp of about 1e-7·t seconds (reported).
 * - glTF times must be ≥ 0: if any curve starts before 0, every track is shifted by the same
 *   offset so they stay in sync (reported).
 * - Outside its keys glTF holds the end values (clamp); other `before`/`after` rules are reported.
 * Node naming: the node is named by the curve name, except that a name of the form
 * `<node>/weights/0` (what gltf-read produces from such an asset) names the node `<node>`, so that
 * export → import returns the same curve names.
 * The report's maxError is measured, not estimated: the written float32 track, evaluated by the
 * Appendix C formula, against the source curve at every key and 32 points inside every segment
 * (a jump is measured 2e-6·max(1, |t|) s either side of it, see `measure`).
 */
import { evaluate, prepareCurve, KIND_LINEAR, KIND_STEP, KIND_BEZIER, KIND_SHAPE, type CurveDocument, type PreparedCurve } from '../curve';
import { fitCurve } from './fit-curve';
import { writeGltf, type GltfInterpolation, type GltfTrack, type GltfWritten, type GltfWriteOptions } from './gltf-write';

export interface GltfExportOptions extends GltfWriteOptions {
  /** Tolerance (value units) for converting bezier/shape segments to hermite keys; default 1e-4. */
  tolerance?: number;
}

export interface GltfTrackReport {
  curve: string;
  node: string;
  interpolation: GltfInterpolation;
  keys: number;
  /** true when every segment was written in closed form (up to float32 rounding). */
  exact: boolean;
  /** Measured max |written − source| over the domain (see the file header). */
  maxError: number;
  notes: string[];
}

export interface GltfExport extends GltfWritten {
  report: GltfTrackReport[];
  /** Seconds added to every time (0 unless a curve started before 0). */
  timeOffset: number;
}

/** The next float32 below x (x a float32 value > 0 or any value): used for jump keys. */
function prevFloat32(x: number): number {
  const f = new Float32Array([Math.fround(x)]);
  const u = new Uint32Array(f.buffer);
  if (f[0] === 0) return -1.401298464324817e-45;
  if (f[0] > 0) u[0] -= 1;
  else u[0] += 1;
  return f[0];
}

/** Node name for a curve name (rule in the file header). */
export function gltfNodeName(curveName: string): string {
  const m = /^(.+)\/weights\/0$/.exec(curveName);
  return m ? m[1] : curveName;
}

interface Built { track: GltfTrack; exact: boolean; notes: string[] }

function buildTrack(c: PreparedCurve, name: string, offset: number): Built {
  const n = c.count;
  const notes: string[] = [];
  let exact = true;
  const kinds = Array.from(c.kinds);
  const jumps = kinds.filter((_, i) => c.times[i + 1] === c.times[i]).length;
  const positive = kinds.filter((_, i) => c.times[i + 1] > c.times[i]);
  const interpolation: GltfInterpolation = n === 1 || (positive.length > 0 && positive.every((k) => k === KIND_STEP))
    ? 'STEP'
    : positive.every((k) => k === KIND_LINEAR) ? 'LINEAR' : 'CUBICSPLINE';
  const T = (i: number) => c.times[i] + offset;
  const times: number[] = [];
  const out: number[] = [];
  const push = (t: number, inT: number, v: number, outT: number) => {
    const tf = Math.fround(t);
    if (times.length > 0 && !(tf > times[times.length - 1])) {
      throw new Error(`curve "${name}": keys at ${times[times.length - 1]} s and ${t} s fall on the same float32 time; glTF needs strictly increasing times`);
    }
    times.push(tf);
    if (interpolation === 'CUBICSPLINE') out.push(inT, v, outT);
    else out.push(v);
  };
  if (interpolation === 'STEP') {
    // A STEP key holds until the next key; of two keys at one time only the later one is ever seen.
    for (let k = 0; k < n; k++) {
      if (k + 1 < n && c.times[k + 1] === c.times[k]) continue;
      push(T(k), 0, c.values[k], 0);
    }
    return { track: { name: gltfNodeName(name), interpolation, times: Float32Array.from(times), output: Float32Array.from(out) }, exact, notes };
  }
  // LINEAR / CUBICSPLINE: walk the segments; out-tangent of key k comes from segment k, in-tangent from k−1.
  const segIn = (k: number) => { // in-tangent at key k from segment k−1
    const i = k - 1;
    if (i < 0) return 0;
    if (c.kinds[i] === KIND_LINEAR) return (c.values[k] - c.values[i]) / (c.times[k] - c.times[i]);
    if (c.kinds[i] === KIND_STEP) return 0;
    return c.slopesIn[k];
  };
  const segOut = (k: number) => {
    if (k >= n - 1) return 0;
    if (c.kinds[k] === KIND_LINEAR) return (c.values[k + 1] - c.values[k]) / (c.times[k + 1] - c.times[k]);
    if (c.kinds[k] === KIND_STEP) return 0;
    return c.slopesOut[k];
  };
  let ramps = 0;
  for (let k = 0; k < n; k++) {
    const prevIsJump = k > 0 && c.times[k] === c.times[k - 1];
    const prevIsStep = k > 0 && !prevIsJump && c.kinds[k - 1] === KIND_STEP && c.values[k - 1] !== c.values[k];
    if (prevIsStep) {
      // hold the step's value up to one float32 step before key k
      push(prevFloat32(T(k)), 0, c.values[k - 1], 0);
      ramps++;
    }
    if (k + 1 < n && c.times[k + 1] === c.times[k]) {
      // key k is the left side of a jump: write it one float32 step early
      // (at the first key the left side is never seen: the curve starts with the later value)
      if (k > 0) {
        push(prevFloat32(T(k)), segIn(k), c.values[k], 0);
        ramps++;
      }
      continue;
    }
    push(T(k), prevIsJump ? 0 : prevIsStep ? 0 : segIn(k), c.values[k], segOut(k));
  }
  if (ramps > 0) {
    exact = false;
    notes.push(`${ramps} jump${ramps > 1 ? 's' : ''} written as a ramp over one float32 time step before the jump`);
  }
  if (jumps > 0 && ramps === 0) notes.push('a jump at the first key is written as its later value');
  if (interpolation === 'CUBICSPLINE') {
    // Appendix C: the first in-tangent and the last out-tangent are never used; write zeros.
    out[0] = 0;
    out[out.length - 1] = 0;
  }
  return { track: { name: gltfNodeName(name), interpolation, times: Float32Array.from(times), output: Float32Array.from(out) }, exact, notes };
}

/** Evaluate a written track at time t by glTF 2.0 §3.11 / Appendix C (clamped outside). */
export function evaluateGltfTrack(track: GltfTrack, t: number): number {
  const x = track.times;
  const y = track.output;
  const n = x.length;
  const cubic = track.interpolation === 'CUBICSPLINE';
  const val = (k: number) => (cubic ? y[3 * k + 1] : y[k]);
  if (t <= x[0]) return val(0);
  if (t >= x[n - 1]) return val(n - 1);
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const m = (lo + hi) >> 1;
    if (x[m] <= t) lo = m;
    else hi = m;
  }
  if (track.interpolation === 'STEP') return val(lo);
  const td = x[hi] - x[lo];
  const s = (t - x[lo]) / td;
  if (!cubic) return val(lo) + s * (val(hi) - val(lo));
  const s2 = s * s;
  const s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * val(lo) + td * (s3 - 2 * s2 + s) * y[3 * lo + 2] + (-2 * s3 + 3 * s2) * val(hi) + td * (s3 - s2) * y[3 * hi];
}

/**
 * Where the source jumps in value (a step with a change, or two keys at one time) the written track
 * jumps at the float32-rounded time, so exactly at the jump the two can differ by the jump height for
 * a window below 1e-6·|t| s; those instants are measured just left and right of that window instead.
 */
function measure(source: PreparedCurve, track: GltfTrack, offset: number): number {
  let mx = 0;
  const n = source.count;
  const check = (t: number) => {
    const e = Math.abs(evaluateGltfTrack(track, t + offset) - evaluate(source, t));
    if (e > mx) mx = e;
  };
  for (let i = 0; i < n; i++) {
    const t = source.times[i];
    const jumpHere = (i > 0 && source.times[i - 1] === t) || (i + 1 < n && source.times[i + 1] === t)
      || (i > 0 && source.kinds[i - 1] === KIND_STEP && source.values[i - 1] !== source.values[i]);
    if (jumpHere) {
      const w = 2e-6 * Math.max(1, Math.abs(t + offset));
      // only inside the domain [start, end]
      if (t - w >= source.start) check(t - w);
      if (t + w <= source.end) check(t + w);
    } else check(t);
    if (i + 1 < n) {
      const h = source.times[i + 1] - t;
      if (h > 0) for (let j = 1; j < 32; j++) check(t + (h * j) / 32);
    }
  }
  return mx;
}

/** Export curve documents as one glTF asset with a report per curve. Throws naming the curve. */
export function exportGltf(docs: readonly CurveDocument[], opts: GltfExportOptions = {}): GltfExport {
  if (docs.length === 0) throw new Error('exportGltf: no curves given');
  const tolerance = opts.tolerance ?? 1e-4;
  const prepared = docs.map((d) => prepareCurve(d));
  const minStart = Math.min(...prepared.map((c) => c.start));
  const offset = minStart < 0 ? -minStart : 0;
  const tracks: GltfTrack[] = [];
  const report: GltfTrackReport[] = [];
  const nodeNames = new Set<string>();
  prepared.forEach((src, idx) => {
    const name = docs[idx].name;
    const notes: string[] = [];
    let c = src;
    let exact = true;
    if (Array.from(src.kinds).some((k, i) => (k === KIND_BEZIER || k === KIND_SHAPE) && src.times[i + 1] > src.times[i])) {
      const fit = fitCurve(src, tolerance);
      c = prepareCurve(fit.doc);
      exact = false;
      notes.push(`segments ${fit.converted.join(', ')} (bezier/shape) converted to hermite with ${fit.keysAdded} added keys, fit error ${fit.maxError.toExponential(3)} ≤ tolerance ${tolerance}`);
    }
    const built = buildTrack(c, name, offset);
    if (nodeNames.has(built.track.name)) throw new Error(`curves[${idx}] "${name}": node name "${built.track.name}" is used by an earlier curve; curve names must give distinct nodes`);
    nodeNames.add(built.track.name);
    notes.push(...built.notes);
    if (offset > 0) notes.push(`all times shifted by +${offset} s (glTF times must be ≥ 0)`);
    if (src.before !== 'clamp' || src.after !== 'clamp') notes.push(`outside its keys glTF holds the end values; before "${src.before}" / after "${src.after}" are not carried`);
    tracks.push(built.track);
    report.push({
      curve: name,
      node: built.track.name,
      interpolation: built.track.interpolation,
      keys: built.track.times.length,
      exact: exact && built.exact,
      maxError: measure(src, built.track, offset),
      notes,
    });
  });
  const written = writeGltf(tracks, opts);
  return { ...written, report, timeOffset: offset };
}
