/**
 * The curve document: the plain data an animator edits and the baker reads.
 *
 * Units: time is in seconds, value in the curve's own units (`units.value`),
 * slopes in value units per second. A document is plain JSON; the zod schema
 * in ./schema.ts validates it and gives these types their runtime guard.
 *
 * Segment i joins keys[i] and keys[i + 1]; `segments.length === keys.length - 1`.
 * Two consecutive keys may share one time (once): that zero-length segment is a
 * jump in value, and at exactly that time the curve takes the later key's value
 * (right-continuous). The domain is [keys[0].time, keys[last].time].
 */

/** Seconds on the curve's time axis. */
export type Seconds = number;

export type SegmentKind = 'step' | 'linear' | 'hermite' | 'bezier' | 'shape';
export const SEGMENT_KINDS: readonly SegmentKind[] = ['step', 'linear', 'hermite', 'bezier', 'shape'];

/** How a key's slopes are found. `manual` keeps the stored slopes. */
export type SlopeRule = 'manual' | 'catmull-rom' | 'monotone' | 'zero' | 'secant';
export const SLOPE_RULES: readonly SlopeRule[] = ['manual', 'catmull-rom', 'monotone', 'zero', 'secant'];

/** What happens before the first key and after the last one. */
export type OutsideRule = 'clamp' | 'repeat' | 'mirror' | 'extend';
export const OUTSIDE_RULES: readonly OutsideRule[] = ['clamp', 'repeat', 'mirror', 'extend'];

/** What the curve drives in the game; brightness and opacity trigger the flash caution. */
export type Drives = 'position' | 'rotation' | 'scale' | 'opacity' | 'brightness' | 'audio-gain' | 'other';
export const DRIVES: readonly Drives[] = ['position', 'rotation', 'scale', 'opacity', 'brightness', 'audio-gain', 'other'];

export interface Key {
  time: Seconds;
  value: number;
  /** Slope arriving at the key (value units per second). */
  slopeIn: number;
  /** Slope leaving the key (value units per second). */
  slopeOut: number;
  rule: SlopeRule;
  /** Cardinal tension c for `catmull-rom`: m = (1 − c)(p₊ − p₋)/(t₊ − t₋); 0 is Catmull-Rom. */
  tension?: number;
  /** `joined`: slopeIn === slopeOut and handles turn together; `split`: independent. */
  slopes: 'joined' | 'split';
}

/** A point in the curve's own (time, value) space. */
export interface Point {
  time: Seconds;
  value: number;
}

/**
 * Weighted cubic Bézier in time, as CSS cubic-bezier(): control points
 * P0 = (t_k, v_k), P1 = h1, P2 = h2, P3 = (t_{k+1}, v_{k+1}); both handle times
 * must lie inside [t_k, t_{k+1}] so time is monotone in the curve parameter.
 */
export interface BezierHandles {
  h1: Point;
  h2: Point;
}

export type ShapeFamily =
  | 'sine' | 'quad' | 'cubic' | 'quart' | 'quint' | 'expo' | 'circ' | 'back' | 'elastic' | 'bounce' | 'spring';
export const SHAPE_FAMILIES: readonly ShapeFamily[] = [
  'sine', 'quad', 'cubic', 'quart', 'quint', 'expo', 'circ', 'back', 'elastic', 'bounce', 'spring',
];
export type ShapeEase = 'in' | 'out' | 'in-out';

/**
 * A published easing formula (normalised f: [0,1] → ℝ with f(0)=0, f(1)=1) or a
 * damped spring, laid over the segment: v(t) = v_k + (v_{k+1} − v_k)·f((t − t_k)/(t_{k+1} − t_k)).
 * Parameters: back `overshoot` (s, default 1.70158); elastic `amplitude` (≥1, default 1)
 * and `period` (default 0.3); spring `stiffness`, `damping`, `mass`, `velocity`
 * (physical time is the segment's own seconds; see ./shapes for the closed form).
 */
export interface Shape {
  family: ShapeFamily;
  ease: ShapeEase;
  params?: Partial<Record<'overshoot' | 'amplitude' | 'period' | 'stiffness' | 'damping' | 'mass' | 'velocity', number>>;
}

export interface Segment {
  kind: SegmentKind;
  /** Required when kind === 'bezier'. */
  bezier?: BezierHandles;
  /** Required when kind === 'shape'. */
  shape?: Shape;
}

export interface CurveDocument {
  format: 'tangentry.curve';
  version: 1;
  name: string;
  description?: string;
  units: { time: 's'; value: string };
  before: OutsideRule;
  after: OutsideRule;
  /** Frames per second used for snapping and frame-aligned tables. */
  frameRate: number;
  drives: Drives;
  tags: string[];
  keys: Key[];
  segments: Segment[];
}

export const MAX_KEYS = 10_000;
