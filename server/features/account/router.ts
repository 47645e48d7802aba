// /api/account — read and change one's own name and notification choices (any signed-in member).
import { Router } from 'express';
import type { AppDeps } from '@/server/deps';
import { callerOf, requireSignedIn } from '@/server/auth/caller';
import { validate } from '@/server/http/validate';
import { getAccount, updateAccount } from '@/server/features/account/service';
import { AccountPatchBodySchema } from '@/shared/api/account';

export function accountRouter(deps: AppDeps): Router {
  const { db } = deps;
  const router = Router();
  router.use(requireSignedIn(db));
  router.get('/', async (req, res) => {
    validate(req, {});
    res.json(await getAccount(db, callerOf(req).user));
  });
  router.patch('/', async (req, res) => {
    const { body } = validate(req, { body: AccountPatchBodySchema });
    res.json(await updateAccount(db, callerOf(req).user, body));
  });
  return router;
}
