/**
 * Bake one curve document for one target profile with the shared baker, reduced to what the target
 * strip and the canvas overlay show. Runs in a Web Worker (./bake.worker.ts) or, where there is no
 * Worker, on the main thread. The server's bake stays the authority when a curve is saved.
 */
import { bakeCurve, sourceFromDocument, type Profile } from '../../../../shared/bake';
import type { CurveDocument } from '../../../../shared/curve';
import { verdictFor, type Verdict } from './verdict';

/** Entries beyond this many are thinned (every k-th kept) for the overlay dots. */
export const OVERLAY_MAX_DOTS = 2000;

export type StripResult =
  | {
      ok: true;
      profile: string;
      entries: number;
      bytes: number;
      maxError: number;
      maxErrorAt: number;
      tolerance: number;
      certified: number;
      method: string;
      withinCap: boolean | null;
      verdict: Verdict;
      /** Entry times and decoded values for the overlay (thinned to OVERLAY_MAX_DOTS). */
      dotTimes: Float64Array;
      dotValues: Float64Array;
      /** Milliseconds the bake took. */
      ms: number;
    }
  | { ok: false; profile: string; error: string; verdict: 'over'; ms: number };

export function bakeForStrip(doc: CurveDocument, profile: Profile, now: () => number = () => performance.now()): StripResult {
  const started = now();
  let b;
  try {
    b = bakeCurve(sourceFromDocument(doc), profile, { frameRate: doc.frameRate });
  } catch (e) {
    return { ok: false, profile: profile.name, error: (e as Error).message, verdict: 'over', ms: now() - started };
  }
  if (!b.ok) return { ok: false, profile: profile.name, error: b.error, verdict: 'over', ms: now() - started };
  const { table, report } = b;
  const step = Math.max(1, Math.ceil(table.count / OVERLAY_MAX_DOTS));
  const m = Math.ceil(table.count / step);
  const dotTimes = new Float64Array(m);
  const dotValues = new Float64Array(m);
  for (let j = 0, k = 0; j < m; j++, k += step) { dotTimes[j] = table.times[k]; dotValues[j] = table.values[k]; }
  return {
    ok: true, profile: profile.name, entries: report.entries, bytes: report.bytes, maxError: report.maxError,
    maxErrorAt: report.maxErrorAt, tolerance: report.tolerance, certified: report.certified, method: report.method,
    withinCap: report.withinCap, verdict: verdictFor(report.maxError, report.tolerance, report.withinCap),
    dotTimes, dotValues, ms: now() - started,
  };
}
