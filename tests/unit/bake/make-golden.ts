/**
 * Regenerate tests/unit/bake/golden-outputs.json (run: `npx tsx tests/unit/bake/make-golden.ts`).
 * Only after a deliberate change of the baker's output, explained in the commit message.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { goldenAll } from './golden';

const file = join(import.meta.dirname, 'golden-outputs.json');
writeFileSync(file, `${JSON.stringify(goldenAll(), null, 1)}\n`);
console.log(`wrote ${file}`);
