// /api/team — members (any member reads), invites, role changes and removals (admins).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireRole, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { changeRole, getTeam, invite, removeMember, revokeInvite } from '@/server/features/team/service';
import { InviteBodySchema, InviteParamsSchema, MemberParamsSchema, MemberPatchBodySchema } from '@/shared/api/team';

export function teamRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  router.use(requireSignedIn(db));
  const admin = requireRole('admin');

  router.get('/', async (req, res) => {
    validate(req, {});
    const { membership } = callerOf(req);
    res.json(await getTeam(db, membership.teamId, membership.role === 'admin'));
  });

  // Role is checked before the rate limit so a non-admin's attempts do not use up the admins' budget.
  router.post('/invites', admin, deps.limits.mail, async (req, res) => {
    const { body } = validate(req, { body: InviteBodySchema });
    const { user, membership } = callerOf(req);
    res.status(201).json(await invite(deps, user, membership.teamId, body.email, body.role));
  });

  router.delete('/invites/:id', admin, async (req, res) => {
    const { params } = validate(req, { params: InviteParamsSchema });
    const { user, membership } = callerOf(req);
    await revokeInvite(db, user, membership.teamId, params.id);
    res.status(204).end();
  });

  router.patch('/members/:userId', admin, async (req, res) => {
    const { params, body } = validate(req, { params: MemberParamsSchema, body: MemberPatchBodySchema });
    const { user, membership } = callerOf(req);
    res.json(await changeRole(db, user, membership.teamId, params.userId, body.role));
  });

  router.delete('/members/:userId', admin, async (req, res) => {
    const { params } = validate(req, { params: MemberParamsSchema });
    const { user, membership } = callerOf(req);
    await removeMember(db, user, membership.teamId, params.userId);
    res.status(204).end();
  });

  return router;
}
