// /api/auth/* — CSRF token, sign-in and sign-out, the "me" view, team switch, password reset and
// setting a password from an e-mailed link.
import { Router, type NextFunction, type Request, type Response } from 'express';
import type { AppDeps } from '@/server/deps';
import type { User } from '@/server/db/models';
import { callerOf, currentMembership, requireSignedIn, resolveMembership } from '@/server/auth/caller';
import { csrfTokenFor } from '@/server/http/csrf';
import { Forbidden, Unauthorized } from '@/server/http/errors';
import { validate } from '@/server/http/validate';
import { auditSignIn, meFor, requestPasswordReset, setPasswordWithToken } from '@/server/features/auth/service';
import { recordAudit } from '@/server/features/audit/service';
import { PasswordResetBodySchema, SetPasswordBodySchema, SignInBodySchema, SwitchTeamBodySchema, type CsrfResponse } from '@/shared/api/auth';
import type { Passport } from 'passport';

/** Starts a signed-in session (new session id, keeping the CSRF token the page already holds). */
function logIn(req: Request, user: User): Promise<void> {
  return new Promise((resolve, reject) => req.logIn(user, { session: true, keepSessionInfo: true }, (err) => (err ? reject(err) : resolve())));
}

function logOut(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.logOut({ keepSessionInfo: true }, (err) => (err ? reject(err) : resolve())));
}

/** Runs the local strategy on already-validated credentials; resolves the user or null. */
function authenticate(passport: InstanceType<typeof Passport>, req: Request, res: Response): Promise<User | null> {
  return new Promise((resolve, reject) => {
    passport.authenticate('local', { session: false }, (err: unknown, user: User | false) => {
      if (err) reject(err);
      else resolve(user || null);
    })(req, res, ((e?: unknown) => (e ? reject(e) : resolve(null))) as NextFunction);
  });
}

export function authRouter(deps: AppDeps, passport: InstanceType<typeof Passport>): Router {
  const { db } = deps;
  const router = Router();
  const signedIn = requireSignedIn(db);

  router.get('/csrf', (req, res) => {
    validate(req, {});
    const body: CsrfResponse = { csrfToken: csrfTokenFor(req) };
    res.set('Cache-Control', 'no-store').json(body);
  });

  router.post('/sign-in', deps.limits.signIn, async (req, res) => {
    const { body } = validate(req, { body: SignInBodySchema });
    req.body = body; // the strategy reads the normalised e-mail
    const user = await authenticate(passport, req, res);
    if (!user) {
      const known = await db.models.User.findOne({ where: { email: body.email } });
      await auditSignIn(db, body.email, known, false);
      throw new Unauthorized('That e-mail and password do not match an account.', 'bad-credentials');
    }
    const membership = await currentMembership(db, user.id, undefined);
    if (!membership) {
      await auditSignIn(db, body.email, user, false);
      throw new Forbidden('You are not a member of any team. Ask an admin for an invite.');
    }
    await logIn(req, user);
    req.session.teamId = membership.teamId;
    await auditSignIn(db, body.email, user, true);
    res.json(await meFor(db, user, membership));
  });

  router.post('/sign-out', async (req, res) => {
    validate(req, {});
    const user = req.user;
    if (user) {
      const teamId = req.session.teamId ?? null;
      await logOut(req);
      delete req.session.teamId;
      await recordAudit(db, { teamId, actor: { id: user.id, email: user.email }, action: 'sign-out', target: user.email });
    }
    res.status(204).end();
  });

  router.get('/me', signedIn, async (req, res) => {
    validate(req, {});
    const { user, membership } = callerOf(req);
    res.json(await meFor(db, user, membership));
  });

  router.post('/switch-team', signedIn, async (req, res) => {
    const { body } = validate(req, { body: SwitchTeamBodySchema });
    const { user } = callerOf(req);
    const membership = await resolveMembership(db, user.id, body.teamId);
    if (!membership) throw new Forbidden('You are not a member of that team.');
    req.session.teamId = membership.teamId;
    res.json(await meFor(db, user, membership));
  });

  router.post('/password-reset', deps.limits.mail, async (req, res) => {
    const { body } = validate(req, { body: PasswordResetBodySchema });
    await requestPasswordReset(deps, body.email);
    res.status(202).json({ status: 'accepted' });
  });

  router.post('/set-password', async (req, res) => {
    const { body } = validate(req, { body: SetPasswordBodySchema });
    const { user, teamId } = await setPasswordWithToken(deps, body.token, body.password);
    const membership = await currentMembership(db, user.id, teamId ?? undefined);
    if (!membership) throw new Forbidden('Your password is set, but you are not a member of any team. Ask an admin for an invite.');
    await logIn(req, user);
    req.session.teamId = membership.teamId;
    res.json(await meFor(db, user, membership));
  });

  return router;
}
