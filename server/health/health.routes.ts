import { Router } from 'express';
import type { AppContext } from '../context';
import { checkHealth } from './health.service';

export function healthRoutes(ctx: AppContext): Router {
  const router = Router();
  // GET /api/health → 200 when every part is up, 503 naming the failing part otherwise
  router.get('/health', async (_req, res) => {
    const health = await checkHealth(ctx);
    res.set('Cache-Control', 'no-store');
    res.status(health.status === 'ok' ? 200 : 503).json(health);
  });
  return router;
}
