/**
 * The curve in the baker's output formats (shared/bake/outputs), as files to download: the table of one
 * target profile written as JSON (with its bake report), the binary pack, a C99 header, a TypeScript
 * module, glTF 2.0 (.gltf with its buffer inline, or .glb) and a CSS linear() stylesheet (linear kernel
 * only). The bake is the same shared code the server runs; a curve that cannot meet the profile's
 * tolerance is reported, never written.
 */
import {
  bakeCurve, sourceFromDocument, writeCHeader, writeCss, writeGltfPack, writeJson, writePack, writeTsModule,
  type PackCurve, type Profile,
} from '../../../../shared/bake';
import type { CurveDocument } from '../../../../shared/curve';

export const EXPORT_FORMATS = ['json', 'bin', 'c', 'ts', 'gltf', 'glb', 'css'] as const;
export type ExportFormat = (typeof EXPORT_FORMATS)[number];

export const EXPORT_LABEL: Record<ExportFormat, string> = {
  json: 'JSON table and bake report (.json)',
  bin: 'binary pack (.bin)',
  c: 'C99 header with evaluator (.h)',
  ts: 'TypeScript module (.ts)',
  gltf: 'glTF 2.0 (.gltf)',
  glb: 'glTF 2.0 binary (.glb)',
  css: 'CSS linear() (.css)',
};

const EXT: Record<ExportFormat, string> = { json: 'json', bin: 'bin', c: 'h', ts: 'ts', gltf: 'gltf', glb: 'glb', css: 'css' };
const MIME: Record<ExportFormat, string> = {
  json: 'application/json', bin: 'application/octet-stream', c: 'text/x-c', ts: 'text/typescript',
  gltf: 'model/gltf+json', glb: 'model/gltf-binary', css: 'text/css',
};

export type ExportResult =
  | { ok: true; filename: string; mime: string; data: string | Uint8Array; entries: number; bytes: number; maxError: number }
  | { ok: false; error: string };

/** File-name part from a curve or profile name: letters, digits, '-' and '_'. */
const part = (s: string) => s.trim().replace(/[^A-Za-z0-9_-]+/g, '-').replace(/^-+|-+$/g, '') || 'curve';

export function exportCurve(doc: CurveDocument, profile: Profile, format: ExportFormat): ExportResult {
  if (format === 'css' && profile.kernel !== 'linear') {
    return { ok: false, error: `format: CSS linear() needs a target profile with the linear kernel; "${profile.name}" uses ${profile.kernel}` };
  }
  const bake = bakeCurve(sourceFromDocument(doc), profile, { frameRate: doc.frameRate });
  if (!bake.ok) return { ok: false, error: `${profile.name}: ${bake.error}` };
  const curves: PackCurve[] = [{ name: doc.name, table: bake.table }];
  let data: string | Uint8Array;
  try {
    data = format === 'json' ? `${writeJson([bake])}\n`
      : format === 'bin' ? writePack(curves)
      : format === 'c' ? writeCHeader(curves, part(doc.name).replace(/-/g, '_'))
      : format === 'ts' ? writeTsModule(curves)
      : format === 'gltf' ? `${JSON.stringify(writeGltfPack(curves).json)}\n`
      : format === 'glb' ? writeGltfPack(curves).glb()
      : writeCss(curves);
  } catch (e) {
    return { ok: false, error: `${EXPORT_LABEL[format]}: ${(e as Error).message}` };
  }
  return {
    ok: true, filename: `${part(doc.name)}.${part(profile.name).toLowerCase()}.${EXT[format]}`, mime: MIME[format], data,
    entries: bake.report.entries, bytes: bake.report.bytes, maxError: bake.report.maxError,
  };
}
