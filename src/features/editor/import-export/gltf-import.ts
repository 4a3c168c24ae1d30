/**
 * A glTF 2.0 animation channel into the editor (.gltf or .glb bytes, read by shared/convert readGltf):
 * `readGltfChannels` lists every channel with its components (x/y/z for translation and scale,
 * x/y/z/w for a rotation quaternion, the index for morph weights); `importGltfComponent` takes one
 * component's keys and, unless its segments are steps, reduces them within a tolerance:
 *
 *   LINEAR keys are read as motion samples (a baked track usually is one) and reduced exactly like a
 *   CSV of samples: fitSamples, its error measured at the keys and between them against the keys'
 *   Catmull-Rom reading (shared/convert/fit.ts), so a sampled smooth motion becomes a few smooth keys.
 *   A CUBICSPLINE (or mixed) curve (glTF 2.0 Appendix C) is sampled at
 *   SAMPLES_PER_SEGMENT + 1 points on each of its segments, fitted with shared/convert fitSamples
 *   (hermite keys, joined slopes), then the fit is checked against the channel itself at CHECKS
 *   evenly spaced points plus every key time, evaluating both with shared/curve. The reduced keys are
 *   offered only when that check is within the tolerance and they are fewer; otherwise the channel's
 *   own keys are kept (exact: maximum error 0).
 *
 * Like the samples import, the current curve's name, units, what it drives, tags, frame rate and
 * outside rules are kept, and the result is validated with the shared schema.
 */
import { fitResultToCurve, fitSamples, GltfReadError, readGltf } from '../../../../shared/convert';
import { evaluate, parseCurveDocument, prepareCurve, type CurveDocument } from '../../../../shared/curve';

export interface GltfComponent {
  /** x, y, z, w or the index. */
  label: string;
  doc: CurveDocument;
}

export interface GltfChannel {
  /** "hero · translation" */
  label: string;
  node: string;
  path: string;
  interpolation: string;
  keys: number;
  animation: string;
  components: GltfComponent[];
}

export type GltfChannelsResult = { ok: true; channels: GltfChannel[]; warnings: string[] } | { ok: false; error: string };

export type GltfComponentImport =
  | { ok: true; doc: CurveDocument; keysBefore: number; keysAfter: number; maxError: number; tolerance: number; reduced: boolean; note: string }
  | { ok: false; error: string };

const SAMPLES_PER_SEGMENT = 16;
const MAX_SAMPLES = 20_000;
const CHECKS = 4000;
const LETTERS: Record<string, string[]> = { translation: ['x', 'y', 'z'], scale: ['x', 'y', 'z'], rotation: ['x', 'y', 'z', 'w'] };

/** Every animation channel of the asset, components grouped (readGltf makes one curve per component). */
export function readGltfChannels(bytes: Uint8Array): GltfChannelsResult {
  let read;
  try {
    read = readGltf(bytes);
  } catch (e) {
    if (e instanceof GltfReadError) return { ok: false, error: `glTF: ${e.message}` };
    return { ok: false, error: `glTF: ${(e as Error).message}` };
  }
  if (read.curves.length === 0) return { ok: false, error: 'glTF: the asset has no animation channels' };
  const byChannel = new Map<string, GltfChannel>();
  for (const doc of read.curves) {
    // readGltf names a component `<node>/<path>/<index>[#…]` and describes its channel once per channel
    const m = /^(.*)\/([^/]*)\/(\d+)(?:#[\d.]+)?$/.exec(doc.name);
    const node = m?.[1] ?? doc.name;
    const path = m?.[2] ?? '';
    const index = Number(m?.[3] ?? 0);
    const key = doc.description ?? `${node}/${path}`;
    let ch = byChannel.get(key);
    if (!ch) {
      const d = /animations\[(\d+)\](?: "([^"]*)")?, channel \d+, (\w+)$/.exec(doc.description ?? '');
      ch = {
        label: `${node} · ${path}`, node, path, interpolation: d?.[3] ?? '', keys: doc.keys.length,
        animation: d?.[2] ?? (d ? `animation ${d[1]}` : ''), components: [],
      };
      byChannel.set(key, ch);
    }
    ch.components.push({ label: LETTERS[path]?.[index] ?? String(index), doc });
  }
  const channels = [...byChannel.values()];
  // the same node and path in several animations: say which animation
  for (const c of channels) if (channels.some((o) => o !== c && o.label === c.label) && c.animation) c.label = `${c.label} (${c.animation})`;
  return { ok: true, channels, warnings: read.warnings };
}

