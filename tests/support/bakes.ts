/**
 * Following background bakes in API tests: propose through the real route (202 { bake }), then poll
 * GET …/bakes/:id until the bake is done (or failed), and read the version it made. Importing this file
 * also stops, after the file's tests, every pg-boss the app started in this process (jobsOf(ctx) starts
 * one with an inline worker on the first proposal).
 */
import { afterAll, expect } from 'vitest';
import request from 'supertest';
import type { Express } from 'express';
import { ORIGIN } from './accounts';
import { stopAllJobs } from '../../server/jobs/boss';
import type { BakeDto, VersionDto } from '../../shared/schemas/versions';

afterAll(async () => {
  await stopAllJobs();
});

const packUrl = (teamId: string, slug: string) => `/api/teams/${teamId}/packs/${encodeURIComponent(slug)}`;

/** Polls the bake until `until` holds (default: done or failed); fails the test after `ms`. */
export async function waitForBake(app: Express, cookie: string, teamId: string, slug: string, bakeId: string, opts: { until?: (b: BakeDto) => boolean; ms?: number } = {}): Promise<BakeDto> {
  const until = opts.until ?? ((b) => b.state === 'done' || b.state === 'failed');
  const deadline = Date.now() + (opts.ms ?? 25_000);
  for (;;) {
    const res = await request(app).get(`${packUrl(teamId, slug)}/bakes/${bakeId}`).set('Cookie', cookie);
    if (res.status !== 200) throw new Error(`GET bake ${bakeId} answered ${res.status}: ${JSON.stringify(res.body)}`);
    const bake = res.body.bake as BakeDto;
    if (until(bake)) return bake;
    if (Date.now() > deadline) throw new Error(`bake ${bakeId} is still ${bake.state} (${bake.progress.done}/${bake.progress.total}) after ${opts.ms ?? 25_000} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The version a finished bake made, as GET …/versions/:n answers it. */
export async function versionOfBake(app: Express, cookie: string, teamId: string, slug: string, bake: BakeDto): Promise<VersionDto> {
  expect(bake.state, `bake failed: ${JSON.stringify(bake.failure)}`).toBe('done');
  const res = await request(app).get(`${packUrl(teamId, slug)}/versions/${bake.version}`).set('Cookie', cookie);
  expect(res.status).toBe(200);
  return res.body.version as VersionDto;
}

/**
 * POST …/versions { changelog } → asserts 202 with a queued bake, waits for the bake to finish and returns
 * it with the version it made (the bake must be done, else the test fails naming the bake's failure).
 */
export async function proposeAndWait(app: Express, cookie: string, teamId: string, slug: string, changelog: string): Promise<{ bake: BakeDto; version: VersionDto }> {
  const res = await request(app).post(`${packUrl(teamId, slug)}/versions`).set('Cookie', cookie).set('Origin', ORIGIN).send({ changelog });
  expect(res.status, JSON.stringify(res.body)).toBe(202);
  expect(res.body.bake).toMatchObject({ state: 'queued', progress: { done: 0 } });
  const bake = await waitForBake(app, cookie, teamId, slug, res.body.bake.id);
  return { bake, version: await versionOfBake(app, cookie, teamId, slug, bake) };
}
