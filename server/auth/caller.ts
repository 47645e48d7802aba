// Who is calling and what they may do. Every protected route goes through requireSignedIn, then
// requireRole (the current team) or authorizeForTeam (a resource that names its owning team).
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import type { Db } from '@/server/db';
import type { Membership, User } from '@/server/db/models';
import { Forbidden, NotFound, Unauthorized } from '@/server/http/errors';
import type { Role } from '@/shared/domain/roles';

export type Caller = { user: User; membership: Membership };

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport's req.user is our User row.
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends UserRow {}
    interface Request {
      caller?: Caller;
    }
  }
}
type UserRow = InstanceType<typeof import('@/server/db/models/user').User>;

/** The caller's membership in a team, or null when they are not a member. */
export async function resolveMembership(db: Db, userId: string, teamId: string): Promise<Membership | null> {
  return db.models.Membership.findOne({ where: { userId, teamId } });
}

/**
 * Picks the membership the session works in: the session's team when still a member, else the
 * oldest membership (a person removed from the team they were viewing falls back to another).
 */
export async function currentMembership(db: Db, userId: string, sessionTeamId: string | undefined): Promise<Membership | null> {
  if (sessionTeamId) {
    const m = await resolveMembership(db, userId, sessionTeamId);
    if (m) return m;
  }
  return db.models.Membership.findOne({ where: { userId }, order: [['createdAt', 'ASC'], ['id', 'ASC']] });
}

/** Resolves req.caller from the session; 401 when signed out, 403 when in no team at all. */
export function requireSignedIn(db: Db): RequestHandler {
  return async (req: Request, _res: Response, next: NextFunction) => {
    if (!req.user) throw new Unauthorized();
    const membership = await currentMembership(db, req.user.id, req.session.teamId);
    if (!membership) throw new Forbidden('You are not a member of any team. Ask an admin for an invite.');
    req.session.teamId = membership.teamId;
    req.caller = { user: req.user, membership };
    next();
  };
}

export function callerOf(req: Request): Caller {
  if (!req.caller) throw new Unauthorized();
  return req.caller;
}

export function assertRole(membership: Membership, roles: readonly Role[]): void {
  if (!roles.includes(membership.role)) {
    throw new Forbidden(`This needs one of these roles: ${roles.join(', ')}.`);
  }
}

/** Middleware: the caller's role in their current team must be one of `roles`. */
export function requireRole(...roles: Role[]): RequestHandler {
  return (req, _res, next) => {
    assertRole(callerOf(req).membership, roles);
    next();
  };
}

/**
 * For a resource owned by `teamId`: a caller outside that team gets 404 (the resource's existence
 * is not revealed); a member without one of `roles` gets 403. Returns the membership.
 */
export async function authorizeForTeam(db: Db, req: Request, teamId: string, roles: readonly Role[]): Promise<Membership> {
  const { user } = callerOf(req);
  const membership = await resolveMembership(db, user.id, teamId);
  if (!membership) throw new NotFound();
  assertRole(membership, roles);
  return membership;
}
