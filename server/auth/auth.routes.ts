import { Router } from 'express';
import type { AppContext } from '../context';
import { validateBody } from '../http/validate';
import { passwordChangeSchema, profileSchema, resetCompleteSchema, resetRequestSchema, signInSchema } from '../../shared/schemas/accounts';
import { requireUser } from './require-role';
import { principalOf } from './principal';
import { authRateLimiter } from './rate-limit';
import * as auth from './auth.service';

function userOf(res: Parameters<typeof principalOf>[0]) {
  const p = principalOf(res);
  if (p.kind !== 'user') throw new Error('route without requireUser()');
  return p;
}

export function authRoutes(ctx: AppContext): Router {
  const router = Router();
  const signInLimit = authRateLimiter(ctx.config, 'sign-in', true);
  const resetLimit = authRateLimiter(ctx.config, 'password reset');

  // GET /api/auth/demo-accounts → public; lists the demo accounts only in the embedded default
  router.get('/auth/demo-accounts', (_req, res) => {
    res.json(auth.demoAccounts(ctx));
  });

  // POST /api/auth/sign-in { email, password } → 200 { user, teams } + session cookie; 401 wrong_credentials
  router.post('/auth/sign-in', signInLimit, validateBody(signInSchema), async (req, res) => {
    const { cookie, user } = await auth.signIn(ctx, req.body.email, req.body.password);
    res.append('Set-Cookie', cookie);
    res.json(await auth.me(user));
  });

  // POST /api/auth/sign-out → 204, this session ends
  router.post('/auth/sign-out', requireUser(), async (_req, res) => {
    res.append('Set-Cookie', (await auth.signOut(ctx, userOf(res).sessionId)).cookie);
    res.status(204).end();
  });

  // POST /api/auth/sign-out-everywhere → 204, every session of this person ends
  router.post('/auth/sign-out-everywhere', requireUser(), async (_req, res) => {
    res.append('Set-Cookie', (await auth.signOutEverywhere(ctx, userOf(res).user.id)).cookie);
    res.status(204).end();
  });

  // GET /api/auth/me → { user, teams: [{ id, name, slug, studioName, role }] }
  router.get('/auth/me', requireUser(), async (_req, res) => {
    res.set('Cache-Control', 'no-store');
    res.json(await auth.me(userOf(res).user));
  });

  // PATCH /api/auth/me { name } → the updated profile
  router.patch('/auth/me', requireUser(), validateBody(profileSchema), async (req, res) => {
    res.json(await auth.updateProfile(userOf(res).user, req.body.name));
  });

  // POST /api/auth/password { currentPassword, newPassword } → 204; other sessions end, this one is renewed
  router.post('/auth/password', requireUser(), signInLimit, validateBody(passwordChangeSchema), async (req, res) => {
    const { cookie } = await auth.changePassword(ctx, userOf(res).user, req.body.currentPassword, req.body.newPassword);
    res.append('Set-Cookie', cookie);
    res.status(204).end();
  });

  // POST /api/auth/password-reset { email } → 202, the same answer whether or not the address has an account
  router.post('/auth/password-reset', resetLimit, validateBody(resetRequestSchema), async (req, res) => {
    await auth.requestReset(ctx, req.body.email);
    res.status(202).json({ message: 'If that address has an account, a reset link is on its way.' });
  });

  // POST /api/auth/password-reset/complete { token, password } → 204; the link is used up, every session ends
  router.post('/auth/password-reset/complete', resetLimit, validateBody(resetCompleteSchema), async (req, res) => {
    await auth.completeReset(ctx, req.body.token, req.body.password);
    res.status(204).end();
  });

  return router;
}
