/**
 * Edits of a curve document: pure functions that take a document and return a new one (the input is
 * never changed). The editor store applies them in one place (./editor-store.ts).
 *
 * Every edit ends with `settle`, which re-resolves the slope rules (resolveSlopes from the curve
 * engine) so a key whose rule is not `manual` always stores the slopes its rule gives after its
 * neighbours moved. A key whose slope is set by hand (a handle drag or the key card) becomes `manual`.
 */
import { evaluateDerivative, evaluate, prepareCurve, resolveSlopes, type CurveDocument, type Key, type Segment } from '../../../../shared/curve';
import { snapTime, snapValue, type Snapping } from './snap';

/** Largest slope magnitude a handle drag can give (value units per second); a vertical handle stops here. */
export const MAX_HANDLE_SLOPE = 1e6;

/** Re-resolve slope rules; the one normalisation every edit ends with. */
export function settle(doc: CurveDocument): CurveDocument {
  return { ...doc, keys: resolveSlopes(doc.keys) };
}

/**
 * Smallest time gap kept between a moved key and an unmoved neighbour: one frame when frame snapping
 * is on (so a key stopped by its neighbour still sits on a frame), else a thousandth of a frame.
 */
export function minimumGap(frameRate: number, framesSnap: boolean): number {
  return framesSnap ? 1 / frameRate : 1 / frameRate / 1000;
}

export interface MoveOptions {
  snapping: Snapping;
  valueStep: number;
}

/**
 * Move the keys `indices` of `start` by (dt, dv) measured from the drag's start (not accumulated).
 * The anchor key (the one under the pointer) is snapped — its new time to the nearest frame, its
 * value to the nearest multiple of the value step — and every moved key gets the anchor's snapped
 * offset, so a group keeps its shape. An axis that does not move (dt or dv exactly 0) is not snapped. The time offset is clamped so no moved key reaches an unmoved
 * neighbour (keys keep their order; see minimumGap). Bezier handles of a segment whose ends moved
 * follow: their times are mapped affinely from the old segment span to the new one and each
 * handle's value moves with its end key.
 */
export function moveKeys(
  start: CurveDocument, indices: readonly number[], anchor: number, dt: number, dv: number, opts: MoveOptions,
): CurveDocument {
  const keys = start.keys;
  const moving = new Uint8Array(keys.length);
  for (const i of indices) if (i >= 0 && i < keys.length) moving[i] = 1;
  if (!indices.length) return start;
  const a = keys[anchor] ?? keys[indices[0]];
  let t = a.time + dt;
  let v = a.value + dv;
  if (opts.snapping.frames && dt !== 0) t = snapTime(t, start.frameRate);
  if (opts.snapping.values && dv !== 0) v = snapValue(v, opts.valueStep);
  let offT = t - a.time;
  const offV = v - a.value;
  const gap = minimumGap(start.frameRate, opts.snapping.frames);
  let lo = -Infinity, hi = Infinity;
  for (let i = 0; i < keys.length; i++) {
    if (!moving[i]) continue;
    if (i > 0 && !moving[i - 1]) lo = Math.max(lo, keys[i - 1].time + gap - keys[i].time);
    if (i + 1 < keys.length && !moving[i + 1]) hi = Math.min(hi, keys[i + 1].time - gap - keys[i].time);
  }
  if (lo > hi) offT = 0; // no room at all: keep the times
  else offT = Math.min(hi, Math.max(lo, offT));
  const moved: Key[] = keys.map((k, i) =>
    moving[i] ? { ...k, time: k.time + offT + 0, value: k.value + offV + 0 } : k,
  );
  const segments: Segment[] = start.segments.map((s, i) => {
    if (s.kind !== 'bezier' || !s.bezier || (!moving[i] && !moving[i + 1])) return s;
    const t0 = keys[i].time, t1 = keys[i + 1].time;
    const n0 = moved[i].time, n1 = moved[i + 1].time;
    const map = (ht: number) => (t1 > t0 ? n0 + ((ht - t0) / (t1 - t0)) * (n1 - n0) : n0);
    const clampT = (x: number) => Math.min(n1, Math.max(n0, x));
    return {
      ...s,
      bezier: {
        h1: { time: clampT(map(s.bezier.h1.time)), value: s.bezier.h1.value + (moving[i] ? offV : 0) },
        h2: { time: clampT(map(s.bezier.h2.time)), value: s.bezier.h2.value + (moving[i + 1] ? offV : 0) },
      },
    };
  });
  return settle({ ...start, keys: moved, segments });
}

