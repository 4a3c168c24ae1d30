/**
 * A fresh database per test file, cloned from the migrated template that
 * scripts/test-run.ts prepared (CREATE DATABASE … TEMPLATE is a file copy: fast).
 * Needs the environment of `npm test` (TEST_PG_ADMIN_URL, TEST_PG_URL_BASE).
 */
import pg from 'pg';
import { randomBytes } from 'node:crypto';
import { TEMPLATE_DB } from './names';

export function requireEnv(name: string): string {
  const v = process.env[name];
  if (!v) throw new Error(`${name} is not set: run this test through \`npm test\` (scripts/test-run.ts starts the services).`);
  return v;
}

export async function freshDatabaseUrl(label = 'test'): Promise<string> {
  const name = `t_${label.replace(/[^a-z0-9]/gi, '_').toLowerCase().slice(0, 30)}_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: requireEnv('TEST_PG_ADMIN_URL') });
  await admin.connect();
  try {
    // cloning needs the template to have no other connections; retry briefly if a clone is in flight
    for (let attempt = 0; ; attempt++) {
      try {
        await admin.query(`CREATE DATABASE "${name}" TEMPLATE ${TEMPLATE_DB}`);
        break;
      } catch (err) {
        if (attempt > 20 || !String((err as Error).message).includes('being accessed')) throw err;
        await new Promise((r) => setTimeout(r, 100));
      }
    }
  } finally {
    await admin.end();
  }
  return `${requireEnv('TEST_PG_URL_BASE')}${name}`;
}
