// Display labels for user ids ("Name <email>"), fetched in one query per response.
import { Op } from 'sequelize';
import type { Db } from '@/server/db';

export async function userLabels(db: Db, ids: (string | null | undefined)[]): Promise<Map<string, string>> {
  const wanted = [...new Set(ids.filter((x): x is string => !!x))];
  const map = new Map<string, string>();
  if (!wanted.length) return map;
  const users = await db.models.User.findAll({ where: { id: { [Op.in]: wanted } }, attributes: ['id', 'name', 'email'] });
  for (const u of users) map.set(u.id, `${u.name} <${u.email}>`);
  return map;
}

export const labelOf = (labels: Map<string, string>, id: string | null | undefined): string => (id ? (labels.get(id) ?? 'a former member') : 'a former member');
