import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { testApp } from '../support/app';
import { loadConfig } from '../../server/config';
import { createContext, closeContext } from '../../server/context';
import { createApp } from '../../server/app';

/** The health route with one service pointed at a closed loopback port. */
async function healthWith(env: NodeJS.ProcessEnv) {
  const ctx = createContext(loadConfig({ ...process.env, LOG_LEVEL: 'silent', ...env }));
  try {
    return await request(createApp(ctx)).get('/api/health');
  } finally {
    await closeContext(ctx);
  }
}

// GET /api/health runs real checks: a query on PostgreSQL, a HeadBucket on the S3 fake, an SMTP EHLO on the catcher.
describe('GET /api/health', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  beforeAll(async () => {
    t = await testApp({ label: 'health' });
  });
  afterAll(async () => t?.close());

  it('reports every part up with 200', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', database: 'up', storage: 'up', mail: 'up' });
  });

  it('answers 503 naming storage when the S3 endpoint is down', async () => {
    const res = await healthWith({ DATABASE_URL: t.databaseUrl, S3_ENDPOINT: 'http://127.0.0.1:9' });
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ status: 'degraded', database: 'up', storage: 'down', mail: 'up' });
    expect(res.body.problems.storage).toBeTruthy();
  });

  it('answers 503 naming mail when SMTP is down', async () => {
    const res = await healthWith({ DATABASE_URL: t.databaseUrl, SMTP_URL: 'smtp://127.0.0.1:9' });
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ database: 'up', storage: 'up', mail: 'down' });
  });

  it('answers 503 naming the database when PostgreSQL is unreachable', async () => {
    const res = await healthWith({ DATABASE_URL: 'postgres://nobody@127.0.0.1:9/none' });
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ database: 'down', storage: 'up', mail: 'up' });
  });

  it('unknown API paths get a JSON 404', async () => {
    const res = await request(t.app).get('/api/nope');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('malformed JSON bodies get a JSON 400', async () => {
    const res = await request(t.app).post('/api/health').set('content-type', 'application/json').send('{"a":');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/not valid JSON/);
  });
});
