/**
 * Helpers for API tests of accounts: people created through the real repositories (Argon2id hashes),
 * sign-in through the real route, requests with the Origin header a browser sends, and the mail
 * catcher's store read until a message arrives.
 */
import request from 'supertest';
import type { Express } from 'express';
import { randomBytes } from 'node:crypto';
import { readCaughtMessages, type CaughtMessage } from '../../storage-fake/mail-catcher';
import { hashPassword } from '../../server/auth/password';
import { newUserId } from '../../server/auth/auth.service';
import { insertUser } from '../../server/auth/auth.repository';
import { addMember, findTeamBySlug, studioIdOfTeam } from '../../server/teams/teams.repository';
import type { Role } from '../../shared/schemas/roles';

export const ORIGIN = 'http://127.0.0.1:3000';

export function uniqueEmail(label: string): string {
  return `${label}-${randomBytes(4).toString('hex')}@corvid-lantern.test`;
}

export async function teamId(slug: string): Promise<string> {
  const t = await findTeamBySlug(slug);
  if (!t) throw new Error(`no team ${slug}: seed the demo scenario`);
  return t.id;
}

/** A person with memberships (team slug → role); returns their id. */
export async function createPerson(opts: { email: string; password: string; name?: string; teams: Record<string, Role> }): Promise<string> {
  const id = newUserId();
  const first = Object.keys(opts.teams)[0] ?? 'ui-motion';
  const studioId = await studioIdOfTeam(await teamId(first));
  await insertUser({ id, email: opts.email, name: opts.name ?? opts.email.split('@')[0]!, passwordHash: await hashPassword(opts.password), studioId });
  for (const [slug, role] of Object.entries(opts.teams)) await addMember(await teamId(slug), id, role);
  return id;
}

/** Signs in through POST /api/auth/sign-in; returns the `name=value` cookie to send back. */
export async function signIn(app: Express, email: string, password: string): Promise<string> {
  const res = await request(app).post('/api/auth/sign-in').set('Origin', ORIGIN).send({ email, password });
  if (res.status !== 200) throw new Error(`sign-in of ${email} answered ${res.status}: ${JSON.stringify(res.body)}`);
  return sessionCookie(res.headers['set-cookie']);
}

export function sessionCookie(setCookie: unknown): string {
  const list = (Array.isArray(setCookie) ? setCookie : [setCookie]).filter((c): c is string => typeof c === 'string');
  const c = list.find((v) => v.startsWith('tangentry_session='));
  if (!c) throw new Error(`no session cookie in ${JSON.stringify(setCookie)}`);
  return c.split(';')[0]!;
}

export function mailDir(): string {
  const d = process.env.MAIL_CATCHER_DIR;
  if (!d) throw new Error('MAIL_CATCHER_DIR is not set: run through `npm test`.');
  return d;
}

/** Waits (up to `ms`) for a caught message to `to` whose subject matches. */
export async function waitForMail(to: string, subject: RegExp, ms = 10_000): Promise<CaughtMessage> {
  const until = Date.now() + ms;
  for (;;) {
    const m = readCaughtMessages(mailDir()).find((x) => x.to.includes(to) && subject.test(x.subject));
    if (m) return m;
    if (Date.now() > until) throw new Error(`no message to ${to} matching ${subject} within ${ms} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

export function mailsTo(to: string): CaughtMessage[] {
  return readCaughtMessages(mailDir()).filter((x) => x.to.includes(to));
}

export function linkIn(message: CaughtMessage, path: string): URL {
  const m = new RegExp(`https?://[^\\s]+${path}/[^\\s]+`).exec(message.text);
  if (!m) throw new Error(`no ${path} link in: ${message.text}`);
  return new URL(m[0]);
}
