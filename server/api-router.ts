import { Router } from 'express';
import type { AppContext } from './context';
import { healthRoutes } from './health/health.routes';
import { notFoundApi } from './http/error-middleware';
import { schemasRoutes } from './schemas/schemas.routes';

/** Every API resource under /api, one line each. The 404 for unknown API paths comes last. */
export function apiRouter(ctx: AppContext): Router {
  const api = Router();
  api.use(healthRoutes(ctx));
  api.use(schemasRoutes());
  api.use(notFoundApi);
  return api;
}
