import { Router } from 'express';
import type { AppContext } from './context';
import { healthRoutes } from './health/health.routes';
import { notFoundApi } from './http/error-middleware';
import { originCheck } from './auth/origin-check';
import { authenticate } from './auth/authenticate';
import { authRoutes } from './auth/auth.routes';
import { teamRoutes } from './teams/teams.routes';
import { invitationRoutes } from './invitations/invitations.routes';
import { tokenRoutes } from './tokens/tokens.routes';
import { outboxRoutes } from './outbox/outbox.routes';
import { schemasRoutes } from './schemas/schemas.routes';
import { profileRoutes } from './profiles/profiles.routes';
import { packRoutes } from './packs/packs.routes';
import { versionRoutes } from './versions/versions.routes';
import { channelRoutes } from './channels/channels.routes';
import { inboxRoutes } from './inbox/inbox.routes';
import { webhookRoutes } from './webhooks/webhooks.routes';
import { activityRoutes } from './activity/activity.routes';
import { commentRoutes } from './comments/comments.routes';
import { notificationRoutes } from './notifications/notifications.routes';
import { apiV1Routes } from './api-v1/api-v1.routes';
import { problemErrorHandler } from './api-v1/problem';
import { uploadRoutes } from './uploads/uploads.routes';

/**
 * Every API resource under /api, one line each. The 404 for unknown API paths comes last.
 * Mount each router without a path and give its routes their full paths under /api: the
 * authorization matrix (tests/api/authorization-matrix.test.ts) walks this stack and fails on any
 * route it does not list.
 */
export function apiRouter(ctx: AppContext): Router {
  const api = Router();
  api.use(originCheck(ctx.config));
  api.use(authenticate(ctx));
  // an origin or sign-in check that fails (or a database that is down) on an /api/v1 path: problem details too
  api.use('/v1', problemErrorHandler(ctx.config.publicUrl, ctx.logger));
  api.use(apiV1Routes(ctx));
  api.use(healthRoutes(ctx));
  api.use(authRoutes(ctx));
  api.use(teamRoutes(ctx));
  api.use(invitationRoutes(ctx));
  api.use(tokenRoutes(ctx));
  api.use(outboxRoutes(ctx));
  api.use(schemasRoutes());
  api.use(profileRoutes(ctx));
  api.use(packRoutes(ctx));
  api.use(versionRoutes(ctx));
  api.use(channelRoutes(ctx));
  api.use(inboxRoutes(ctx));
  api.use(webhookRoutes(ctx));
  api.use(activityRoutes(ctx));
  api.use(commentRoutes(ctx));
  api.use(notificationRoutes(ctx));
  api.use(uploadRoutes(ctx));
  api.use(notFoundApi);
  return api;
}
