// Tests for shared/convert/fit.ts, fit-curve.ts and samples.ts.
// Sources: d3-ease 3.0.2 (the shapes sampled), Math.sin; the uniform comparison is an independent
// cubic Hermite interpolation at evenly spaced keys with the exact values and slopes of the function
// (Burden & Faires §3.4, from memory; REFERENCES.md "Interpolation error").
import { describe, expect, it } from 'vitest';
import * as d3 from 'd3-ease';
import { fitSamples, type FitKey } from '../../../shared/convert/fit';
import { fitCurve, fitResultToCurve } from '../../../shared/convert/fit-curve';
import { parseSamples } from '../../../shared/convert/samples';
import { evaluate, parseCurveDocument, prepareCurve, type CurveDocument } from '../../../shared/curve';

/** Hermite form of REFERENCES.md / glTF 2.0 Appendix C. */
function hermite(v0: number, m0: number, v1: number, m1: number, h: number, s: number) {
  const s2 = s * s, s3 = s2 * s;
  return (2 * s3 - 3 * s2 + 1) * v0 + h * (s3 - 2 * s2 + s) * m0 + (-2 * s3 + 3 * s2) * v1 + h * (s3 - s2) * m1;
}

function denseError(keys: FitKey[], f: (t: number) => number, per = 400): number {
  let mx = 0;
  for (let k = 0; k + 1 < keys.length; k++) {
    const a = keys[k], b = keys[k + 1], h = b.time - a.time;
    for (let j = 0; j <= per; j++) mx = Math.max(mx, Math.abs(hermite(a.value, a.slope, b.value, b.slope, h, j / per) - f(a.time + (j / per) * h)));
  }
  return mx;
}

/**
 * Smallest n of evenly spaced keys whose Hermite interpolant (exact values; slopes by a central
 * difference with step 1e-7, error ~1e-9) meets tol, measured at 63 points inside each interval.
 */
function uniformExactKeys(f: (t: number) => number, T: number, tol: number): number {
  const df = (x: number) => {
    const e = 1e-7, a = Math.max(0, x - e), b = Math.min(T, x + e);
    return (f(b) - f(a)) / (b - a);
  };
  for (let n = 2; n < 400; n++) {
    const h = T / (n - 1);
    let mx = 0;
    for (let k = 0; k < n - 1 && mx <= tol; k++) {
      const a = k * h;
      for (let j = 1; j < 64; j++) mx = Math.max(mx, Math.abs(hermite(f(a), df(a), f(a + h), df(a + h), h, j / 64) - f(a + (j / 64) * h)));
    }
    if (mx <= tol) return n;
  }
  return Infinity;
}

function sampled(f: (t: number) => number, T: number, n = 1001) {
  const t = new Float64Array(n), y = new Float64Array(n);
  for (let i = 0; i < n; i++) { t[i] = (T * i) / (n - 1); y[i] = f(t[i]); }
  return { t, y };
}

