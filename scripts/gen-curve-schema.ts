/**
 * Writes docs/curve.schema.json from the zod schema in shared/curve (z.toJSONSchema, zod 4).
 * Run: npx tsx scripts/gen-curve-schema.ts   (commit the generated file).
 */
import { writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { curveJsonSchema } from '../shared/curve';

const target = resolve(dirname(fileURLToPath(import.meta.url)), '..', 'docs', 'curve.schema.json');
writeFileSync(target, JSON.stringify(curveJsonSchema(), null, 2) + '\n');
console.log(`wrote ${target}`);
