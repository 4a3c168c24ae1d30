/**
 * Bake one curve for one target profile, and a pack of curves for several profiles, with the bake
 * report (entries, bytes, a-priori bound, measured error and where, certification method, byte cap).
 */
import type { BakeSource } from './source';
import type { Profile } from './profile';
import { findBreaks } from './breaks';
import { rangeWidthBound, sourceRange } from './ranges';
import { bakeUniform, entryProxy } from './uniform';
import { bakeAdaptive } from './adaptive';
import { aprioriBound } from './bound';
import { payloadBytes, type Table } from './table';
import { ENCODING_BYTES } from './encoding';
import type { Method } from './measure';
import { verticalTangents } from './slopes';

export interface CurveReport {
  name: string;
  profile: string;
  /** Absolute tolerance the table was baked to (relative tolerances resolved). */
  tolerance: number;
  entries: number;
  bytes: number;
  /** A-priori bound (interpolation remainder + encoding round-off); null where no bound applies. */
  bound: number | null;
  /** Largest error found, and its time. */
  maxError: number;
  maxErrorAt: number;
  /** Proven upper bound of the error (≤ tolerance); equals maxError when method is exact. */
  certified: number;
  method: Method;
  /** null when the profile has no byte cap. */
  withinCap: boolean | null;
  sourceKeys: number;
}

export type CurveBake =
  | { ok: true; name: string; profile: string; table: Table; report: CurveReport }
  | { ok: false; name: string; profile: string; error: string };

export interface BakeOptions {
  /** Frame rate of the curve (for frame-aligned tables); default 60. */
  frameRate?: number;
}

/** Absolute tolerance: the value, or value × the curve's value range (range 0 counts as 1). */
export function absoluteTolerance(src: BakeSource, profile: Profile): number {
  if (profile.tolerance.mode === 'absolute') return profile.tolerance.value;
  const r = sourceRange(src, 0);
  const R = r.max - r.min;
  return profile.tolerance.value * (R > 0 ? R : 1);
}

/**
 * CSS output prints normalised values and positions with 9 decimals (./outputs/css.ts): value round-off
 * ≤ 0.5e-9·range; the position round-off (≤ 5e-12 of the duration) is kept inside 1e-6·tolerance.
 */
function cssMargin(src: BakeSource, tol: number): number {
  const r = sourceRange(src, 0);
  return 0.5e-9 * (r.max - r.min) + 1e-6 * tol;
}

export function bakeCurve(src: BakeSource, profile: Profile, opts: BakeOptions = {}): CurveBake {
  const fail = (error: string): CurveBake => ({ ok: false, name: src.name, profile: profile.name, error });
  const S = src.times;
  if (S.length < 2 || !(S[S.length - 1] > S[0])) return fail(`curve "${src.name}": the domain has zero length; nothing to bake`);
  let tol = absoluteTolerance(src, profile);
  if (profile.output === 'css') tol -= cssMargin(src, tol);
  if (profile.encoding === 'unorm8' || profile.encoding === 'unorm16') {
    const M = profile.encoding === 'unorm8' ? 255 : 65535;
    // the check compares the sampled range (sourceRange); for a uniform bake a bound of its width from the
    // stand-ins the bake reads its entries from anyway settles most curves without sampling (only one it
    // does not clear is sampled: the same decision either way)
    if (profile.layout !== 'uniform' || rangeWidthBound(src, entryProxy(src, tol)) / (2 * M) >= tol) {
      const r = sourceRange(src, 0);
      const q = (r.max - r.min) / (2 * M);
      if (q >= tol) {
        return fail(`curve "${src.name}": ${profile.encoding} round-off over the value range ${(r.max - r.min).toPrecision(4)} is up to ${q.toPrecision(3)} (range/(2·${M})), not below the tolerance ${tol.toPrecision(3)}`);
      }
    }
  }
  const breaks = findBreaks(src, 3);
  let table: Table, measure;
  try {
    const r = profile.layout === 'uniform'
      ? bakeUniform(src, profile, tol, breaks, opts.frameRate ?? 60)
      : bakeAdaptive(src, profile, tol, breaks);
    if (typeof r === 'string') return fail(withTangents(src, profile, r));
    table = r.table; measure = r.measure;
  } catch (e) {
    return fail(withTangents(src, profile, `curve "${src.name}": ${(e as Error).message}`));
  }
  // the guarantee "a reported table is certified within tolerance", checked once more: every decoded
  // number finite, the certified error a finite number ≤ the tolerance (NaN fails every comparison)
  const nonFinite = firstNonFinite(table);
  if (nonFinite) return fail(withTangents(src, profile, `curve "${src.name}": the table would hold a non-finite ${nonFinite}; not emitted`));
  if (!(measure.certified <= tol) || !Number.isFinite(measure.maxError)) {
    return fail(withTangents(src, profile, `curve "${src.name}": the table's error could not be certified within ${tol.toPrecision(3)} (certified ${measure.certified})`));
  }
  const epsV = roundOffBound(table, 'values');
  const epsM = roundOffBound(table, 'slopes');
  const bound = aprioriBound(src, profile.kernel, table.times, breaks, epsV, epsM, profile.layout === 'adaptive');
  const bytes = payloadBytes(profile.layout, profile.kernel, ENCODING_BYTES[profile.encoding], table.count);
  const report: CurveReport = {
    name: src.name, profile: profile.name, tolerance: tol, entries: table.count, bytes, bound,
    maxError: measure.maxError, maxErrorAt: measure.at, certified: measure.certified, method: measure.method,
    withinCap: profile.byteCap === undefined ? null : bytes <= profile.byteCap, sourceKeys: S.length,
  };
  return { ok: true, name: src.name, profile: profile.name, table, report };
}

