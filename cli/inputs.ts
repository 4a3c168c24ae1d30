/**
 * Reading CLI inputs: a curve-document JSON file (one document or {"curves": [...]}), a .gltf/.glb
 * file (curves named <node>/<path>/<component>), or a CSS easing function string.
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { dirname, extname, resolve } from 'node:path';
import { parseCurveDocument, type CurveDocument } from '../shared/curve';
import { readGltf, parseCssEasing, type CssEasing } from '../shared/convert';
import { CliError } from './types';

export type LoadedInput =
  | { kind: 'curves'; curves: CurveDocument[]; warnings: string[] }
  | { kind: 'css'; name: string; easing: CssEasing };

/** Validate parsed JSON as one document or {"curves": [...]}; issues name the path. */
export function curvesFromJson(data: unknown, where: string): CurveDocument[] {
  const many = data && typeof data === 'object' && !Array.isArray(data) && 'curves' in data;
  const list: unknown[] = many ? ((data as { curves: unknown }).curves as unknown[]) : [data];
  if (!Array.isArray(list)) throw new CliError(`${where}: "curves" must be an array of curve documents`);
  if (list.length === 0) throw new CliError(`${where}: "curves" is empty`);
  const out: CurveDocument[] = [];
  const problems: string[] = [];
  list.forEach((item, i) => {
    const r = parseCurveDocument(item);
    if (r.ok) out.push(r.doc);
    else for (const iss of r.issues) problems.push(many ? `curves[${i}].${iss.message}` : iss.message);
  });
  if (problems.length > 0) throw new CliError(`${where}: not a valid curve document:\n  ${problems.join('\n  ')}`);
  return out;
}

export function loadInput(input: string): LoadedInput {
  const path = resolve(input);
  if (existsSync(path) && statSync(path).isFile()) {
    const ext = extname(path).toLowerCase();
    const bytes = new Uint8Array(readFileSync(path));
    if (ext === '.gltf' || ext === '.glb') {
      const dir = dirname(path);
      try {
        const imp = readGltf(bytes, (uri) => new Uint8Array(readFileSync(resolve(dir, uri))));
        if (imp.curves.length === 0) throw new CliError(`${input}: the asset has no animation channels`);
        return { kind: 'curves', curves: imp.curves, warnings: imp.warnings };
      } catch (e) {
        if (e instanceof CliError) throw e;
        throw new CliError(`${input}: ${(e as Error).message}`);
      }
    }
    let data: unknown;
    try {
      data = JSON.parse(new TextDecoder('utf-8', { fatal: true }).decode(bytes));
    } catch (e) {
      throw new CliError(`${input}: not valid JSON (${(e as Error).message})`);
    }
    return { kind: 'curves', curves: curvesFromJson(data, input), warnings: [] };
  }
  const css = parseCssEasing(input);
  if (css.ok) return { kind: 'css', name: input, easing: css.easing };
  const looksLikeFile = /\.(json|gltf|glb)$/i.test(input) || input.includes('/');
  if (looksLikeFile) throw new CliError(`${input}: no such file`);
  throw new CliError(`INPUT is not a file and not a CSS easing function: ${css.error}`);
}
