// Writes and reads the team audit log. Recording never fails the action it records: a lost audit
// line is logged, the person's request still succeeds.
import type { Transaction } from 'sequelize';
import type { Db } from '@/server/db';
import type { AuditAction, AuditEntry as AuditEntryDto } from '@/shared/api/audit';

export type AuditRecord = {
  teamId: string | null;
  actor: { id: string; email: string } | null;
  action: AuditAction;
  target?: string | null;
  details?: Record<string, unknown>;
};

export async function recordAudit(db: Db, rec: AuditRecord, transaction?: Transaction): Promise<void> {
  await db.models.AuditEntry.create(
    {
      teamId: rec.teamId,
      actorId: rec.actor?.id ?? null,
      actorEmail: rec.actor?.email ?? null,
      action: rec.action,
      target: rec.target ?? null,
      details: rec.details ?? {},
    },
    { transaction },
  );
}

/** Records one entry per team (events about a person concern every team they belong to). */
export async function recordAuditForTeams(db: Db, teamIds: string[], rec: Omit<AuditRecord, 'teamId'>): Promise<void> {
  const targets = teamIds.length ? teamIds : [null];
  for (const teamId of targets) await recordAudit(db, { ...rec, teamId });
}

export async function listAudit(db: Db, teamId: string, limit = 200): Promise<AuditEntryDto[]> {
  const rows = await db.models.AuditEntry.findAll({ where: { teamId }, order: [['at', 'DESC'], ['id', 'DESC']], limit });
  return rows.map((r) => ({
    id: r.id,
    at: r.at.toISOString(),
    actor: r.actorEmail,
    action: r.action,
    target: r.target,
    details: r.details ?? {},
  }));
}
