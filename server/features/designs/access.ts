// Loading a design for the caller: another team's design is 404 (its existence is not revealed),
// a member without the needed role is 403.
import type { Request } from 'express';
import type { Db } from '@/server/db';
import type { Design, Membership } from '@/server/db/models';
import { authorizeForTeam } from '@/server/auth/caller';
import { NotFound } from '@/server/http/errors';
import { ROLES, type Role } from '@/shared/domain/roles';

export const READERS: readonly Role[] = ROLES;
export const DESIGNERS: readonly Role[] = ['designer', 'admin'];
export const REVIEWERS: readonly Role[] = ['reviewer', 'admin'];

export async function designFor(db: Db, req: Request, designId: string, roles: readonly Role[]): Promise<{ design: Design; membership: Membership }> {
  const design = await db.models.Design.findByPk(designId);
  if (!design) throw new NotFound('No such design.');
  const membership = await authorizeForTeam(db, req, design.teamId, roles);
  return { design, membership };
}
