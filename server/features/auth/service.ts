// Sign-in bookkeeping, the "me" view, password resets and setting a password from an e-mailed
// token (invite or reset).
import { Op } from 'sequelize';
import type { AppDeps } from '@/server/deps';
import type { Db } from '@/server/db';
import type { Membership, User } from '@/server/db/models';
import { hashPassword } from '@/server/auth/passwords';
import { hashToken, newToken, RESET_TTL_MS } from '@/server/auth/tokens';
import { BadRequest, Forbidden } from '@/server/http/errors';
import { recordAudit, recordAuditForTeams } from '@/server/features/audit/service';
import { resetMessage } from '@/server/mail/templates';
import type { Me } from '@/shared/api/auth';

export async function teamIdsOf(db: Db, userId: string): Promise<string[]> {
  const rows = await db.models.Membership.findAll({ where: { userId }, attributes: ['teamId'] });
  return rows.map((r) => r.teamId);
}

export async function meFor(db: Db, user: User, current: Membership): Promise<Me> {
  const memberships = await db.models.Membership.findAll({
    where: { userId: user.id },
    include: [{ model: db.models.Team, as: 'team' }],
    order: [['createdAt', 'ASC'], ['id', 'ASC']],
  });
  const teams = memberships.map((m) => ({ id: m.teamId, name: m.team!.name, role: m.role }));
  const team = teams.find((t) => t.id === current.teamId);
  if (!team) throw new Forbidden('You are no longer a member of this team.');
  return {
    user: { id: user.id, email: user.email, name: user.name },
    team: { id: team.id, name: team.name },
    role: current.role,
    teams,
  };
}

export async function auditSignIn(db: Db, email: string, user: User | null, ok: boolean): Promise<void> {
  const teamIds = user ? await teamIdsOf(db, user.id) : [];
  await recordAuditForTeams(db, teamIds, {
    actor: ok && user ? { id: user.id, email: user.email } : null,
    action: ok ? 'sign-in' : 'sign-in-failed',
    target: email,
  });
}

/** Sends a reset link when the account exists; says nothing either way (the route always answers 202). */
export async function requestPasswordReset(deps: AppDeps, email: string): Promise<void> {
  const { db, env, mailer } = deps;
  const user = await db.models.User.findOne({ where: { email } });
  if (!user) return;
  const { token, hash } = newToken();
  const expiresAt = new Date(Date.now() + RESET_TTL_MS);
  await db.sequelize.transaction(async (transaction) => {
    // A new request makes older unused reset links useless.
    await db.models.Token.destroy({ where: { kind: 'reset', userId: user.id, usedAt: null }, transaction });
    await db.models.Token.create({ kind: 'reset', tokenHash: hash, email, userId: user.id, teamId: null, role: null, createdBy: null, expiresAt, usedAt: null }, { transaction });
  });
  const teamIds = await teamIdsOf(db, user.id);
  const link = `${env.PUBLIC_URL}/set-password?token=${encodeURIComponent(token)}`;
  try {
    await mailer.send({ to: user.email, teamIds, ...resetMessage({ name: user.name, link, expiresAt }) });
  } catch (err) {
    // The caller still gets 202: an error here would tell strangers which e-mails have accounts.
    console.error('[trimwire] reset mail failed:', err instanceof Error ? err.message : err);
    return;
  }
  await recordAuditForTeams(db, teamIds, { actor: null, action: 'password-reset-requested', target: user.email });
}

function nameFromEmail(email: string): string {
  const local = email.split('@')[0] ?? email;
  const words = local.split(/[._-]+/).filter(Boolean);
  return words.map((w) => w[0]!.toUpperCase() + w.slice(1)).join(' ') || email;
}

/**
 * Uses an invite or reset token once: sets the password (creating the account and membership for an
 * invite) and returns the user and the team to work in. Unknown, used or expired → 400 token-invalid.
 */
export async function setPasswordWithToken(deps: AppDeps, token: string, password: string): Promise<{ user: User; teamId: string | null }> {
  const { db, env } = deps;
  const passwordHash = await hashPassword(password, env.BCRYPT_COST);
  const result = await db.sequelize.transaction(async (transaction) => {
    // Claiming the row with an UPDATE makes two simultaneous uses of one token impossible.
    const [claimed, rows] = await db.models.Token.update(
      { usedAt: new Date() },
      { where: { tokenHash: hashToken(token), usedAt: null, expiresAt: { [Op.gt]: new Date() } }, returning: true, transaction },
    );
    const row = claimed === 1 ? rows[0] : undefined;
    if (!row) throw new BadRequest('This link is not valid any more. It may have been used already or expired; ask for a new one.', undefined, 'token-invalid');

    if (row.kind === 'reset') {
      const user = await db.models.User.findByPk(row.userId!, { transaction });
      if (!user) throw new BadRequest('This link is not valid any more.', undefined, 'token-invalid');
      await user.update({ passwordHash }, { transaction });
      return { user, teamId: null as string | null, kind: row.kind, role: null };
    }

    const [user] = await db.models.User.findOrCreate({
      where: { email: row.email },
      defaults: { email: row.email, name: nameFromEmail(row.email), passwordHash },
      transaction,
    });
    await user.update({ passwordHash }, { transaction });
    const existing = await db.models.Membership.findOne({ where: { userId: user.id, teamId: row.teamId! }, transaction });
    if (!existing) await db.models.Membership.create({ userId: user.id, teamId: row.teamId!, role: row.role! }, { transaction });
    return { user, teamId: row.teamId, kind: row.kind, role: row.role };
  });

  const actor = { id: result.user.id, email: result.user.email };
  if (result.kind === 'invite') {
    await recordAudit(db, { teamId: result.teamId, actor, action: 'invite-accepted', target: result.user.email, details: { role: result.role } });
  } else {
    await recordAuditForTeams(db, await teamIdsOf(db, result.user.id), { actor, action: 'password-set', target: result.user.email, details: { via: 'reset' } });
  }
  return { user: result.user, teamId: result.teamId };
}
