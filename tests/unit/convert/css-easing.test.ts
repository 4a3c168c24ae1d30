// Tests for shared/convert/css-easing.ts and css-curve.ts.
// Sources: W3C CSS Easing Functions Level 1 (keyword control points, steps() algorithm, extension
// outside [0,1]) and Level 2 (linear()), with the check values in /work/shared/REFERENCES.md;
// bezier-easing 3.2.0 as an independent solver inside [0,1].
import { describe, expect, it } from 'vitest';
import BezierEasing from 'bezier-easing';
import { parseCssEasing, evaluateCssEasing, formatCssEasing, type CssEasing } from '../../../shared/convert/css-easing';
import { cssToCurve, curveToCss } from '../../../shared/convert/css-curve';
import { evaluate, parseCurveDocument, prepareCurve } from '../../../shared/curve';

function parse(s: string): CssEasing {
  const r = parseCssEasing(s);
  if (!r.ok) throw new Error(r.error);
  return r.easing;
}
const at = (s: string, x: number) => evaluateCssEasing(parse(s), x);

describe('CSS Easing Level 1 keywords', () => {
  it('have the control points of the specification (§2.2)', () => {
    // W3C CSS Easing Level 1 §2.2 keyword definitions
    expect(parse('ease')).toEqual({ kind: 'cubic-bezier', x1: 0.25, y1: 0.1, x2: 0.25, y2: 1 });
    expect(parse('ease-in')).toEqual({ kind: 'cubic-bezier', x1: 0.42, y1: 0, x2: 1, y2: 1 });
    expect(parse('ease-out')).toEqual({ kind: 'cubic-bezier', x1: 0, y1: 0, x2: 0.58, y2: 1 });
    expect(parse('EASE-IN-OUT')).toEqual({ kind: 'cubic-bezier', x1: 0.42, y1: 0, x2: 0.58, y2: 1 });
    expect(parse('step-start')).toEqual({ kind: 'steps', steps: 1, position: 'jump-start' });
    expect(parse('step-end')).toEqual({ kind: 'steps', steps: 1, position: 'jump-end' });
    expect(parse('linear')).toEqual({ kind: 'linear', points: [{ input: 0, output: 0 }, { input: 1, output: 1 }] });
  });

  it('ease and ease-in-out take the REFERENCES.md values (6 decimals)', () => {
    // REFERENCES.md "W3C CSS Easing Functions": ease 0.408511 / 0.802403 / 0.960459; ease-in-out 0.129162 / 0.5 / 0.870838
    expect(at('ease', 0.25)).toBeCloseTo(0.408511, 6);
    expect(at('ease', 0.5)).toBeCloseTo(0.802403, 6);
    expect(at('ease', 0.75)).toBeCloseTo(0.960459, 6);
    expect(at('ease-in-out', 0.25)).toBeCloseTo(0.129162, 6);
    expect(at('ease-in-out', 0.5)).toBeCloseTo(0.5, 12);
    expect(at('ease-in-out', 0.75)).toBeCloseTo(0.870838, 6);
  });

  it('agree with bezier-easing 3.2.0 inside [0,1]', () => {
    // bezier-easing 3.2.0 clamps x to [0,1] (REFERENCES.md), so only [0,1] is compared.
    const cases: [string, number, number, number, number][] = [
      ['ease', 0.25, 0.1, 0.25, 1], ['ease-in', 0.42, 0, 1, 1], ['ease-out', 0, 0, 0.58, 1],
      ['ease-in-out', 0.42, 0, 0.58, 1], ['cubic-bezier(0.68, -0.55, 0.265, 1.55)', 0.68, -0.55, 0.265, 1.55],
      ['cubic-bezier(0, 1, 0, 1)', 0, 1, 0, 1], ['cubic-bezier(1, 0, 1, 0)', 1, 0, 1, 0],
      ['cubic-bezier(0.999, 0, 0.001, 1)', 0.999, 0, 0.001, 1],
    ];
    for (const [src, ...p] of cases) {
      const ref = BezierEasing(p[0], p[1], p[2], p[3]);
      const e = parse(src);
      for (let i = 0; i <= 1000; i++) {
        const x = i / 1000;
        expect(Math.abs(evaluateCssEasing(e, x) - ref(x)), `${src} at ${x}`).toBeLessThan(1e-7);
      }
    }
  });

  it('continue along the end tangents outside [0,1] (§2.2)', () => {
    // REFERENCES.md: ease(−0.5) = −0.2, ease(1.5) = 1
    expect(at('ease', -0.5)).toBeCloseTo(-0.2, 15);
    expect(at('ease', 1.5)).toBe(1);
    // Spec rule when x1 = 0: use the line P0→P2 (ease-out: P2 = (0.58, 1) → slope 1/0.58)
    expect(at('ease-out', -1)).toBeCloseTo(-1 / 0.58, 14);
    // ease-in: x2 = 1, so x > 1 uses the line P1→P3: slope (1 − 0)/(1 − 0.42)
    expect(at('ease-in', 2)).toBeCloseTo(1 + 1 / 0.58, 14);
    // both handles at x = 0 with y > 0: spec says output 0 for x < 0 (no tangent line defined)
    expect(at('cubic-bezier(0, 0.5, 0, 1)', -1)).toBe(0);
  });
});

