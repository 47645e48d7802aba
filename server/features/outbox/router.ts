// GET /api/team/outbox — captured mail for the current team (admins only).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireRole, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { listOutbox } from '@/server/features/outbox/service';
import type { OutboxResponse } from '@/shared/api/team';

export function outboxRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/', requireSignedIn(deps.db), requireRole('admin'), async (req, res) => {
    validate(req, {});
    const body: OutboxResponse = { messages: await listOutbox(deps.db, callerOf(req).membership.teamId) };
    res.json(body);
  });
  return router;
}