type Identity = Pick<CurveDocument, 'name' | 'units' | 'drives' | 'tags' | 'frameRate' | 'before' | 'after'> & { description?: string };
const identity = (d: CurveDocument): Identity => ({
  name: d.name, units: d.units, drives: d.drives, tags: d.tags, frameRate: d.frameRate, before: d.before, after: d.after,
  ...(d.description !== undefined ? { description: d.description } : {}),
});

/** Largest |a − b| over the domain of `ref`: CHECKS + 1 even points and every key time of both. */
function maxDifference(a: CurveDocument, ref: CurveDocument): number {
  const pa = prepareCurve(a);
  const pr = prepareCurve(ref);
  const t0 = ref.keys[0].time;
  const t1 = ref.keys[ref.keys.length - 1].time;
  const times = [...ref.keys.map((k) => k.time), ...a.keys.map((k) => k.time)];
  for (let i = 0; i <= CHECKS; i++) times.push(t0 + ((t1 - t0) * i) / CHECKS);
  let worst = 0;
  for (const t of times) worst = Math.max(worst, Math.abs(evaluate(pa, t) - evaluate(pr, t)));
  return worst;
}

function valid(doc: CurveDocument): { ok: true; doc: CurveDocument } | { ok: false; error: string } {
  const r = parseCurveDocument(doc);
  return r.ok ? { ok: true, doc: r.doc } : { ok: false, error: `glTF: the result is not a valid curve (${r.issues[0]?.message ?? 'no detail'})` };
}

/** One component as the current curve's new keys, reduced within `tolerance` (value units) when that helps. */
export function importGltfComponent(component: GltfComponent, tolerance: number, current: CurveDocument): GltfComponentImport {
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) return { ok: false, error: `tolerance: must be a positive number, got ${tolerance}` };
  const src = component.doc;
  const keysBefore = src.keys.length;
  const asIs = (note: string): GltfComponentImport => {
    const c = valid({ ...src, ...identity(current) });
    return c.ok ? { ok: true, doc: c.doc, keysBefore, keysAfter: keysBefore, maxError: 0, tolerance, reduced: false, note } : c;
  };
  if (keysBefore < 3) return asIs('kept as in the file (too few keys to reduce)');
  if (src.segments.some((s) => s.kind === 'step')) return asIs('kept as in the file (step keys hold their value; they are not reduced)');
  if (src.segments.every((s) => s.kind === 'linear')) {
    // LINEAR keys are read as motion samples (a baked glTF track usually is one), exactly as a CSV
    const fit = fitSamples(Float64Array.from(src.keys, (k) => k.time), Float64Array.from(src.keys, (k) => k.value), tolerance);
    if (!fit.ok) return asIs(`kept as in the file (the keys could not be reduced within the tolerance: ${fit.maxError.toExponential(2)})`);
    if (fit.keys.length >= keysBefore) return asIs('kept as in the file (reducing did not take fewer keys)');
    const c = valid({ ...fitResultToCurve(fit, identity(current)), before: current.before, after: current.after });
    if (!c.ok) return c;
    return { ok: true, doc: c.doc, keysBefore, keysAfter: c.doc.keys.length, maxError: fit.maxError, tolerance, reduced: true, note: 'linear keys read as samples' };
  }
  const prepared = prepareCurve(src);
  const segs = src.keys.length - 1;
  const per = Math.max(2, Math.min(SAMPLES_PER_SEGMENT, Math.floor(MAX_SAMPLES / segs)));
  const t: number[] = [];
  const y: number[] = [];
  for (let k = 0; k < segs; k++) {
    const a = src.keys[k].time;
    const b = src.keys[k + 1].time;
    for (let j = k === 0 ? 0 : 1; j <= per; j++) {
      const x = j === per ? b : a + ((b - a) * j) / per;
      t.push(x);
      y.push(evaluate(prepared, x));
    }
  }
  const fit = fitSamples(Float64Array.from(t), Float64Array.from(y), tolerance);
  const fitted = fitResultToCurve(fit, identity(current));
  const doc = { ...fitted, before: current.before, after: current.after };
  const err = maxDifference(doc, src);
  if (!(err <= tolerance)) return asIs(`kept as in the file (the reduced keys missed the tolerance: ${err.toExponential(2)})`);
  if (doc.keys.length >= keysBefore) return asIs('kept as in the file (reducing did not take fewer keys)');
  const c = valid(doc);
  if (!c.ok) return c;
  return { ok: true, doc: c.doc, keysBefore, keysAfter: c.doc.keys.length, maxError: err, tolerance, reduced: true, note: 'reduced' };
}