describe('fitSamples (key reduction)', () => {
  it('the uniform comparison reproduces the REFERENCES.md sinInOut table', () => {
    // REFERENCES.md: sinInOut with exact slopes, n = 4 intervals → actual 4.53e-4; n = 8 → 3.03e-5
    expect(uniformExactKeys(d3.easeSinInOut, 1, 4.54e-4)).toBe(5);
    expect(uniformExactKeys(d3.easeSinInOut, 1, 4.52e-4)).toBeGreaterThan(5);
    expect(uniformExactKeys(d3.easeSinInOut, 1, 3.04e-5)).toBe(9);
  });

  // d3-ease 3.0.2 shapes and sin; all smooth on the sampled interval
  const cases: [string, (t: number) => number, number][] = [
    ['d3 easeSinInOut', d3.easeSinInOut, 1],
    ['d3 easeCubicInOut', d3.easeCubicInOut, 1],
    ['d3 easeBackOut', d3.easeBackOut, 1],
    ['d3 easeElasticOut', d3.easeElasticOut, 1],
    ['d3 easeExpOut', d3.easeExpOut, 1],
    ['d3 easeQuadInOut', d3.easeQuadInOut, 1],
    ['Math.sin on [0, 2π]', Math.sin, 2 * Math.PI],
  ];
  for (const tol of [1e-3, 1e-4]) {
    for (const [name, f, T] of cases) {
      it(`${name}, tolerance ${tol}: within tolerance densely, no more keys than a uniform fit`, () => {
        const { t, y } = sampled(f, T);
        const r = fitSamples(t, y, tol);
        expect(r.ok).toBe(true);
        expect(r.maxError).toBeLessThanOrEqual(tol);
        // dense evaluation against the true function (400 points per segment)
        expect(denseError(r.keys, f)).toBeLessThanOrEqual(tol);
        expect(r.keys.length).toBeLessThanOrEqual(uniformExactKeys(f, T, tol));
        expect(r.keys[0].time).toBe(0);
        expect(r.keys[r.keys.length - 1].time).toBe(T);
      });
    }
  }

  it('d3 easeBounceOut: within tolerance at the samples (its kinks lie between samples)', () => {
    // d3-ease bounceOut has slope jumps at 4/11, 8/11, 10/11 (REFERENCES.md), which samples can only bracket
    const { t, y } = sampled(d3.easeBounceOut, 1);
    const r = fitSamples(t, y, 1e-3);
    expect(r.maxErrorAtSamples).toBeLessThanOrEqual(1e-3);
    expect(r.keys.length).toBeLessThan(30);
  });

  it('noisy samples: fits within tolerance of the data and near the clean curve', () => {
    // sin with deterministic noise in ±4e-4 (a linear congruential generator, common practice)
    let seed = 12345;
    const noise = () => { seed = (seed * 1103515245 + 12345) % 2147483648; return (seed / 2147483648 - 0.5) * 8e-4; };
    const { t, y } = sampled(Math.sin, Math.PI, 2001);
    for (let i = 0; i < y.length; i++) y[i] += noise();
    const r = fitSamples(t, y, 2e-3);
    expect(r.ok).toBe(true);
    for (let i = 0; i < t.length; i++) {
      let k = 0;
      while (k < r.keys.length - 2 && t[i] >= r.keys[k + 1].time) k++;
      const a = r.keys[k], b = r.keys[k + 1];
      expect(Math.abs(hermite(a.value, a.slope, b.value, b.slope, b.time - a.time, (t[i] - a.time) / (b.time - a.time)) - y[i])).toBeLessThanOrEqual(2e-3);
    }
    expect(denseError(r.keys, Math.sin)).toBeLessThanOrEqual(2e-3 + 4e-4);
    expect(r.keys.length).toBeLessThan(12);
  });

  it('noisy samples with the tolerance just above the noise: still within tolerance at every sample', () => {
    // d3 easeElasticOut + deterministic noise in ±1e-3 (LCG, common practice), 10001 samples, tolerance 1.1e-3
    let seed = 7;
    const { t, y } = sampled(d3.easeElasticOut, 1, 10001);
    for (let i = 0; i < y.length; i++) { seed = (seed * 1103515245 + 12345) % 2147483648; y[i] += (seed / 2147483648 - 0.5) * 2e-3; }
    const r = fitSamples(t, y, 1.1e-3);
    expect(r.ok).toBe(true);
    let k = 0;
    for (let i = 0; i < t.length; i++) {
      while (k < r.keys.length - 2 && t[i] >= r.keys[k + 1].time) k++;
      const a = r.keys[k], b = r.keys[k + 1];
      expect(Math.abs(hermite(a.value, a.slope, b.value, b.slope, b.time - a.time, (t[i] - a.time) / (b.time - a.time)) - y[i])).toBeLessThanOrEqual(1.1e-3);
    }
    expect(r.keys.length).toBeLessThan(t.length / 4);
  });

  it('gives a valid curve document whose evaluation matches the fitted keys', () => {
    const { t, y } = sampled(d3.easeSinInOut, 1);
    const r = fitSamples(t, y, 1e-4);
    const doc = fitResultToCurve(r, { name: 'jump-arc' });
    const parsed = parseCurveDocument(doc);
    expect(parsed.ok, JSON.stringify(!parsed.ok && parsed.issues)).toBe(true);
    const c = prepareCurve(doc);
    for (let i = 0; i <= 100; i++) expect(Math.abs(evaluate(c, i / 100) - d3.easeSinInOut(i / 100))).toBeLessThanOrEqual(1e-4);
  });

  it('rejects bad input naming the field', () => {
    expect(() => fitSamples(Float64Array.of(0, 1), Float64Array.of(0, 1), 0)).toThrow(/tolerance/);
    expect(() => fitSamples(Float64Array.of(0, 0), Float64Array.of(0, 1), 1e-3)).toThrow(/samples\[1\]\.time/);
  });
});

