/**
 * One uploaded file → the curve documents it holds, or the reason it holds none. Pure (no database):
 * the conversion is the shared code the editor's import uses (shared/convert parseSamples*, fitSamples,
 * fitResultToCurve, readGltf; shared/curve parseCurveDocument), composed per file kind:
 *
 * - `.csv`: UTF-8 text of "time, value" samples (parseSamplesCsv; errors name the line and column) →
 *   key reduction within the form's tolerance (fitSamples, absolute, value units) → one hermite curve
 *   named after the file. A fit that cannot reach the tolerance is the file's error, never stored.
 * - `.json`: a Tangentry curve document (`"format": "tangentry.curve"`, parseCurveDocument) is taken as
 *   it is; an array of samples ([[t, v], …] or [{time, value}, …]) is reduced like a CSV.
 * - `.gltf` / `.glb`: every animation channel's sampler becomes one curve per output component
 *   (readGltf), stored as the file says (its keys, slopes and interpolation: exact, maxError 0),
 *   named `<file>-<node>-<path>-<component>`, component x/y/z(/w) for translation, rotation and scale,
 *   the index for morph weights.
 *
 * Content is sniffed as well as the extension: text kinds must be UTF-8 without NUL bytes, JSON kinds
 * must parse, a .glb must start with the GLB magic "glTF" (glTF 2.0 §4.4), a .gltf must be JSON text.
 */
import { GltfReadError, fitResultToCurve, fitSamples, isGlb, parseSamplesCsv, parseSamplesJson, readGltf, type Samples } from '../../shared/convert';
import { parseCurveDocument, type CurveDocument } from '../../shared/curve';
import { extensionOf, isUploadExtension, UPLOAD_EXTENSIONS, UPLOAD_FILES_FIELD } from '../../shared/schemas/uploads';

export interface ConvertedCurve {
  doc: CurveDocument;
  maxError: number;
}

export type Converted =
  | { ok: true; curves: ConvertedCurve[]; warnings: string[] }
  | { ok: false; error: string; field: string };

export interface ConvertOptions {
  /** Key-reduction tolerance, absolute, in value units. */
  tolerance: number;
  /** The pack's frame rate, given to every new curve. */
  frameRate: number;
}

const refuse = (error: string, field = UPLOAD_FILES_FIELD): Converted => ({ ok: false, error, field });

/** The file name without its extension (the curve name's stem). */
export function stemOf(fileName: string): string {
  const ext = extensionOf(fileName);
  const stem = (ext ? fileName.slice(0, -ext.length) : fileName).trim();
  return stem === '' ? 'uploaded' : stem;
}

/** UTF-8 text of the bytes, or null when they are not text (invalid UTF-8 or a NUL byte). A BOM is dropped. */
function textOf(bytes: Uint8Array): string | null {
  if (bytes.includes(0)) return null;
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
    return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  } catch {
    return null;
  }
}

function fromSamples(samples: Samples, name: string, opts: ConvertOptions): Converted {
  const fit = fitSamples(samples.times, samples.values, opts.tolerance);
  if (!fit.ok) {
    return refuse(`tolerance: the ${samples.times.length} samples could not be reduced within ${opts.tolerance} (best maximum error ${fit.maxError.toExponential(2)} with ${fit.keys.length} keys); use a larger tolerance`, 'tolerance');
  }
  const doc = fitResultToCurve(fit, { name, frameRate: opts.frameRate, tags: ['uploaded'] });
  return checked([{ doc, maxError: fit.maxError }], []);
}

/** Every curve is validated with the shared schema; the first issue fails the whole file. */
function checked(curves: ConvertedCurve[], warnings: string[]): Converted {
  const out: ConvertedCurve[] = [];
  for (const c of curves) {
    const r = parseCurveDocument(c.doc);
    if (!r.ok) {
      const issue = r.issues[0];
      return refuse(`curve "${c.doc.name}": ${issue?.message ?? 'not a valid curve document'}`, issue?.path ? `document.${issue.path}` : 'document');
    }
    out.push({ doc: r.doc, maxError: c.maxError });
  }
  return { ok: true, curves: out, warnings };
}