describe('steps()', () => {
  it('takes the REFERENCES.md values at 0.5', () => {
    // REFERENCES.md: steps(4) at 0.5 → 0.75 / 0.5 / 0.666667 / 0.6 for jump-start / jump-end / jump-none / jump-both
    expect(at('steps(4, jump-start)', 0.5)).toBe(0.75);
    expect(at('steps(4, start)', 0.5)).toBe(0.75);
    expect(at('steps(4)', 0.5)).toBe(0.5);
    expect(at('steps(4, end)', 0.5)).toBe(0.5);
    expect(at('steps(4, jump-none)', 0.5)).toBeCloseTo(0.666667, 6);
    expect(at('steps(4, jump-both)', 0.5)).toBeCloseTo(0.6, 15);
  });

  it('follows the Level 1 §2.3 algorithm outside [0,1] and at the ends', () => {
    // W3C CSS Easing Level 1 §2.3 step algorithm (before flag unset), worked by hand:
    // steps(4): x = −0.5 → ⌊−2⌋ = −2, x < 0 so no clamp to 0 → −0.5; x = 1.5 → ⌊6⌋ = 6 > jumps but x > 1 → 1.5
    expect(at('steps(4)', -0.5)).toBe(-0.5);
    expect(at('steps(4)', 1.5)).toBe(1.5);
    // jump-start at 0: ⌊0⌋ + 1 = 1 → 1/4; jump-end at 1: ⌊4⌋ = 4 → 1
    expect(at('steps(4, jump-start)', 0)).toBe(0.25);
    expect(at('steps(4)', 1)).toBe(1);
    expect(at('steps(4, jump-both)', 1)).toBe(1);
    expect(at('steps(4, jump-none)', 0.99)).toBe(1);
    expect(at('step-start', 0)).toBe(1);
    expect(at('step-end', 0.999)).toBe(0);
  });
});

describe('linear() (CSS Easing Level 2)', () => {
  it('takes the REFERENCES.md check values including outside [0,1]', () => {
    // REFERENCES.md: linear(0, 0.25 75%, 1) at −0.5 / 0.5 / 0.9 / 1.5 → −1/6, 1/6, 0.7, 2.5
    expect(at('linear(0, 0.25 75%, 1)', -0.5)).toBeCloseTo(-1 / 6, 15);
    expect(at('linear(0, 0.25 75%, 1)', 0.5)).toBeCloseTo(1 / 6, 15);
    expect(at('linear(0, 0.25 75%, 1)', 0.9)).toBeCloseTo(0.7, 15);
    expect(at('linear(0, 0.25 75%, 1)', 1.5)).toBeCloseTo(2.5, 15);
    // REFERENCES.md: linear(0, 0.25, 1) at 0.25 / 1.25 → 0.125 / 1.375
    expect(at('linear(0, 0.25, 1)', 0.25)).toBeCloseTo(0.125, 15);
    expect(at('linear(0, 0.25, 1)', 1.25)).toBeCloseTo(1.375, 15);
  });

  it('canonicalises missing and out-of-order positions and two-position stops (Level 2)', () => {
    // Level 2 canonicalisation: first missing → 0, last missing → max(1, largest), runs spaced evenly,
    // a position below an earlier one is raised to it; "0.5 25% 75%" is two points.
    expect(parse('linear(0, 0.5 25% 75%, 1)')).toEqual({ kind: 'linear', points: [
      { input: 0, output: 0 }, { input: 0.25, output: 0.5 }, { input: 0.75, output: 0.5 }, { input: 1, output: 1 }] });
    expect((parse('linear(0, 0.2, 0.4, 0.6, 1 40%)') as { points: { input: number }[] }).points.map((p) => p.input))
      .toEqual([0, 0.1, 0.2, 0.30000000000000004, 0.4]);
    expect((parse('linear(0 20%, 0.5 10%, 1)') as { points: { input: number }[] }).points.map((p) => p.input)).toEqual([0.2, 0.2, 1]);
    expect((parse('linear(0, 1 150%, 2)') as { points: { input: number }[] }).points.map((p) => p.input)).toEqual([0, 1.5, 1.5]);
    // a jump: at the shared position the later point's output is taken
    expect(at('linear(0, 0 50%, 1 50%, 1)', 0.5)).toBe(1);
    expect(at('linear(0, 0 50%, 1 50%, 1)', 0.49)).toBe(0);
  });
});

