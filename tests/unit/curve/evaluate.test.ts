import { describe, expect, it } from 'vitest';
import {
  curveBreaks, evaluate, evaluateDerivative, evaluateMany, findSegment, prepareCurve, segmentDerivativeBound, segmentValue, shapeValue,
  type OutsideRule,
} from '../../../shared/curve';
import { linspace, makeDoc } from './helpers';

// Outside rules and jumps are the project's own definitions (docs/curve-format.md); the values
// below follow from them by hand.
const keys = [{ time: 1, value: 0, slopeOut: 2 }, { time: 2, value: 1, slopeIn: 0.5 }, { time: 3, value: 3, slopeIn: 1 }];
const curve = (before: OutsideRule, after: OutsideRule) => prepareCurve(makeDoc(keys, 'hermite', { before, after }));

describe('outside rules', () => {
  it('clamp holds the end values with derivatives 0', () => {
    const c = curve('clamp', 'clamp');
    expect(evaluate(c, -5)).toBe(0);
    expect(evaluate(c, 9)).toBe(3);
    expect(evaluateDerivative(c, -5, 1)).toBe(0);
    expect(evaluateDerivative(c, 9, 2)).toBe(0);
  });
  it('extend continues with the end slopes: out-slope 2 before, in-slope 1 after', () => {
    const c = curve('extend', 'extend');
    expect(evaluate(c, 0)).toBeCloseTo(-2, 14);
    expect(evaluate(c, 5)).toBeCloseTo(5, 14);
    expect(evaluateDerivative(c, 0, 1)).toBe(2);
    expect(evaluateDerivative(c, 5, 1)).toBe(1);
    expect(evaluateDerivative(c, 5, 2)).toBe(0);
  });
  it('repeat shifts by the period P = 2', () => {
    const c = curve('repeat', 'repeat');
    for (const t of linspace(1.01, 2.99, 37)) {
      expect(evaluate(c, t + 2)).toBeCloseTo(evaluate(c, t), 12);
      expect(evaluate(c, t - 4)).toBeCloseTo(evaluate(c, t), 12);
      expect(evaluateDerivative(c, t + 6, 1)).toBeCloseTo(evaluateDerivative(c, t, 1), 10);
    }
    expect(evaluate(c, 5)).toBe(0); // right-continuous: the next copy starts at the first key
  });
  it('mirror reflects: v(end + x) = v(end − x), v(start − x) = v(start + x); odd derivatives flip', () => {
    const c = curve('mirror', 'mirror');
    for (const x of linspace(0.01, 1.99, 23)) {
      expect(evaluate(c, 3 + x)).toBeCloseTo(evaluate(c, 3 - x), 12);
      expect(evaluate(c, 1 - x)).toBeCloseTo(evaluate(c, 1 + x), 12);
      expect(evaluateDerivative(c, 3 + x, 1)).toBeCloseTo(-evaluateDerivative(c, 3 - x, 1), 10);
      expect(evaluateDerivative(c, 3 + x, 2)).toBeCloseTo(evaluateDerivative(c, 3 - x, 2), 10);
      expect(evaluate(c, 5 + x)).toBeCloseTo(evaluate(c, 1 + x), 12); // period 2P
    }
  });
  it('a single key is a constant under every rule', () => {
    for (const r of ['clamp', 'repeat', 'mirror', 'extend'] as const) {
      const c = prepareCurve(makeDoc([{ time: 1, value: 7, slopeOut: 3 }], [], { before: r, after: r }));
      expect([evaluate(c, -1), evaluate(c, 1), evaluate(c, 4)]).toEqual([7, 7, 7]);
      expect(evaluateDerivative(c, 4, 1)).toBe(0);
      expect(findSegment(c, 1)).toBe(-1);
    }
  });
});

describe('jumps and steps', () => {
  const jump = prepareCurve(makeDoc([
    { time: 0, value: 0 }, { time: 1, value: 1 }, { time: 1, value: 5 }, { time: 2, value: 5 },
  ], 'linear'));
  it('two keys at one time jump in value, right-continuous', () => {
    expect(evaluate(jump, 0.999999)).toBeCloseTo(1, 5);
    expect(evaluate(jump, 1)).toBe(5);
    expect(findSegment(jump, 1)).toBe(2);
    expect(segmentValue(jump, 0, 1)).toBe(1); // left limit from the segment itself
  });
  it('curveBreaks lists the jump', () => {
    expect(curveBreaks(jump)).toEqual([{ time: 1, jump: true, order: 0 }]);
  });
  it('step holds v_k on [t_k, t_{k+1}) as glTF STEP, the last key value at the end', () => {
    const c = prepareCurve(makeDoc([{ time: 0, value: 2 }, { time: 1, value: 4 }, { time: 2, value: 8 }], 'step'));
    expect(evaluateMany(c, [0, 0.5, 0.999, 1, 1.5, 2, 3])).toEqual(new Float64Array([2, 2, 2, 4, 4, 8, 8]));
    // the last step jumps to the last key's value exactly at the end
    expect(curveBreaks(c)).toEqual([{ time: 1, jump: true, order: 0 }, { time: 2, jump: true, order: 0 }]);
  });
});

