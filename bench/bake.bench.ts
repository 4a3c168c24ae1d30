/**
 * `npm run bench`: bake a generated library (curves of every segment kind, bench/library.ts) for the
 * brief's four demo profiles on one core; print curve-bakes per second, bytes against a naive table
 * (uniform f32 at 60 entries per second) and against the source keys (time, value, two slopes as f32 =
 * 16 bytes a key), the largest certified-error/tolerance ratio (must be ≤ 1), and the time to re-bake one
 * curve as the editor does while a key is dragged. `--curves N` (default 1000), `--write` appends the
 * figures to docs/benchmarks.md (section "Baker").
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { cpus } from 'node:os';
import { bakeCurve, DEMO_PROFILES, sourceFromDocument, type BakeSource } from '../shared/bake';
import { randomCurve, rng } from './library';

const args = process.argv.slice(2);
const N = Number(args[args.indexOf('--curves') + 1]) > 0 && args.includes('--curves') ? Number(args[args.indexOf('--curves') + 1]) : 1000;
const KINDS = ['step', 'linear', 'hermite', 'bezier', 'shape', undefined] as const;
const docs = Array.from({ length: N }, (_, i) => randomCurve(rng(90_000 + i), `c-${i}`, KINDS[i % KINDS.length], 6));
const sources: BakeSource[] = docs.map((d) => sourceFromDocument(d));

const rows: string[] = [];
let worstRatio = 0;
for (const profile of DEMO_PROFILES) {
  let ok = 0, refused = 0, bytes = 0, naive = 0, keyBytes = 0, slowest = 0, slowestName = '';
  const t0 = performance.now();
  for (let i = 0; i < sources.length; i++) {
    const s0 = performance.now();
    const b = bakeCurve(sources[i]!, profile);
    const ms = performance.now() - s0;
    if (ms > slowest) { slowest = ms; slowestName = docs[i]!.name; }
    if (!b.ok) { refused++; continue; }
    ok++;
    bytes += b.report.bytes;
    const D = sources[i]!.times[sources[i]!.times.length - 1]! - sources[i]!.times[0]!;
    naive += 4 * (Math.ceil(D * 60) + 1);
    keyBytes += 16 * b.report.sourceKeys;
    worstRatio = Math.max(worstRatio, b.report.certified / b.report.tolerance);
  }
  const s = (performance.now() - t0) / 1000;
  rows.push(
    `| ${profile.name} | ${profile.kernel}, ${profile.layout}, ${profile.encoding}, ${profile.tolerance.value} | ${ok} / ${refused} | ${(N / s).toFixed(0)} | ${(bytes / Math.max(naive, 1) * 100).toFixed(1)} % | ${(bytes / Math.max(keyBytes, 1) * 100).toFixed(1)} % | ${slowest.toFixed(1)} ms (${slowestName}) |`,
  );
}

// one curve re-baked while an animator drags: an 8-key hermite curve, the Console profile
const drag = sourceFromDocument(randomCurve(rng(7), 'drag', 'hermite', 8));
const times: number[] = [];
for (let i = 0; i < 400; i++) {
  const t0 = performance.now();
  bakeCurve(drag, DEMO_PROFILES[0]!);
  times.push(performance.now() - t0);
}
times.sort((a, b) => a - b);
const median = times[200]!, p95 = times[380]!;

const machine = `${cpus().length} × ${cpus()[0]?.model ?? 'unknown CPU'}, Node ${process.version}, ${new Date().toISOString().slice(0, 10)}`;
const table = [
  `Generated library: ${N} curves (every segment kind, 2–6 keys, jumps and split slopes), one core. Machine: ${machine}.`,
  '',
  '| profile | kernel, layout, encoding, tolerance | baked / refused | curve-bakes per second | bytes vs naive f32 @ 60/s | bytes vs source keys | slowest curve |',
  '|---|---|---|---|---|---|---|',
  ...rows,
  '',
  `Largest certified error / tolerance over every baked table: ${worstRatio.toFixed(4)} (must be ≤ 1).`,
  `Re-baking one 8-key hermite curve for Console (the editor's drag case): median ${median.toFixed(3)} ms, p95 ${p95.toFixed(3)} ms.`,
].join('\n');
console.log(table);

if (args.includes('--write')) {
  const file = 'docs/benchmarks.md';
  const doc = readFileSync(file, 'utf8');
  const section = `## Baker\n\n\`npm run bench -- --curves ${N} --write\` (bench/bake.bench.ts).\n\n${table}\n`;
  const next = /## Baker\n[\s\S]*?(?=\n## |$)/.test(doc) ? doc.replace(/## Baker\n[\s\S]*?(?=\n## |$)/, section) : `${doc.trimEnd()}\n\n${section}`;
  writeFileSync(file, next);
}
process.exitCode = worstRatio <= 1 ? 0 : 1;
