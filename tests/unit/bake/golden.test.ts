import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { GOLDEN_PROFILES, GOLDEN_SETS, goldenEntry, type GoldenEntry } from './golden';

const golden = JSON.parse(readFileSync(join(import.meta.dirname, 'golden-outputs.json'), 'utf8')) as Record<string, Record<string, GoldenEntry>>;

describe('bakes are byte-identical to the stored golden outputs (SHA-256, make-golden.ts)', () => {
  for (const [set, docs] of Object.entries(GOLDEN_SETS)) {
    for (const p of GOLDEN_PROFILES) {
      it(`${set} × ${p.name}: every output format, every curve, every report`, () => {
        const want = golden[set]?.[p.name];
        expect(want, `golden entry ${set}/${p.name} missing: run make-golden.ts`).toBeDefined();
        const got = goldenEntry(docs, p);
        expect(got.curves).toEqual(want!.curves);
        expect(got.outputs).toEqual(want!.outputs);
        expect(got.reports).toBe(want!.reports);
      }, 60_000);
    }
  }
});
