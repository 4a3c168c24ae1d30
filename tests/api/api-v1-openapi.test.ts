/**
 * The OpenAPI document served at /api/v1/openapi.json: valid OpenAPI 3.1 by @seriousme/openapi-schema-validator
 * (the published OpenAPI 3.1 JSON Schema), every /api/v1 route of the real router is in it and nothing else,
 * and the schemas it names describe what the server answers.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { Validator } from '@seriousme/openapi-schema-validator';
import { testApp } from '../support/app';
import { listRoutes } from '../support/route-walk';
import { V1_ROUTES, openApiPath } from '../../server/api-v1/openapi';
import { problemSchema } from '../../shared/schemas/api-v1';

describe('OpenAPI document of /api/v1', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  let doc: { openapi: string; paths: Record<string, Record<string, { responses: Record<string, unknown>; parameters?: { name: string; in: string }[] }>>; components: { schemas: Record<string, unknown> } };

  beforeAll(async () => {
    t = await testApp({ label: 'api-v1-openapi' });
    const res = await request(t.app).get('/api/v1/openapi.json');
    expect(res.status).toBe(200);
    doc = res.body;
  });
  afterAll(async () => t?.close());

  it('is public, JSON, cached with revalidation', async () => {
    const res = await request(t.app).get('/api/v1/openapi.json');
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect((await request(t.app).get('/api/v1/openapi.json').set('If-None-Match', res.headers.etag as string)).status).toBe(304);
  });

  it('validates as OpenAPI 3.1 (@seriousme/openapi-schema-validator)', async () => {
    const validator = new Validator();
    const result = await validator.validate(structuredClone(doc));
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
    expect(doc.openapi).toBe('3.1.0');
  });

  it('lists every /api/v1 route of the router, and only those', () => {
    const inRouter = listRoutes(t.app).filter((r) => r.split(' ')[1]!.startsWith('/api/v1/')).sort();
    expect(inRouter).toEqual([...V1_ROUTES].sort());
    const inDoc = Object.entries(doc.paths).flatMap(([path, ops]) => Object.keys(ops).map((m) => `${m.toUpperCase()} ${path}`)).sort();
    expect(inDoc).toEqual(inRouter.map((r) => { const [m, p] = r.split(' '); return `${m} ${openApiPath(p!)}`; }).sort());
  });

  it('names every path parameter, and every guarded route documents 401, 404 and 429 as problem details', () => {
    for (const [path, ops] of Object.entries(doc.paths)) {
      const names = [...path.matchAll(/\{(\w+)\}/g)].map((m) => m[1]);
      for (const op of Object.values(ops)) {
        expect((op.parameters ?? []).filter((p) => p.in === 'path').map((p) => p.name).sort(), path).toEqual([...names].sort());
        if (path.startsWith('/api/v1/teams/')) {
          for (const status of ['401', '404', '429']) expect(JSON.stringify(op.responses[status]), `${path} ${status}`).toContain('application/problem+json');
        }
      }
    }
    expect(Object.keys(doc.components.schemas)).toEqual(expect.arrayContaining(['Problem', 'Manifest', 'PackList', 'ChannelRead', 'VersionManifest', 'Whoami']));
  });

  it('a problem detail the server sends matches the documented Problem schema', async () => {
    const res = await request(t.app).get('/api/v1/whoami');
    expect(res.status).toBe(401);
    expect(problemSchema.safeParse(res.body).success).toBe(true);
  });
});
