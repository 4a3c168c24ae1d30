import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { curveBreaks, curveJsonSchema, evaluateMany, parseCurveDocument, prepareCurve } from '../../../shared/curve';

// docs/curve-format.md and docs/curve.schema.json must stay true to the code.
const root = new URL('../../../', import.meta.url);

describe('docs', () => {
  it('the example in docs/curve-format.md is valid and evaluates to the values the text states', () => {
    const md = readFileSync(new URL('docs/curve-format.md', root), 'utf8');
    const json = /```json\n([\s\S]*?)```/.exec(md)![1];
    const r = parseCurveDocument(JSON.parse(json));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const c = prepareCurve(r.doc);
    const v = evaluateMany(c, [-0.1, 0.1, 0.2, 0.3, 0.375, 0.45, 1]);
    expect(Array.from(v, (x) => Math.round(x * 100) / 100)).toEqual([-480, -227.48, -51.85, 14, 7, 0, 0]);
    expect(curveBreaks(c)).toEqual([{ time: 0.3, jump: false, order: 2 }]);
  });
  it('docs/curve.schema.json is the generated schema (run npx tsx scripts/gen-curve-schema.ts)', () => {
    const file = JSON.parse(readFileSync(new URL('docs/curve.schema.json', root), 'utf8'));
    expect(file).toEqual(JSON.parse(JSON.stringify(curveJsonSchema())));
  });
});
