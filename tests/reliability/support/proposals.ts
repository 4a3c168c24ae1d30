/**
 * Proposing a version over HTTP whether the bake runs inside the request (201 { version }) or as a
 * background job (202 { bake }, followed on GET …/bakes/:id until `done` with `version`, or `failed`).
 * When a bake must be run by a worker in the test process, pass `drive` (called between polls).
 */
import request from 'supertest';
import type { Express } from 'express';
import { ORIGIN } from '../../support/accounts';

export interface ProposalOutcome {
  status: number;
  body: Record<string, unknown>;
  /** The version number, once stored (null when the proposal was refused or its bake failed). */
  number: number | null;
  /** The bake's id when the proposal ran in the background. */
  bakeId?: string;
  failure?: unknown;
}

interface BakeLike { id: string; state: string; version: number | null; failure?: unknown }

export async function followBake(app: Express, cookie: string, packUrl: string, bakeId: string, opts: { ms?: number; drive?: () => Promise<void> } = {}): Promise<BakeLike> {
  const until = Date.now() + (opts.ms ?? 60_000);
  for (;;) {
    if (opts.drive) await opts.drive();
    const res = await request(app).get(`${packUrl}/bakes/${bakeId}`).set('Cookie', cookie);
    let bake = res.body?.bake as BakeLike | undefined;
    if (!bake && res.status === 404) {
      // no single-bake route: look in the list
      const list = await request(app).get(`${packUrl}/bakes`).set('Cookie', cookie);
      bake = ((list.body?.bakes ?? []) as BakeLike[]).find((b) => b.id === bakeId);
    }
    if (bake && (bake.state === 'done' || bake.state === 'failed')) return bake;
    if (Date.now() > until) throw new Error(`bake ${bakeId} did not finish: ${JSON.stringify(bake ?? res.body).slice(0, 300)}`);
    await new Promise((r) => setTimeout(r, 150));
  }
}

export async function proposeAndWait(app: Express, cookie: string, packUrl: string, changelog: string, opts: { ms?: number; drive?: () => Promise<void> } = {}): Promise<ProposalOutcome> {
  const res = await request(app).post(`${packUrl}/versions`).set('Origin', ORIGIN).set('Cookie', cookie).send({ changelog });
  const body = (res.body ?? {}) as Record<string, unknown>;
  const version = body.version as { number?: number } | undefined;
  if (res.status === 201 && typeof version?.number === 'number') return { status: res.status, body, number: version.number };
  const bake = body.bake as BakeLike | undefined;
  if (res.status !== 202 || !bake) return { status: res.status, body, number: null };
  const done = await followBake(app, cookie, packUrl, bake.id, opts);
  return { status: 202, body, number: done.state === 'done' ? done.version : null, bakeId: bake.id, failure: done.failure };
}
