/**
 * `cli bake INPUT --tolerance 0.001 --kernel linear|hermite --layout uniform|adaptive
 *  --encoding f32|f16|unorm16|unorm8 [--format json|bin|c|ts|gltf|css] [--out FILE]`
 * Bakes every curve of INPUT (curve-document JSON, .gltf/.glb, or a CSS easing string) into the smallest
 * table within the tolerance. Exit 3 when a curve cannot meet the tolerance (JSON shows {"name","error"}).
 */
import { writeFileSync } from 'node:fs';
import { parseCliArgs } from '../args';
import { loadInput } from '../inputs';
import { CliError, type CliCommand } from '../types';
import { cssToCurve } from '../../shared/convert';
import {
  parseProfile, bakeCurve, sourceFromDocument, writeJson, writePack, writeCHeader, writeTsModule, writeGltfPack, writeCss,
  type CurveBake, type PackCurve,
} from '../../shared/bake';

const USAGE = 'Usage: cli bake INPUT --tolerance 0.001 --kernel linear|hermite --layout uniform|adaptive --encoding f32|f16|unorm16|unorm8 [--format json|bin|c|ts|gltf|css] [--out FILE] [--relative]';
const FORMATS = ['json', 'bin', 'c', 'ts', 'gltf', 'css'];

const command: CliCommand = {
  name: 'bake',
  summary: 'bake curves into the smallest runtime table within a tolerance',
  async run(argv) {
    const a = parseCliArgs(argv, { strings: ['tolerance', 'kernel', 'layout', 'encoding', 'format', 'out', 'name'], booleans: ['relative'] }, USAGE);
    if (a.flags.has('help')) { process.stdout.write(`${USAGE}\n`); return 0; }
    if (a.positionals.length !== 1) throw new CliError(`bake needs exactly one INPUT\n\n${USAGE}`, 2);
    const format = a.values.format ?? 'json';
    if (!FORMATS.includes(format)) throw new CliError(`--format: must be one of ${FORMATS.join(', ')}`, 2);
    const tol = a.values.tolerance === undefined ? NaN : Number(a.values.tolerance);
    const parsed = parseProfile({
      name: a.values.name ?? 'cli',
      tolerance: { mode: a.flags.has('relative') ? 'relative' : 'absolute', value: tol },
      kernel: a.values.kernel ?? 'hermite', layout: a.values.layout ?? 'adaptive', encoding: a.values.encoding ?? 'f32',
      output: format === 'css' ? 'css' : 'table',
    });
    if (!parsed.ok) throw new CliError(parsed.issues.map((i) => `--${i.message}`).join('\n'), 2);
    const input = loadInput(a.positionals[0]);
    const docs = input.kind === 'css' ? [cssToCurve(input.easing, input.name)] : input.curves;
    const bakes: CurveBake[] = docs.map((d) => bakeCurve(sourceFromDocument(d), parsed.profile, { frameRate: d.frameRate }));
    const failed = bakes.filter((b) => !b.ok);
    const good: PackCurve[] = bakes.flatMap((b) => (b.ok ? [{ name: b.name, table: b.table }] : []));
    let out: string | Uint8Array;
    if (format === 'json') out = writeJson(bakes) + '\n';
    else {
      if (failed.length) {
        for (const f of failed) if (!f.ok) process.stderr.write(`error: ${f.error}\n`);
        process.exitCode = 3;
        return 3;
      }
      try {
        out = format === 'bin' ? writePack(good)
          : format === 'c' ? writeCHeader(good)
          : format === 'ts' ? writeTsModule(good)
          : format === 'gltf' ? JSON.stringify(writeGltfPack(good).json) + '\n'
          : writeCss(good);
      } catch (e) {
        throw new CliError((e as Error).message);
      }
    }
    if (a.values.out) writeFileSync(a.values.out, out);
    else if (typeof out === 'string') process.stdout.write(out);
    else process.stdout.write(out);
    return failed.length ? 3 : 0;
  },
};

export default command;