describe('findSegment and evaluateMany', () => {
  const many = prepareCurve(makeDoc(linspace(0, 10, 200).map((t) => ({ time: t, value: Math.sin(t), rule: 'catmull-rom' as const }))));
  it('findSegment returns i with times[i] ≤ t < times[i+1] for any visiting order; the end is in the last segment', () => {
    const ts = [...linspace(0, 10, 997), ...linspace(10, 0, 313), 3.3, 0.01, 9.99, 5];
    for (const t of ts) {
      const i = findSegment(many, t);
      expect(many.times[i]).toBeLessThanOrEqual(t);
      if (i < many.count - 2) expect(t).toBeLessThan(many.times[i + 1]);
    }
    expect(findSegment(many, 10)).toBe(many.count - 2);
  });
  it('evaluateMany equals evaluate and evaluateDerivative point by point, into a reused buffer', () => {
    const ts = linspace(-1, 11, 1000).map((t, i) => (i % 7 === 0 ? 10 - t : t));
    const out = new Float64Array(ts.length);
    for (const order of [0, 1, 2] as const) {
      const r = evaluateMany(many, ts, out, order);
      expect(r).toBe(out);
      ts.forEach((t, k) => expect(r[k]).toBe(order === 0 ? evaluate(many, t) : evaluateDerivative(many, t, order)));
    }
    expect(() => evaluateMany(many, ts, new Float64Array(3))).toThrow(/out holds 3 entries/);
  });
});

describe('shape segments inside a curve', () => {
  it('v = v_k + Δv·f(s) with derivatives Δv·f^(k)/h^k, bound scaled the same way', () => {
    const shape = { family: 'back', ease: 'out' } as const;
    const c = prepareCurve(makeDoc([{ time: 2, value: 10 }, { time: 2.5, value: 4 }], [{ kind: 'shape', shape }]));
    for (const t of linspace(2, 2.49, 20)) {
      const s = (t - 2) / 0.5;
      expect(evaluate(c, t)).toBeCloseTo(10 - 6 * shapeValue(shape, s), 12);
      expect(evaluateDerivative(c, t, 2)).toBeCloseTo((-6 * shapeValue(shape, s, 2)) / 0.25, 9);
    }
    let m = 0;
    for (const t of linspace(2, 2.5, 2000)) m = Math.max(m, Math.abs(segmentValue(c, 0, t, 3)));
    expect(segmentDerivativeBound(c, 0, 3, 2, 2.5)).toBeGreaterThanOrEqual(m);
  });
  it('curveBreaks: bounce joints, a slope break between kinds, and an unsettled spring end', () => {
    const c = prepareCurve(makeDoc(
      [{ time: 0, value: 0 }, { time: 1.1, value: 1 }, { time: 2, value: 0 }, { time: 3, value: 2 }],
      [
        { kind: 'shape', shape: { family: 'bounce', ease: 'out' } },
        { kind: 'linear' },
        { kind: 'shape', shape: { family: 'spring', ease: 'out', params: { stiffness: 20, damping: 1 } } },
      ],
    ));
    const br = curveBreaks(c);
    expect(br.slice(0, 3).map((b) => b.time)).toEqual([0.4, 0.8, 1].map((x) => expect.closeTo(x, 12)));
    expect(br.slice(0, 3).every((b) => b.order === 1 && !b.jump)).toBe(true);
    expect(br[3]).toMatchObject({ time: 1.1, order: 1, jump: false }); // bounce ends with slope 0, linear −1/0.9
    expect(br[4]).toMatchObject({ time: 2, order: 1 });
    expect(br[5]).toMatchObject({ time: 3, jump: true, order: 0 }); // the spring has not settled at 1
  });
  it('a smooth join lists no break: sine in-out split at a key into in and out halves', () => {
    // (1 − cos(πt/2))/2 on [0, 2] is sine in on [0, 1] and sine out on [1, 2], each scaled by ½:
    // every derivative matches at t = 1 (f'' = (π/2)²·cos(π/2)/2 = 0 on both sides).
    const c = prepareCurve(makeDoc([{ time: 0, value: 0 }, { time: 1, value: 0.5 }, { time: 2, value: 1 }], [
      { kind: 'shape', shape: { family: 'sine', ease: 'in' } }, { kind: 'shape', shape: { family: 'sine', ease: 'out' } },
    ]));
    expect(curveBreaks(c)).toEqual([]);
    // while quad in + quad out (f'' = ±2 per half) breaks at order 2
    const q = prepareCurve(makeDoc([{ time: 0, value: 0 }, { time: 1, value: 0.5 }, { time: 2, value: 1 }], [
      { kind: 'shape', shape: { family: 'quad', ease: 'in' } }, { kind: 'shape', shape: { family: 'quad', ease: 'out' } },
    ]));
    expect(curveBreaks(q)).toEqual([{ time: 1, jump: false, order: 2 }]);
  });
});