/**
 * The slope a handle gives when dragged to (t, v): the slope of the line from the key to the
 * pointer, s = (v − v_k)/(t − t_k). An in-handle lives left of its key and an out-handle right of
 * it; a pointer on the wrong side (or straight above) gives the steepest slope, ±MAX_HANDLE_SLOPE.
 */
export function slopeFromHandle(key: Key, side: 'in' | 'out', t: number, v: number): number {
  const dtv = t - key.time;
  const dvv = v - key.value;
  const rightSide = side === 'out' ? dtv > 0 : dtv < 0;
  if (!rightSide || Math.abs(dtv) < 1e-12) {
    if (dvv === 0) return 0;
    const up = side === 'out' ? dvv > 0 : dvv < 0;
    return up ? MAX_HANDLE_SLOPE : -MAX_HANDLE_SLOPE;
  }
  const s = dvv / dtv;
  return Math.max(-MAX_HANDLE_SLOPE, Math.min(MAX_HANDLE_SLOPE, s)) + 0;
}

/**
 * Set key i's in- or out-slope by hand. The key becomes `manual`; a joined key turns both slopes
 * together, a split key only the one side.
 */
export function setSlope(doc: CurveDocument, i: number, side: 'in' | 'out', slope: number): CurveDocument {
  const k = doc.keys[i];
  if (!k) return doc;
  const next: Key =
    k.slopes === 'joined'
      ? { ...k, rule: 'manual', slopeIn: slope, slopeOut: slope }
      : { ...k, rule: 'manual', ...(side === 'in' ? { slopeIn: slope } : { slopeOut: slope }) };
  const keys = doc.keys.slice();
  keys[i] = next;
  return settle({ ...doc, keys });
}

/**
 * Add a key on the curve at time t: its value is the curve's value there and its slopes the
 * curve's derivative (left and right), so the drawn curve changes as little as a split can make it.
 * The segment that held t is split in two; step, linear and hermite keep their kind on both halves,
 * bezier and shape halves become hermite (a shape or a Bézier cannot be cut and stay exact).
 * A time outside the domain adds an end key joined by a hermite segment. A time that already has
 * a key returns the document unchanged with that key's index.
 */
export function addKeyAt(doc: CurveDocument, t: number): { doc: CurveDocument; index: number } {
  const existing = doc.keys.findIndex((k) => k.time === t);
  if (existing >= 0) return { doc, index: existing };
  const c = prepareCurve(doc);
  const value = evaluate(c, t) + 0;
  const slope = evaluateDerivative(c, t, 1) + 0;
  const key: Key = { time: t, value, slopeIn: slope, slopeOut: slope, rule: 'manual', slopes: 'joined' };
  const keys = doc.keys.slice();
  const segments = doc.segments.slice();
  let index = keys.findIndex((k) => k.time > t);
  if (index < 0) index = keys.length;
  if (index === 0) {
    keys.unshift(key);
    segments.unshift({ kind: 'hermite' });
  } else if (index === keys.length) {
    keys.push(key);
    segments.push({ kind: 'hermite' });
  } else {
    const old = segments[index - 1];
    const kind = old.kind === 'bezier' || old.kind === 'shape' ? 'hermite' : old.kind;
    if (kind === 'step') {
      key.slopeIn = key.slopeOut = 0;
    }
    segments.splice(index - 1, 1, { kind }, { kind });
    keys.splice(index, 0, key);
  }
  return { doc: settle({ ...doc, keys, segments }), index };
}

/**
 * Remove the keys `indices`. At least one key always remains (the first of the selection is kept
 * when every key is selected). The segments beside a removed key merge into one, keeping the kind
 * of the segment that left the kept key before the gap (a removed first key takes its segment with
 * it). A merged bezier segment becomes hermite (its handles belonged to the shorter span).
 */
export function deleteKeys(doc: CurveDocument, indices: readonly number[]): CurveDocument {
  const drop = new Set(indices.filter((i) => i >= 0 && i < doc.keys.length));
  if (!drop.size) return doc;
  if (drop.size >= doc.keys.length) drop.delete(Math.min(...drop));
  const keys: Key[] = [];
  const segments: Segment[] = [];
  let prevKept = -1;
  for (let i = 0; i < doc.keys.length; i++) {
    if (drop.has(i)) continue;
    if (prevKept >= 0) {
      // the segment leaving the previous kept key; unchanged when nothing between them was removed
      const s = doc.segments[prevKept];
      segments.push(i === prevKept + 1 ? s : stripBezier(s));
    }
    keys.push(doc.keys[i]);
    prevKept = i;
  }
  return settle({ ...doc, keys, segments });
}

