import { describe, expect, it } from 'vitest';
import { prepareCurve, type CurveDocument, type Key, type SegmentKind } from '../../../shared/curve';
import { countFlashes, findChanges, maxFlashesInWindow, needsFlashCaution } from '../../../src/features/editor/motion-preview/flash-count';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';

// The rule under test (see flash-count.ts): WCAG 2.x SC 2.3.1 "Three Flashes or Below Threshold" and its
// definition of a general flash as "a pair of opposing changes in relative luminance of 10% or more"
// (W3C WCAG 2.2, from memory), approximated on the curve's values with 10 % of the value range.

const key = (time: number, value: number): Key => ({ time, value, slopeIn: 0, slopeOut: 0, rule: 'manual', slopes: 'joined' });

function doc(keys: Key[], kind: SegmentKind, drives: CurveDocument['drives'] = 'brightness', after: CurveDocument['after'] = 'clamp'): CurveDocument {
  return {
    format: 'tangentry.curve', version: 1, name: 'f', units: { time: 's', value: 'brightness' }, before: 'clamp', after,
    frameRate: 60, drives, tags: [], keys, segments: keys.slice(1).map(() => ({ kind })),
  };
}

/** A square wave 0 ↔ 1 at `hz` for `seconds` built from step segments. */
function square(hz: number, seconds: number): CurveDocument {
  const keys: Key[] = [];
  const half = 1 / (2 * hz);
  const n = Math.round(seconds / half);
  for (let i = 0; i <= n; i++) keys.push(key(i * half, i % 2));
  return doc(keys, 'step');
}

describe('flash counter', () => {
  it('a 3 Hz square wave has 3 flashes a second (at the WCAG limit, no caution)', () => {
    // 3 Hz → six opposing changes per second → three pairs (WCAG: "no more than three flashes")
    const r = countFlashes(prepareCurve(square(3, 3)));
    expect(r.maxFlashes).toBe(3);
    expect(needsFlashCaution('brightness', r)).toBe(false);
  });

  it('a 4 Hz square wave has 4 flashes a second: caution', () => {
    const r = countFlashes(prepareCurve(square(4, 3)));
    expect(r.maxFlashes).toBe(4);
    expect(needsFlashCaution('brightness', r)).toBe(true);
    expect(needsFlashCaution('opacity', r)).toBe(true);
    expect(needsFlashCaution('position', r)).toBe(false); // the caution is about light, not movement
  });

  it('wiggles below 10 % of the range are not changes', () => {
    // one big rise 0 → 1, then 20 wiggles of 0.08 (8 % of the range) within one second
    const keys = [key(0, 0), key(0.1, 1)];
    for (let i = 1; i <= 20; i++) keys.push(key(0.1 + i * 0.04, i % 2 ? 0.92 : 1));
    const r = countFlashes(prepareCurve(doc(keys, 'linear')));
    expect(r.changes).toHaveLength(1);
    expect(r.maxFlashes).toBe(0);
  });

  it('the same wiggles at 12 % of the range count', () => {
    const keys = [key(0, 0), key(0.1, 1)];
    for (let i = 1; i <= 20; i++) keys.push(key(0.1 + i * 0.04, i % 2 ? 0.88 : 1));
    const r = countFlashes(prepareCurve(doc(keys, 'linear')));
    expect(r.maxFlashes).toBeGreaterThan(3);
  });

  it('a repeating curve is counted across its loop seam', () => {
    // two flashes in 0.5 s, repeated after the end: 4 flashes in one second once it loops
    const keys = [key(0, 0), key(0.125, 1), key(0.25, 0), key(0.375, 1), key(0.5, 0)];
    expect(countFlashes(prepareCurve(doc(keys, 'linear', 'brightness', 'clamp'))).maxFlashes).toBe(2);
    expect(countFlashes(prepareCurve(doc(keys, 'linear', 'brightness', 'repeat'))).maxFlashes).toBe(4);
  });

  it('a constant curve and a slow fade have no flashes', () => {
    expect(countFlashes(prepareCurve(doc([key(0, 0.5), key(1, 0.5)], 'linear'))).maxFlashes).toBe(0);
    expect(countFlashes(prepareCurve(doc([key(0, 0), key(2, 1)], 'hermite'))).maxFlashes).toBe(0);
  });

  it('the muzzle-flash example flashes more than three times a second; the panel does not', () => {
    const muzzle = EDITOR_EXAMPLES.find((e) => e.id === 'hit-flashes/muzzle-flash')!;
    const r = countFlashes(prepareCurve(muzzle.doc));
    expect(r.maxFlashes).toBe(8); // eight pulses in under a second, built that way in examples.ts
    expect(needsFlashCaution(muzzle.doc.drives, r)).toBe(true);
  });

  it('findChanges and maxFlashesInWindow on hand-made data', () => {
    const ts = [0, 1, 2, 3, 4, 5];
    const vs = [0, 1, 0, 1, 0, 1];
    const ch = findChanges(ts, vs, 0.1);
    expect(ch).toEqual([{ start: 0, end: 1 }, { start: 1, end: 2 }, { start: 2, end: 3 }, { start: 3, end: 4 }, { start: 4, end: 5 }]);
    expect(maxFlashesInWindow(ch, 2).flashes).toBe(1);
    expect(maxFlashesInWindow(ch, 4).flashes).toBe(2);
  });
});
