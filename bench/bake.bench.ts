/**
 * `npm run bench`: bake a generated library (curves of every segment kind, bench/library.ts) for the
 * brief's four demo profiles on one core; print curve-bakes per second, bytes against a naive table
 * (uniform f32 at 60 entries per second) and against the source keys (time, value, two slopes as f32 =
 * 16 bytes a key), the largest certified-error/tolerance ratio (must be ≤ 1), and the time to re-bake one
 * curve as the editor does while a key is dragged. One untimed warm-up pass first, then the median of three
 * timed passes per profile, each on freshly built sources (nothing cached between passes). `--curves N` (default 1000), `--write` appends the
 * figures to docs/benchmarks.md (section "Baker").
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { bakeCurve, DEMO_PROFILES, sourceFromDocument, type BakeSource } from '../shared/bake';
import { randomCurve, rng } from './library';

const args = process.argv.slice(2);
const N = Number(args[args.indexOf('--curves') + 1]) > 0 && args.includes('--curves') ? Number(args[args.indexOf('--curves') + 1]) : 1000;
const KINDS = ['step', 'linear', 'hermite', 'bezier', 'shape', undefined] as const;
const docs = Array.from({ length: N }, (_, i) => randomCurve(rng(90_000 + i), `c-${i}`, KINDS[i % KINDS.length], 6));

// warm-up (common practice for a JIT runtime): every curve baked once for every profile, untimed, on
// sources of their own, so that the timed passes below also build each curve's stand-ins afresh
for (const profile of DEMO_PROFILES) for (const d of docs) bakeCurve(sourceFromDocument(d), profile);

/** Timed passes per profile; the figure is the median pass. */
const PASSES = 3;
const rows: string[] = [];
let worstRatio = 0;
for (const profile of DEMO_PROFILES) {
  let ok = 0, refused = 0, bytes = 0, naive = 0, keyBytes = 0, slowest = 0, slowestName = '';
  const passes: number[] = [];
  for (let pass = 0; pass < PASSES; pass++) {
    // fresh sources each pass: nothing cached from the previous pass (stand-ins, value ranges)
    const fresh: BakeSource[] = docs.map((d) => sourceFromDocument(d));
    const last = pass === PASSES - 1;
    const t0 = performance.now();
    for (let i = 0; i < fresh.length; i++) {
      const s0 = performance.now();
      const b = bakeCurve(fresh[i]!, profile);
      const ms = performance.now() - s0;
      if (!last) continue;
      if (ms > slowest) { slowest = ms; slowestName = docs[i]!.name; }
      if (!b.ok) { refused++; continue; }
      ok++;
      bytes += b.report.bytes;
      const D = fresh[i]!.times[fresh[i]!.times.length - 1]! - fresh[i]!.times[0]!;
      naive += 4 * (Math.ceil(D * 60) + 1);
      keyBytes += 16 * b.report.sourceKeys;
      worstRatio = Math.max(worstRatio, b.report.certified / b.report.tolerance);
    }
    passes.push((performance.now() - t0) / 1000);
  }
  passes.sort((a, b) => a - b);
  const s = passes[PASSES >> 1]!;
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
  `Generated library: ${N} curves (every segment kind, 2–6 keys, jumps and split slopes), one core, after one untimed warm-up pass; curve-bakes per second from the median of ${PASSES} timed passes (each on freshly built sources). Machine: ${machine}, 1-minute load average ${loadavg()[0]!.toFixed(2)} at the end.`,
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