/** A bezier segment whose span changed loses its handles' meaning; merged segments become hermite. */
function stripBezier(s: Segment): Segment {
  return s.kind === 'bezier' ? { kind: 'hermite' } : s;
}

/** Keys copied to the editor's clipboard: times relative to the first copied key. */
export interface KeyClip {
  keys: Key[];
  /** kinds[j] is the kind of the segment that followed keys[j] (absent after the last key). */
  segments: Segment[];
}

export function copyKeys(doc: CurveDocument, indices: readonly number[]): KeyClip | null {
  const sorted = [...new Set(indices)].filter((i) => i >= 0 && i < doc.keys.length).sort((a, b) => a - b);
  if (!sorted.length) return null;
  const t0 = doc.keys[sorted[0]].time;
  return {
    keys: sorted.map((i) => ({ ...doc.keys[i], time: doc.keys[i].time - t0 + 0 })),
    segments: sorted.map((i) => stripBezier(doc.segments[i] ?? { kind: 'hermite' })),
  };
}

/**
 * Paste the clip with its first key at time `at`. A pasted key replaces an existing key at the same
 * time; otherwise it is inserted in time order. A pasted key's following segment takes its copied
 * kind; a segment that a pasted key splits keeps its kind on its left half (bezier becomes hermite).
 * Returns the pasted keys' indices in the new document.
 */
export function pasteKeys(doc: CurveDocument, clip: KeyClip, at: number): { doc: CurveDocument; indices: number[] } {
  type Row = { key: Key; seg: Segment; pasted: boolean };
  const rows: Row[] = doc.keys.map((key, i) => ({ key, seg: doc.segments[i] ?? { kind: 'hermite' }, pasted: false }));
  for (let j = 0; j < clip.keys.length; j++) {
    const key = { ...clip.keys[j], time: clip.keys[j].time + at + 0 };
    const row: Row = { key, seg: clip.segments[j] ?? { kind: 'hermite' }, pasted: true };
    const same = rows.findIndex((r) => r.key.time === key.time && !r.pasted);
    if (same >= 0) {
      rows[same] = row;
      continue;
    }
    let pos = rows.findIndex((r) => r.key.time > key.time);
    if (pos < 0) pos = rows.length;
    if (pos > 0) rows[pos - 1] = { ...rows[pos - 1], seg: stripBezier(rows[pos - 1].seg) };
    rows.splice(pos, 0, row);
  }
  const keys = rows.map((r) => r.key);
  const segments = rows.slice(0, -1).map((r) => r.seg);
  const indices = rows.flatMap((r, i) => (r.pasted ? [i] : []));
  return { doc: settle({ ...doc, keys, segments }), indices };
}

/** Replace key i's fields without settling (the key card validates the result first). */
export function patchKey(doc: CurveDocument, i: number, patch: Partial<Key>): CurveDocument {
  const keys = doc.keys.slice();
  keys[i] = { ...keys[i], ...patch };
  return { ...doc, keys };
}

/** Replace segment i (the one leaving key i) without settling. */
export function patchSegment(doc: CurveDocument, i: number, seg: Segment): CurveDocument {
  const segments = doc.segments.slice();
  segments[i] = seg;
  return { ...doc, segments };
}

/**
 * The same shape on every segment of the curve, in one edit (one undo step): each segment between two
 * keys eases from one key's value to the next with the shape (the keys, their times and values stay).
 */
export function shapeEverySegment(doc: CurveDocument, shape: NonNullable<Segment['shape']>): CurveDocument {
  return { ...doc, segments: doc.segments.map(() => ({ kind: 'shape' as const, shape: { ...shape, ...(shape.params ? { params: { ...shape.params } } : {}) } })) };
}

/** Move one Bézier handle of segment i to a new time or value, without settling (the card validates it). */
export function patchBezierHandle(doc: CurveDocument, i: number, handle: 'h1' | 'h2', field: 'time' | 'value', v: number): CurveDocument {
  const seg = doc.segments[i];
  if (seg?.kind !== 'bezier' || !seg.bezier) return doc;
  return patchSegment(doc, i, { ...seg, bezier: { ...seg.bezier, [handle]: { ...seg.bezier[handle], [field]: v } } });
}
