import { describe, expect, it } from 'vitest';
import { DEMO_PACKS } from '../../../server/seed/demo-packs';
import { SEGMENT_KINDS, evaluateMany, parseCurveDocument, prepareCurve } from '../../../shared/curve';
import { PACK_SLUG } from '../../../shared/schemas/packs';

/** Peaks above half brightness per second: a rising crossing of 0.5 counts one flash (common practice for a quick check). */
function flashesPerSecond(doc: Parameters<typeof prepareCurve>[0]): number {
  const c = prepareCurve(doc);
  const t0 = doc.keys[0]!.time;
  const t1 = doc.keys[doc.keys.length - 1]!.time;
  const n = 2001;
  const times = Float64Array.from({ length: n }, (_, i) => t0 + ((t1 - t0) * i) / (n - 1));
  const v = evaluateMany(c, times);
  let rises = 0;
  for (let i = 1; i < n; i++) if (v[i - 1]! < 0.5 && v[i]! >= 0.5) rises++;
  return rises / Math.max(1, t1 - t0);
}

describe('demo packs (BRIEF.md demo scenario)', () => {
  it('are the brief’s five packs, each with 2–4 curves, in its two teams', () => {
    expect(DEMO_PACKS.map((p) => p.slug).sort()).toEqual(['audio-fades', 'camera-moves', 'hit-flashes', 'jump-arcs', 'menu-transitions']);
    for (const p of DEMO_PACKS) {
      expect(p.slug).toMatch(PACK_SLUG);
      expect(['ui-motion', 'gameplay-feel']).toContain(p.team);
      expect(p.curves.length).toBeGreaterThanOrEqual(2);
      expect(p.curves.length).toBeLessThanOrEqual(4);
      expect(new Set(p.curves.map((c) => c.name)).size).toBe(p.curves.length);
    }
  });

  it('every curve is a valid curve document', () => {
    for (const p of DEMO_PACKS) {
      for (const c of p.curves) {
        const r = parseCurveDocument(JSON.parse(JSON.stringify(c)));
        expect(r.ok ? [] : r.issues, `${p.slug}/${c.name}`).toEqual([]);
      }
    }
  });

  it('together they use every segment kind', () => {
    const kinds = new Set(DEMO_PACKS.flatMap((p) => p.curves.flatMap((c) => c.segments.map((s) => s.kind))));
    expect([...kinds].sort()).toEqual([...SEGMENT_KINDS].sort());
  });

  it('hit-flashes drives brightness and flashes more than three times a second somewhere (WCAG 2.3.1 threshold)', () => {
    const pack = DEMO_PACKS.find((p) => p.slug === 'hit-flashes')!;
    expect(pack.curves.every((c) => c.drives === 'brightness')).toBe(true);
    expect(Math.max(...pack.curves.map(flashesPerSecond))).toBeGreaterThan(3);
  });
});