describe('fitCurve (shape and bezier segments to hermite keys)', () => {
  const base = (segments: CurveDocument['segments'], values = [0, 1]): CurveDocument => ({
    format: 'tangentry.curve', version: 1, name: 'menu-panel-in', units: { time: 's', value: 'px' },
    before: 'clamp', after: 'clamp', frameRate: 60, drives: 'position', tags: [],
    keys: values.map((v, i) => ({ time: i * 0.8, value: v, slopeIn: 0, slopeOut: 0, rule: 'manual' as const, slopes: 'joined' as const })),
    segments,
  });
  const shapes: CurveDocument['segments'][number][] = [
    { kind: 'shape', shape: { family: 'elastic', ease: 'out' } },
    { kind: 'shape', shape: { family: 'bounce', ease: 'out' } },
    { kind: 'shape', shape: { family: 'back', ease: 'in-out' } },
    { kind: 'bezier', bezier: { h1: { time: 0.2, value: 0.1 }, h2: { time: 0.2, value: 1 } } },
  ];
  for (const seg of shapes) {
    it(`${seg.kind} ${seg.shape ? seg.shape.family + ' ' + seg.shape.ease : ''}: hermite keys within tolerance of the source densely`, () => {
      const src = base([seg], [10, 250]);
      const p = parseCurveDocument(src);
      expect(p.ok).toBe(true);
      const c = prepareCurve(src);
      const tol = 0.05; // px
      const r = fitCurve(c, tol);
      expect(r.converted).toEqual([0]);
      expect(r.ok).toBe(true);
      expect(r.doc.segments.every((s) => s.kind === 'hermite')).toBe(true);
      expect(parseCurveDocument(r.doc).ok).toBe(true);
      const out = prepareCurve(r.doc);
      let mx = 0;
      for (let i = 0; i <= 8000; i++) {
        const x = (0.8 * i) / 8000;
        mx = Math.max(mx, Math.abs(evaluate(out, x) - evaluate(c, x)));
      }
      expect(mx).toBeLessThanOrEqual(tol);
      expect(r.doc.keys[0].value).toBe(10);
      expect(r.doc.keys[r.doc.keys.length - 1].value).toBe(250);
    });
  }
  it('keeps step, linear and hermite segments exactly', () => {
    const src = base([{ kind: 'linear' }, { kind: 'shape', shape: { family: 'sine', ease: 'in-out' } }, { kind: 'step' }], [0, 1, 3, 2]);
    const c = prepareCurve(src);
    const r = fitCurve(c, 1e-4);
    expect(r.converted).toEqual([1]);
    expect(r.doc.segments[0]).toEqual({ kind: 'linear' });
    expect(r.doc.segments[r.doc.segments.length - 1]).toEqual({ kind: 'step' });
    const out = prepareCurve(r.doc);
    for (let i = 0; i <= 240; i++) expect(Math.abs(evaluate(out, i / 100) - evaluate(c, i / 100))).toBeLessThanOrEqual(1e-4);
  });
});

describe('parseSamples', () => {
  it('reads CSV with or without a header and with , ; or tab', () => {
    for (const text of ['time,value\n0,1\n0.5,2\n1,4\n', '0;1\n0.5;2\n\n# note\n1;4', 't\tv\r\n0\t1\r\n0.5\t2\r\n1\t4']) {
      const r = parseSamples(text);
      expect(r.ok, JSON.stringify(r)).toBe(true);
      if (r.ok) { expect([...r.samples.times]).toEqual([0, 0.5, 1]); expect([...r.samples.values]).toEqual([1, 2, 4]); }
    }
  });
  it('reads JSON pairs and objects', () => {
    const a = parseSamples('[[0, 1], [1, 2]]');
    const b = parseSamples('[{"time": 0, "value": 1}, {"time": 1, "value": 2}]');
    expect(a.ok && [...a.samples.values]).toEqual([1, 2]);
    expect(b.ok && [...b.samples.times]).toEqual([0, 1]);
  });
  const bad: [string, RegExp][] = [
    ['time,value\n0,1\n0.5,abc\n1,4', /line 3, column 5: value "abc" is not a number/],
    ['0,1\n0.5,2\n0.4,3', /line 3, column 1: time 0.4 must be greater than the previous time 0.5/],
    ['0,1\n0.5,2,7', /line 2: expected 2 columns/],
    ['0,1', /at least 2 samples/],
    ['[[0, 1], [1, "x"]]', /\[1\]\.value: must be a finite number/],
    ['[[0, 1], [0, 2]]', /\[1\]\.time: 0 must be greater/],
    ['[[0, 1],', /JSON:/],
  ];
  for (const [text, re] of bad) {
    it(`error names the place: ${JSON.stringify(text).slice(0, 30)}`, () => {
      const r = parseSamples(text);
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.error).toMatch(re);
    });
  }
});