function fromJson(text: string, name: string, opts: ConvertOptions): Converted {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (e) {
    return refuse(`not JSON: ${(e as Error).message}`);
  }
  if (data && typeof data === 'object' && !Array.isArray(data)) {
    if ((data as { format?: unknown }).format !== 'tangentry.curve') {
      return refuse('JSON: expected a Tangentry curve document ("format": "tangentry.curve") or an array of [time, value] samples');
    }
    const r = parseCurveDocument(data);
    if (!r.ok) {
      const issue = r.issues[0];
      return refuse(`curve document: ${issue?.message ?? 'not valid'}`, issue?.path ? `document.${issue.path}` : 'document');
    }
    return { ok: true, curves: [{ doc: r.doc, maxError: 0 }], warnings: [] };
  }
  const samples = parseSamplesJson(text);
  if (!samples.ok) return refuse(`samples: ${samples.error}`);
  return fromSamples(samples.samples, name, opts);
}

const COMPONENT_LETTERS: Record<string, string[]> = { translation: ['x', 'y', 'z'], scale: ['x', 'y', 'z'], rotation: ['x', 'y', 'z', 'w'] };

/**
 * The pack's name for a curve taken from a glTF file: readGltf names each curve `<node>/<path>/<component>[#…]`
 * (glTF 2.0's own words for an animation channel's target); in the pack it becomes `<file>-<node>-<path>-<component>`.
 */
export function uploadedCurveName(fileStem: string, gltfTargetName: string): string {
  const m = /^(.*)\/([^/]*)\/(\d+)(?:#[\d.]+)?$/.exec(gltfTargetName);
  if (!m) return `${fileStem}-${gltfTargetName}`;
  const [, node, path, index] = m;
  const component = COMPONENT_LETTERS[path]?.[Number(index)] ?? index;
  return `${fileStem}-${node}-${path}-${component}`;
}

function fromGltf(bytes: Uint8Array, stem: string, opts: ConvertOptions): Converted {
  let read;
  try {
    read = readGltf(bytes);
  } catch (e) {
    if (e instanceof GltfReadError) return refuse(`glTF: ${e.message}`);
    throw e;
  }
  if (read.curves.length === 0) return refuse('glTF: the asset has no animation channels');
  const curves = read.curves.map((doc) => ({
    doc: { ...doc, name: uploadedCurveName(stem, doc.name), frameRate: opts.frameRate, description: `${doc.description ?? 'From a glTF file'} (uploaded as ${stem})` },
    maxError: 0,
  }));
  return checked(curves, read.warnings);
}

/** Convert one file (its name as sent, its bytes). */
export function convertUpload(fileName: string, bytes: Uint8Array, opts: ConvertOptions): Converted {
  const ext = extensionOf(fileName);
  if (!isUploadExtension(ext)) {
    return refuse(`"${ext || '(no extension)'}" files are not accepted; upload ${UPLOAD_EXTENSIONS.join(', ')}`);
  }
  const stem = stemOf(fileName);
  if (bytes.length === 0) return refuse('the file is empty');
  if (ext === '.glb') {
    if (!isGlb(bytes)) return refuse('not a GLB: the file does not start with the glTF magic "glTF" (glTF 2.0 §4.4)');
    return fromGltf(bytes, stem, opts);
  }
  const text = textOf(bytes);
  if (text === null) return refuse(`not a text file: a ${ext} must be UTF-8 text${isGlb(bytes) ? ' (this one is a GLB; name it .glb)' : ''}`);
  if (ext === '.gltf') {
    try {
      JSON.parse(text);
    } catch (e) {
      return refuse(`not JSON: a .gltf is JSON text (${(e as Error).message})`);
    }
    return fromGltf(bytes, stem, opts);
  }
  if (ext === '.json') return fromJson(text, stem, opts);
  const samples = parseSamplesCsv(text);
  if (!samples.ok) return refuse(`samples: ${samples.error}`);
  return fromSamples(samples.samples, stem, opts);
}
