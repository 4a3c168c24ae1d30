/**
 * What changed between two pack versions, from their stored sources (pure; no I/O):
 *   curves added, removed, unchanged (identical canonical JSON) and changed; for each changed curve the
 *   largest |new(t) − old(t)| found by dense evaluation (evaluateMany, shared/curve) and the time where
 *   it occurs. Samples: DENSE evenly spaced times over the union of both domains, plus every key time of
 *   both documents (where piecewise-linear and step differences peak). Each version's own outside rules
 *   apply where one domain is longer than the other. Per target: bytes and worst error ratio of each.
 */
import { evaluateMany, prepareCurve, type CurveDocument } from '../../shared/curve';
import type { BakeSummary, CurveChange, VersionComparison } from '../../shared/schemas/versions';
import { canonicalJson } from './canonical-json';

export const DENSE = 4097;

export function maxDeviation(a: CurveDocument, b: CurveDocument, dense = DENSE): { maxDeviation: number; at: number; from: number; to: number } {
  const a0 = a.keys[0]!.time, a1 = a.keys[a.keys.length - 1]!.time;
  const b0 = b.keys[0]!.time, b1 = b.keys[b.keys.length - 1]!.time;
  const t0 = Math.min(a0, b0);
  const t1 = Math.max(a1, b1);
  const keyTimes = [...a.keys, ...b.keys].map((k) => k.time);
  const n = dense + keyTimes.length;
  const times = new Float64Array(n);
  for (let i = 0; i < dense; i++) times[i] = dense === 1 ? t0 : t0 + ((t1 - t0) * i) / (dense - 1);
  for (let i = 0; i < keyTimes.length; i++) times[dense + i] = keyTimes[i]!;
  const va = evaluateMany(prepareCurve(a), times);
  const vb = evaluateMany(prepareCurve(b), times);
  let max = 0;
  let at = t0;
  for (let i = 0; i < n; i++) {
    const d = Math.abs(vb[i]! - va[i]!);
    if (d > max) { max = d; at = times[i]!; }
  }
  return { maxDeviation: max, at, from: t0, to: t1 };
}

export function compareVersions(
  from: { number: number; curves: CurveDocument[]; bakeSummary: BakeSummary[] },
  to: { number: number; curves: CurveDocument[]; bakeSummary: BakeSummary[] },
): VersionComparison {
  const old = new Map(from.curves.map((c) => [c.name, c]));
  const now = new Map(to.curves.map((c) => [c.name, c]));
  const added = to.curves.filter((c) => !old.has(c.name)).map((c) => c.name);
  const removed = from.curves.filter((c) => !now.has(c.name)).map((c) => c.name);
  const unchanged: string[] = [];
  const changed: CurveChange[] = [];
  for (const c of to.curves) {
    const o = old.get(c.name);
    if (!o) continue;
    if (canonicalJson(o) === canonicalJson(c)) { unchanged.push(c.name); continue; }
    const d = maxDeviation(o, c);
    changed.push({ name: c.name, unit: c.units.value, maxDeviation: d.maxDeviation, at: d.at, domain: [d.from, d.to], keysBefore: o.keys.length, keysAfter: c.keys.length, before: o, after: c });
  }
  const profiles = [...new Set([...from.bakeSummary.map((s) => s.profile), ...to.bakeSummary.map((s) => s.profile)])];
  const targets = profiles.map((profile) => {
    const a = from.bakeSummary.find((s) => s.profile === profile);
    const b = to.bakeSummary.find((s) => s.profile === profile);
    return { profile, bytesBefore: a?.bytes ?? null, bytesAfter: b?.bytes ?? null, worstRatioBefore: a?.worstRatio ?? null, worstRatioAfter: b?.worstRatio ?? null };
  });
  return { from: from.number, to: to.number, added, removed, changed, unchanged, targets };
}