describe('parse errors name the position', () => {
  const cases: [string, RegExp][] = [
    ['cubic-bezier(0.1, 0.2, 1.3, 1)', /x2 = 1.3 must be in \[0, 1\] at position 23/],
    ['steps(0)', /positive integer.*at position 6/],
    ['steps(1, jump-none)', /jump-none needs at least 2 steps at position 6/],
    ['steps(2, jump-middle)', /unknown step position 'jump-middle'.*at position 9/],
    ['linear(0 10% 20% 30%, 1)', /at most two percentages at position 17/],
    ['linear(0, 1', /expected ',' or '\)'.*at position 11/],
    ['linear(1)', /at least two stops/],
    ['eas', /unknown easing keyword 'eas'.*at position 0/],
    ['ease foo', /unexpected 'foo'.*at position 5/],
    ['cubic-bezier(0.1 0.2, 1, 1)', /expected ',' before y1.*at position 17/],
    ['cubic-bezier(0.1, 0.2, 1, 1px)', /unexpected unit.*at position 27/],
    ['spring(1)', /unknown easing function 'spring\('/],
  ];
  for (const [src, re] of cases) {
    it(src, () => {
      const r = parseCssEasing(src);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error).toMatch(re);
    });
  }
});

describe('CSS easing ⇄ curve document', () => {
  it('a curve document made from an easing keeps its values on [0,1] (checked by the CSS evaluation)', () => {
    for (const src of ['steps(4, jump-start)', 'steps(3, jump-none)', 'steps(5, jump-both)', 'steps(2)', 'linear(0, 0.25 75%, 1)', 'linear(0, 0.5 25% 75%, 1)']) {
      const e = parse(src);
      const d = cssToCurve(e);
      expect(d.segments.length).toBe(d.keys.length - 1);
      // piecewise evaluation of the document's step/linear segments, written out here from the format description
      const value = (x: number) => {
        const k = d.keys;
        let i = 0;
        while (i + 1 < k.length - 1 && x >= k[i + 1].time) i++;
        const s = d.segments[i];
        if (x >= k[k.length - 1].time) return k[k.length - 1].value;
        if (s.kind === 'step') return k[i].value;
        const w = k[i + 1].time - k[i].time;
        return w === 0 ? k[i + 1].value : k[i].value + ((x - k[i].time) / w) * (k[i + 1].value - k[i].value);
      };
      for (let j = 0; j <= 200; j++) {
        const x = j / 200;
        expect(value(x), `${src} at ${x}`).toBeCloseTo(evaluateCssEasing(e, x), 12);
      }
    }
  });

  it('the curve engine evaluates converted documents as the CSS specification does, also outside [0,1]', () => {
    // Expected values: the W3C algorithms (evaluateCssEasing, checked above against the spec values);
    // steps() is compared on [0,1] only: outside it the document clamps while CSS keeps stepping (documented).
    const cases = ['ease', 'ease-in', 'ease-out', 'ease-in-out', 'cubic-bezier(0.68, -0.55, 0.265, 1.55)',
      'cubic-bezier(0, 1.4, 1, -0.4)', 'linear(0, 0.25 75%, 1)', 'linear(0, 0.5 25% 75%, 1)', 'linear(0 0%, 1 0%, 0.5)',
      'linear(0, 0.5 100%, 1 100%)', 'linear(0, 0.3 50%, 0.6 50%, 0.9 50%, 1)', 'steps(4, jump-both)', 'steps(3, jump-none)', 'step-start'];
    for (const src of cases) {
      const e = parse(src);
      const d = cssToCurve(e);
      expect(parseCurveDocument(d).ok, src).toBe(true);
      const c = prepareCurve(d);
      const lo = e.kind === 'steps' ? 0 : -500;
      const hi = e.kind === 'steps' ? 1000 : 1500;
      for (let i = lo; i <= hi; i++) {
        const x = i / 1000;
        expect(Math.abs(evaluate(c, x) - evaluateCssEasing(e, x)), `${src} at ${x}`).toBeLessThan(1e-13);
      }
    }
  });

  it('exports back to the same easing when exact', () => {
    for (const src of ['steps(4, jump-start)', 'steps(3, jump-none)', 'steps(5, jump-both)', 'steps(2, jump-end)',
      'linear(0, 0.25 75%, 1)', 'cubic-bezier(0.25, 0.1, 0.25, 1)', 'cubic-bezier(0.68, -0.55, 0.265, 1.55)']) {
      const r = curveToCss(cssToCurve(parse(src)));
      expect(r.ok, JSON.stringify(r)).toBe(true);
      if (r.ok) expect(formatCssEasing(r.easing)).toBe(formatCssEasing(parse(src)));
    }
    const r = curveToCss(cssToCurve(parse('linear')));
    expect(r.ok && r.css).toBe('linear');
  });

  it('writes a hermite segment as its exact cubic-bezier and a mixed step/linear curve as linear()', () => {
    const base = cssToCurve(parse('linear'));
    // Hermite on [0,2] from 10 to 30 with slopes 5 and 0 → normalised slopes 5·2/20 = 0.5 and 0.
    const herm = { ...base, keys: [{ ...base.keys[0], time: 0, value: 10, slopeIn: 5, slopeOut: 5 }, { ...base.keys[1], time: 2, value: 30, slopeIn: 0, slopeOut: 0 }], segments: [{ kind: 'hermite' as const }] };
    const r = curveToCss(herm);
    expect(r.ok).toBe(true);
    if (r.ok && r.easing.kind === 'cubic-bezier') {
      // Bernstein form of the Hermite cubic p(u) = 3u² − 2u³ + 0.5(u − 2u² + u³): y1 = m0/3, y2 = 1 − m1/3
      expect(r.easing.y1).toBeCloseTo(0.5 / 3, 15);
      expect(r.easing.y2).toBe(1);
      const p = (u: number) => 3 * u * u - 2 * u ** 3 + 0.5 * (u - 2 * u * u + u ** 3);
      for (let u = 0; u <= 1; u += 0.05) expect(evaluateCssEasing(r.easing, u)).toBeCloseTo(p(u), 12);
      expect(r.notes.join(' ')).toMatch(/normalised/);
    }
    const mixed = { ...base, keys: [0, 0.5, 1].map((t, i) => ({ ...base.keys[0], time: t, value: [0, 0.4, 1][i] })), segments: [{ kind: 'step' as const }, { kind: 'linear' as const }] };
    const m = curveToCss(mixed);
    expect(m.ok && m.css).toBe('linear(0 0% 50%, 0.4 50%, 1 100%)');
    expect(at((m.ok && m.css) as string, 0.25)).toBe(0);
    expect(at((m.ok && m.css) as string, 0.75)).toBeCloseTo(0.7, 15);
  });

  it('refuses what CSS cannot write, saying why', () => {
    const base = cssToCurve(parse('linear'));
    const two = { ...base, keys: [0, 0.5, 1].map((t) => ({ ...base.keys[0], time: t })), segments: [{ kind: 'hermite' as const }, { kind: 'linear' as const }] };
    const r = curveToCss(two);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toMatch(/segment 0 is hermite/);
    const sine = { ...base, segments: [{ kind: 'shape' as const, shape: { family: 'sine' as const, ease: 'in-out' as const } }] };
    const s = curveToCss(sine);
    expect(!s.ok && s.reason).toMatch(/not a cubic polynomial/);
  });
});
