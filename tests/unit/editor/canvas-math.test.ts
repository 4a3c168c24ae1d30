import { describe, expect, it } from 'vitest';
import { parseCurveDocument, prepareCurve } from '../../../shared/curve';
import { makeTransform, toT, toV, toX, toY, handlePoint, HANDLE_LENGTH } from '../../../src/features/editor/canvas/transform';
import { buildGrid, niceStepAbove, tickLabel, ticks } from '../../../src/features/editor/canvas/grid';
import { domainPath } from '../../../src/features/editor/canvas/curve-path';
import { fitView, zoomView } from '../../../src/features/editor/store/view';
import { snapTime, snapValue, valueStepFor } from '../../../src/features/editor/store/snap';
import { verdictFor, sci } from '../../../src/features/editor/target-strip/verdict';
import { EDITOR_EXAMPLES } from '../../../src/features/editor/store/examples';

const view = { t0: -1, t1: 3, v0: -2, v1: 2 };
const plot = { x: 60, y: 10, w: 400, h: 200 };

describe('screen transform', () => {
  const tf = makeTransform(view, plot);
  it('maps the view corners to the plot corners (values grow upwards)', () => {
    expect([toX(tf, -1), toX(tf, 3)]).toEqual([60, 460]);
    expect([toY(tf, 2), toY(tf, -2)]).toEqual([10, 210]);
  });
  it('screen → curve is the inverse of curve → screen', () => {
    for (const t of [-1, 0, 0.37, 2.9]) expect(toT(tf, toX(tf, t))).toBeCloseTo(t, 12);
    for (const v of [-2, -0.5, 1.25]) expect(toV(tf, toY(tf, v))).toBeCloseTo(v, 12);
  });
  it('a handle lies HANDLE_LENGTH px from its key along the slope as drawn on screen', () => {
    // sx = 100 px/s, sy = 50 px/unit: slope 2 units/s rises 100 px per 100 px → 45° on screen
    const p = handlePoint(tf, 0, 0, 2, 'out');
    expect(Math.hypot(p.x - toX(tf, 0), p.y - toY(tf, 0))).toBeCloseTo(HANDLE_LENGTH, 9);
    expect(p.x - toX(tf, 0)).toBeCloseTo(-(p.y - toY(tf, 0)), 9);
    const q = handlePoint(tf, 0, 0, 2, 'in');
    expect(q.x).toBeLessThan(toX(tf, 0));
  });
  it('zooming keeps the anchor point fixed on screen', () => {
    const z = zoomView(view, 2, 1, 0.5);
    const tz = makeTransform(z, plot);
    expect(toX(tz, 1)).toBeCloseTo(toX(tf, 1), 9);
    expect(toY(tz, 0.5)).toBeCloseTo(toY(tf, 0.5), 9);
    expect(z.t1 - z.t0).toBeCloseTo(2, 12);
  });
});

describe('grid and labels', () => {
  it('round steps 1, 2, 5 × 10^k', () => {
    expect([0.013, 0.02, 0.3, 7, 10].map(niceStepAbove)).toEqual([0.02, 0.02, 0.5, 10, 10]);
    expect(ticks(-0.25, 0.61, 0.2)).toEqual([-0.2, 0, 0.2, 0.4, 0.6]);
    expect(tickLabel(0.30000000000000004, 0.05)).toBe('0.30');
  });
  it('minor time lines are frames when a frame is wide enough', () => {
    const tf = makeTransform({ t0: 0, t1: 0.5, v0: 0, v1: 1 }, { x: 0, y: 0, w: 600, h: 200 });
    const g = buildGrid(tf, 60);
    expect(g.frames).toBe(true); // 20 px per frame
    expect(g.time.length).toBe(31); // frames 0..30 inclusive
    const wide = buildGrid(makeTransform({ t0: 0, t1: 20, v0: 0, v1: 1 }, { x: 0, y: 0, w: 600, h: 200 }), 60);
    expect(wide.frames).toBe(false);
  });
});

describe('curve path', () => {
  it('draws a step as a vertical line at its key', () => {
    const doc = { ...EDITOR_EXAMPLES[0].doc, keys: EDITOR_EXAMPLES[0].doc.keys.slice(0, 2), segments: [{ kind: 'step' as const }] };
    const c = prepareCurve(doc);
    const tf = makeTransform({ t0: 0, t1: 0.3, v0: 0, v1: 1.06 }, { x: 0, y: 0, w: 300, h: 106 });
    const d = domainPath(c, tf);
    // the last two points: (300, 106) holding the first value, then the end key's value (y = 0)
    expect(d.endsWith('L300,106L300,0')).toBe(true);
  });
});

describe('snapping, verdicts and examples', () => {
  it('snaps to frames and value steps exactly', () => {
    expect(snapTime(0.51, 60)).toBe(31 / 60);
    expect(snapValue(0.3123, 0.1)).toBe(0.3);
    expect(valueStepFor(0, 1)).toBe(0.01);
    expect(valueStepFor(-480, 0)).toBe(2);
  });
  it('pass / near / over at 80 % and 100 % of the tolerance', () => {
    expect(verdictFor(0.79e-3, 1e-3)).toBe('pass');
    expect(verdictFor(0.81e-3, 1e-3)).toBe('near');
    expect(verdictFor(1e-3, 1e-3)).toBe('near');
    expect(verdictFor(1.01e-3, 1e-3)).toBe('over');
    expect(verdictFor(1e-4, 1e-3, false)).toBe('over'); // over the byte cap
    expect(sci(4.7312e-4)).toBe('4.73e-4');
  });
  it('every example is a valid curve document and fits its view', () => {
    for (const ex of EDITOR_EXAMPLES) {
      const r = parseCurveDocument(ex.doc);
      expect(r.ok ? [] : r.issues, ex.id).toEqual([]);
      const v = fitView(ex.doc);
      expect(v.t1).toBeGreaterThan(v.t0);
    }
  });
});
