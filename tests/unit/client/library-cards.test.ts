import { describe, expect, it } from 'vitest';
import { sparklinePath } from '../../../src/features/packs/components/sparkline-path';
import { matchesFilter, moved, NO_FILTER, tagsOf } from '../../../src/features/packs/components/curve-filter';
import { DEMO_PACKS } from '../../../server/seed/demo-packs';
import type { CurveDocument } from '../../../shared/curve';

const linear: CurveDocument = {
  format: 'tangentry.curve', version: 1, name: 'ramp', units: { time: 's', value: 'x' }, before: 'clamp', after: 'clamp', frameRate: 60,
  drives: 'opacity', tags: ['a'],
  keys: [
    { time: 0, value: 0, slopeIn: 1, slopeOut: 1, rule: 'secant', slopes: 'joined' },
    { time: 2, value: 4, slopeIn: 2, slopeOut: 2, rule: 'secant', slopes: 'joined' },
  ],
  segments: [{ kind: 'linear' }],
};

const points = (d: string) => d.slice(1).split('L').map((p) => p.split(' ').map(Number) as [number, number]);

describe('sparkline path', () => {
  it('a linear ramp is a straight line from bottom-left to top-right of the padded box', () => {
    const s = sparklinePath(linear, 120, 36, 5, 2);
    expect(s.min).toBe(0);
    expect(s.max).toBe(4);
    // linear interpolation: v(t) = 2t, so the five samples are evenly spaced in both axes
    expect(points(s.d)).toEqual([[2, 34], [31, 26], [60, 18], [89, 10], [118, 2]]);
  });

  it('a constant curve sits in the middle', () => {
    const flat = { ...linear, keys: [linear.keys[0]!, { ...linear.keys[1]!, value: 0 }] };
    expect(points(sparklinePath(flat, 100, 20, 3).d).map((p) => p[1])).toEqual([10, 10, 10]);
  });

  it('draws every demo curve with finite coordinates', () => {
    for (const p of DEMO_PACKS) for (const c of p.curves) expect(sparklinePath(c).d, c.name).not.toMatch(/NaN|Infinity/);
  });
});

describe('curve filter', () => {
  const menu = DEMO_PACKS.find((p) => p.slug === 'menu-transitions')!.curves;
  it('filters by name, tag, segment kind and what it drives', () => {
    expect(menu.filter((c) => matchesFilter(c, { ...NO_FILTER, name: 'PANEL' })).map((c) => c.name)).toEqual(['panel-slide-in']);
    expect(menu.filter((c) => matchesFilter(c, { ...NO_FILTER, kind: 'bezier' })).map((c) => c.name)).toEqual(['tab-fade']);
    expect(menu.filter((c) => matchesFilter(c, { ...NO_FILTER, drives: 'scale' })).map((c) => c.name)).toEqual(['button-press-scale']);
    expect(menu.filter((c) => matchesFilter(c, { ...NO_FILTER, tag: 'toast' })).map((c) => c.name)).toEqual(['toast-drop']);
    expect(menu.filter((c) => matchesFilter(c, NO_FILTER)).length).toBe(menu.length);
    expect(tagsOf(menu)).toEqual(['button', 'hud', 'menu', 'panel', 'tab', 'toast']);
  });

  it('moves one place earlier or later, and not past the ends', () => {
    expect(moved(['a', 'b', 'c'], 1, -1)).toEqual(['b', 'a', 'c']);
    expect(moved(['a', 'b', 'c'], 1, 1)).toEqual(['a', 'c', 'b']);
    expect(moved(['a', 'b', 'c'], 0, -1)).toEqual(['a', 'b', 'c']);
    expect(moved(['a', 'b', 'c'], 2, 1)).toEqual(['a', 'b', 'c']);
  });
});

describe('drag and drop', () => {
  it('a drop puts the dragged item in the target’s place', async () => {
    const { placed } = await import('../../../src/features/packs/components/curve-filter');
    expect(placed(['a', 'b', 'c', 'd'], 3, 0)).toEqual(['d', 'a', 'b', 'c']);
    expect(placed(['a', 'b', 'c', 'd'], 0, 2)).toEqual(['b', 'c', 'a', 'd']);
    expect(placed(['a', 'b'], 1, 1)).toEqual(['a', 'b']);
  });

  it('reads a drop on a card as a placement and on a pack as a move; on itself or nowhere as nothing', async () => {
    const { dropResult } = await import('../../../src/features/packs/components/curve-drag');
    const drag = (active: string, over: string | null) => dropResult({ active: { id: active }, over: over ? { id: over } : null } as never);
    expect(drag('curve:a', 'slot:b')).toEqual({ kind: 'place', curveId: 'a', onCurveId: 'b' });
    expect(drag('curve:a', 'pack:jump-arcs')).toEqual({ kind: 'pack', curveId: 'a', toPack: 'jump-arcs' });
    expect(drag('curve:a', 'slot:a')).toBeNull();
    expect(drag('curve:a', null)).toBeNull();
  });
});
