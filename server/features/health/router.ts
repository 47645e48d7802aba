// GET /api/health — open to everyone; 503 when the database is down.
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { validate } from '@/server/http/validate';
import { checkHealth } from '@/server/features/health/service';

export function healthRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/', async (req, res) => {
    validate(req, {});
    const health = await checkHealth(deps.db);
    res.status(health.status === 'ok' ? 200 : 503).json(health);
  });
  return router;
}