/** The first non-finite decoded number of a table, named ("slope 3 (-Infinity)"), or null. */
export function firstNonFinite(table: Table): string | null {
  const check = (xs: ArrayLike<number> | null, what: string): string | null => {
    if (!xs) return null;
    for (let k = 0; k < xs.length; k++) if (!Number.isFinite(xs[k])) return `${what} ${k} (${xs[k]})`;
    return null;
  };
  return check(table.times, 'time') ?? check(table.values, 'value') ?? (table.kernel === 'hermite' ? check(table.slopes, 'slope') : null);
}

/** A failure message, with the source's vertical tangents named for hermite tables (their slopes are replaced there). */
function withTangents(src: BakeSource, profile: Profile, message: string): string {
  if (profile.kernel !== 'hermite') return message;
  const vt = verticalTangents(src);
  if (!vt.length) return message;
  return `${message}; the source has a vertical tangent (infinite slope) at t = ${vt.map((t) => `${t} s`).join(', ')}`;
}

/**
 * Worst-case round-off of the encoding (a-priori, from the format alone): f32 |x|·2⁻²⁴, f16 |x|·2⁻¹¹ (or
 * 2⁻²⁵ below the normal range), unorm scale/(2(2ⁿ−1)) (IEEE 754-2008; glTF 2.0 / OpenGL ES 3.0 §2.1.6.1).
 */
export function roundOffBound(table: Table, which: 'values' | 'slopes'): number {
  const xs = which === 'values' ? table.values : table.slopes;
  if (!xs) return 0;
  const scale = which === 'values' ? table.valueScale : table.slopeScale;
  let maxAbs = 0;
  for (let i = 0; i < xs.length; i++) maxAbs = Math.max(maxAbs, Math.abs(xs[i]));
  switch (table.encoding) {
    case 'f32': return maxAbs * 2 ** -24;
    case 'f16': return Math.max(maxAbs * 2 ** -11, 2 ** -25);
    case 'unorm16': return scale / (2 * 65535);
    case 'unorm8': return scale / (2 * 255);
  }
}

export interface PackTotals {
  profile: string;
  curves: number;
  failed: number;
  entries: number;
  bytes: number;
  overCap: number;
  worstRatio: number;
  methods: Record<Method, number>;
}

export interface PackBake { bakes: CurveBake[]; totals: PackTotals[] }

/** Bake every curve for every profile (profile-major order), with totals per profile. */
export function bakePack(sources: readonly BakeSource[], profiles: readonly Profile[], opts: BakeOptions = {}): PackBake {
  const bakes: CurveBake[] = [];
  const totals: PackTotals[] = [];
  for (const p of profiles) {
    const t: PackTotals = { profile: p.name, curves: 0, failed: 0, entries: 0, bytes: 0, overCap: 0, worstRatio: 0, methods: { exact: 0, 'sampled+bound': 0 } };
    for (const s of sources) {
      const b = bakeCurve(s, p, opts);
      bakes.push(b);
      t.curves++;
      if (!b.ok) { t.failed++; continue; }
      t.entries += b.report.entries;
      t.bytes += b.report.bytes;
      if (b.report.withinCap === false) t.overCap++;
      t.worstRatio = Math.max(t.worstRatio, b.report.certified / b.report.tolerance);
      t.methods[b.report.method]++;
    }
    totals.push(t);
  }
  return { bakes, totals };
}
