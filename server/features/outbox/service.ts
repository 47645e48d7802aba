// Reads mail the local fake SMTP server captured for a team (development and tests only).
import { Op } from 'sequelize';
import type { Db } from '@/server/db';
import type { OutboxMessage } from '@/shared/api/team';

export async function listOutbox(db: Db, teamId: string, limit = 100): Promise<OutboxMessage[]> {
  const rows = await db.models.OutboxMessage.findAll({
    where: { teamIds: { [Op.contains]: [teamId] } },
    order: [['receivedAt', 'DESC'], ['id', 'DESC']],
    limit,
  });
  return rows.map((r) => ({
    id: r.id,
    to: r.toAddress,
    subject: r.subject,
    text: r.text,
    ...(r.html ? { html: r.html } : {}),
    receivedAt: r.receivedAt.toISOString(),
  }));
}
