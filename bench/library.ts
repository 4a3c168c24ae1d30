/**
 * A generated library of curve documents of every segment kind (deterministic for a seed), for the
 * benchmark and the property tests. Curves are the fictional studio's kinds of motion: UI slides,
 * jump arcs, fades, flashes; values in [0, 1], durations 0.2–3 s.
 */
import type { CurveDocument, Key, Segment, SegmentKind, ShapeFamily, ShapeEase, SlopeRule } from '../shared/curve/types';
import { SHAPE_FAMILIES } from '../shared/curve/types';

/** mulberry32 PRNG (public-domain 32-bit generator, common practice). */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const EASES: ShapeEase[] = ['in', 'out', 'in-out'];
const RULES: SlopeRule[] = ['manual', 'catmull-rom', 'monotone', 'zero', 'secant'];

/** One random curve; `only` forces every segment to one kind. */
export function randomCurve(r: () => number, name: string, only?: SegmentKind, keysMax = 6): CurveDocument {
  const nk = 2 + Math.floor(r() * (keysMax - 1));
  const keys: Key[] = [];
  let t = Math.round(r() * 4) / 8;
  for (let i = 0; i < nk; i++) {
    const split = r() < 0.2;
    const mIn = Math.round((r() * 4 - 2) * 100) / 100;
    const mOut = split ? Math.round((r() * 4 - 2) * 100) / 100 : mIn;
    keys.push({
      time: t, value: Math.round(r() * 1000) / 1000, slopeIn: mIn, slopeOut: mOut,
      rule: split ? 'manual' : RULES[Math.floor(r() * RULES.length)], slopes: split ? 'split' : 'joined',
    });
    // occasionally a jump (repeated time) for step/linear/hermite curves
    const jump = !only && i + 1 < nk - 1 && r() < 0.1;
    t += jump ? 0 : Math.round((0.1 + r() * 0.9) * 64) / 64;
    if (jump) {
      keys[i].rule = 'manual';
    }
  }
  // no two jumps in a row, no jump at the first segment
  for (let i = 1; i < nk; i++) if (keys[i].time === keys[i - 1].time && (i === 1 || keys[i - 1].time === keys[i - 2].time)) {
    for (let j = i; j < nk; j++) keys[j].time += 0.25;
  }
  const kinds: SegmentKind[] = ['step', 'linear', 'hermite', 'bezier', 'shape'];
  const segments: Segment[] = [];
  for (let i = 0; i + 1 < nk; i++) {
    const h = keys[i + 1].time - keys[i].time;
    let kind = only ?? kinds[Math.floor(r() * kinds.length)];
    if (h === 0) kind = 'linear';
    if (kind === 'bezier') {
      const a = keys[i], b = keys[i + 1];
      segments.push({
        kind, bezier: {
          h1: { time: a.time + h * (0.05 + 0.4 * r()), value: a.value + (b.value - a.value) * (r() * 1.4 - 0.2) },
          h2: { time: a.time + h * (0.55 + 0.4 * r()), value: a.value + (b.value - a.value) * (r() * 1.4 - 0.2) },
        },
      });
    } else if (kind === 'shape') {
      const family = SHAPE_FAMILIES[Math.floor(r() * SHAPE_FAMILIES.length)] as ShapeFamily;
      segments.push({ kind, shape: { family, ease: EASES[Math.floor(r() * 3)] } });
    } else segments.push({ kind });
  }
  return {
    format: 'tangentry.curve', version: 1, name, units: { time: 's', value: 'u' }, before: 'clamp', after: 'clamp',
    frameRate: 60, drives: 'position', tags: [], keys, segments,
  };
}

/** A library of n curves: every fifth curve uses one kind only, the rest mix kinds. */
export function curveLibrary(n: number, seed = 7): CurveDocument[] {
  const r = rng(seed);
  const kinds: SegmentKind[] = ['step', 'linear', 'hermite', 'bezier', 'shape'];
  const out: CurveDocument[] = [];
  for (let i = 0; i < n; i++) out.push(randomCurve(r, `lib-${i}`, i % 2 === 0 ? kinds[(i >> 1) % 5] : undefined));
  return out;
}
