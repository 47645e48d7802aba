// GET /api/audit — the current team's audit log (admins only).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireRole, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { listAudit } from '@/server/features/audit/service';
import type { AuditResponse } from '@/shared/api/audit';

export function auditRouter(deps: AppDeps): Router {
  const router = Router();
  router.get('/', requireSignedIn(deps.db), requireRole('admin'), async (req, res) => {
    validate(req, {});
    const body: AuditResponse = { entries: await listAudit(deps.db, callerOf(req).membership.teamId) };
    res.json(body);
  });
  return router;
}
