// Team membership: the member list, invites by e-mail, role changes and removals, with the rule
// that a team always keeps at least one admin.
import { Op, type Transaction } from 'sequelize';
import type { AppDeps } from '@/server/deps';
import type { Db } from '@/server/db';
import type { Membership, User } from '@/server/db/models';
import { INVITE_TTL_MS, newToken } from '@/server/auth/tokens';
import { Conflict, HttpError, NotFound } from '@/server/http/errors';
import { recordAudit } from '@/server/features/audit/service';
import { inviteMessage } from '@/server/mail/templates';
import type { Invite, Member, TeamResponse } from '@/shared/api/team';
import type { Role } from '@/shared/domain/roles';

function memberDto(m: Membership): Member {
  return { userId: m.userId, email: m.user!.email, name: m.user!.name, role: m.role, joinedAt: m.createdAt.toISOString() };
}

export async function getTeam(db: Db, teamId: string, includeInvites: boolean): Promise<TeamResponse> {
  const team = await db.models.Team.findByPk(teamId);
  if (!team) throw new NotFound('Team not found.');
  const members = await db.models.Membership.findAll({
    where: { teamId },
    include: [{ model: db.models.User, as: 'user' }],
  });
  members.sort((a, b) => a.user!.name.localeCompare(b.user!.name) || a.user!.email.localeCompare(b.user!.email));
  const invites = includeInvites
    ? await db.models.Token.findAll({
        where: { kind: 'invite', teamId, usedAt: null, expiresAt: { [Op.gt]: new Date() } },
        order: [['createdAt', 'DESC']],
      })
    : [];
  return {
    team: { id: team.id, name: team.name },
    members: members.map(memberDto),
    invites: invites.map((t): Invite => ({ id: t.id, email: t.email, role: t.role!, expiresAt: t.expiresAt.toISOString() })),
  };
}

export async function invite(deps: AppDeps, inviter: User, teamId: string, email: string, role: Role): Promise<Invite> {
  const { db, env, mailer } = deps;
  const team = await db.models.Team.findByPk(teamId);
  if (!team) throw new NotFound('Team not found.');
  const existingUser = await db.models.User.findOne({ where: { email } });
  if (existingUser && (await db.models.Membership.findOne({ where: { teamId, userId: existingUser.id } }))) {
    throw new Conflict(`${email} is already a member of ${team.name}.`, 'already-member');
  }
  const { token, hash } = newToken();
  const expiresAt = new Date(Date.now() + INVITE_TTL_MS);
  const row = await db.sequelize.transaction(async (transaction) => {
    // A fresh invite replaces any earlier unused one to the same address, so only one link works.
    await db.models.Token.destroy({ where: { kind: 'invite', teamId, email, usedAt: null }, transaction });
    return db.models.Token.create(
      { kind: 'invite', tokenHash: hash, email, userId: existingUser?.id ?? null, teamId, role, createdBy: inviter.id, expiresAt, usedAt: null },
      { transaction },
    );
  });
  const link = `${env.PUBLIC_URL}/set-password?token=${encodeURIComponent(token)}`;
  try {
    await mailer.send({ to: email, teamIds: [teamId], ...inviteMessage({ teamName: team.name, inviterName: inviter.name, role, link, expiresAt }) });
  } catch (err) {
    // The link only exists in the e-mail, so an invite whose mail failed is useless: drop it.
    await row.destroy();
    console.error('[trimwire] invite mail failed:', err instanceof Error ? err.message : err);
    throw new HttpError(503, 'unavailable', 'The invite e-mail could not be sent. Check the mail settings and try again.');
  }
  await recordAudit(db, { teamId, actor: { id: inviter.id, email: inviter.email }, action: 'invite-sent', target: email, details: { role } });
  return { id: row.id, email, role, expiresAt: expiresAt.toISOString() };
}

export async function revokeInvite(db: Db, actor: User, teamId: string, inviteId: string): Promise<void> {
  const row = await db.models.Token.findOne({ where: { id: inviteId, kind: 'invite', teamId, usedAt: null } });
  if (!row) throw new NotFound('Invite not found.');
  await row.destroy();
  await recordAudit(db, { teamId, actor: { id: actor.id, email: actor.email }, action: 'invite-revoked', target: row.email, details: { role: row.role } });
}

/** Locks the team's memberships and refuses a change that would leave the team with no admin. */
async function lockedMember(db: Db, teamId: string, userId: string, transaction: Transaction) {
  const all = await db.models.Membership.findAll({ where: { teamId }, lock: transaction.LOCK.UPDATE, transaction });
  const target = all.find((m) => m.userId === userId);
  if (!target) throw new NotFound('That person is not a member of this team.');
  const admins = all.filter((m) => m.role === 'admin').length;
  return { target, admins };
}

function lastAdmin(): Conflict {
  return new Conflict('A team needs at least one admin. Make someone else an admin first.', 'last-admin');
}

export async function changeRole(db: Db, actor: User, teamId: string, userId: string, role: Role): Promise<Member> {
  const { member, from } = await db.sequelize.transaction(async (transaction) => {
    const { target, admins } = await lockedMember(db, teamId, userId, transaction);
    const from = target.role;
    if (from === 'admin' && role !== 'admin' && admins <= 1) throw lastAdmin();
    if (from !== role) await target.update({ role }, { transaction });
    const member = await db.models.Membership.findByPk(target.id, { include: [{ model: db.models.User, as: 'user' }], transaction });
    return { member: member!, from };
  });
  if (from !== role) {
    await recordAudit(db, { teamId, actor: { id: actor.id, email: actor.email }, action: 'role-changed', target: member.user!.email, details: { from, to: role } });
  }
  return memberDto(member);
}

export async function removeMember(db: Db, actor: User, teamId: string, userId: string): Promise<void> {
  const removed = await db.sequelize.transaction(async (transaction) => {
    const { target, admins } = await lockedMember(db, teamId, userId, transaction);
    if (target.role === 'admin' && admins <= 1) throw lastAdmin();
    const user = await db.models.User.findByPk(userId, { transaction });
    await target.destroy({ transaction });
    return { email: user?.email ?? userId, role: target.role };
  });
  await recordAudit(db, { teamId, actor: { id: actor.id, email: actor.email }, action: 'member-removed', target: removed.email, details: { role: removed.role } });
}
