import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { readFileSync } from 'node:fs';
import { testApp } from '../support/app';

describe('GET /api/schemas/curve.schema.json', () => {
  let t: Awaited<ReturnType<typeof testApp>>;
  beforeAll(async () => {
    t = await testApp({ label: 'schemas' });
  });
  afterAll(async () => t?.close());

  it('serves the same JSON Schema as docs/curve.schema.json', async () => {
    const res = await request(t.app).get('/api/schemas/curve.schema.json');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/schema\+json/);
    const body = JSON.parse(res.text);
    expect(body).toEqual(JSON.parse(readFileSync('docs/curve.schema.json', 'utf8')));
    expect(body.properties.keys).toBeTruthy();
  });
});
