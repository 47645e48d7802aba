// The development demo: team "Larkspur Relay Works" (building the Wren-8 teaching computer from
// discrete transistors) with one account per role, password `trimwire-demo`. Idempotent; refuses
// to run in production.
import type { Db } from '@/server/db';
import { hashPassword } from '@/server/auth/passwords';
import type { Role } from '@/shared/domain/roles';
import { seedWorkflow } from '@/server/db/seed-workflow';

export const DEMO_TEAM_NAME = 'Larkspur Relay Works';
export const DEMO_PASSWORD = 'trimwire-demo';
export const DEMO_ACCOUNTS: readonly { email: string; name: string; role: Role }[] = [
  { email: 'admin@trimwire.test', name: 'Maren Oduya', role: 'admin' },
  { email: 'designer@trimwire.test', name: 'Tobias Quell', role: 'designer' },
  { email: 'reviewer@trimwire.test', name: 'Ines Varga', role: 'reviewer' },
  { email: 'educator@trimwire.test', name: 'Rafe Lindqvist', role: 'educator' },
  { email: 'viewer@trimwire.test', name: 'Priya Hallett', role: 'viewer' },
];

export class SeedRefused extends Error {}

export type SeedResult = { teamId: string; created: string[] };

/**
 * Creates whatever part of the demo is missing. Existing demo accounts keep their passwords, names
 * and roles (someone may have changed them while trying the product).
 */
export async function seedDemo(db: Db, opts: { nodeEnv: string; bcryptCost: number }): Promise<SeedResult> {
  if (opts.nodeEnv === 'production') throw new SeedRefused('The demo seed is for development only; production refuses to seed.');
  const created: string[] = [];
  const hash = await hashPassword(DEMO_PASSWORD, opts.bcryptCost);
  const teamId = await db.sequelize.transaction(async (transaction) => {
    let team = await db.models.Team.findOne({ where: { name: DEMO_TEAM_NAME }, order: [['createdAt', 'ASC']], transaction });
    if (!team) {
      team = await db.models.Team.create({ name: DEMO_TEAM_NAME }, { transaction });
      created.push(`team ${DEMO_TEAM_NAME}`);
    }
    for (const a of DEMO_ACCOUNTS) {
      const [user, made] = await db.models.User.findOrCreate({
        where: { email: a.email },
        defaults: { email: a.email, name: a.name, passwordHash: hash },
        transaction,
      });
      if (made) created.push(a.email);
      const [, joined] = await db.models.Membership.findOrCreate({
        where: { teamId: team.id, userId: user.id },
        defaults: { teamId: team.id, userId: user.id, role: a.role },
        transaction,
      });
      if (joined && !made) created.push(`${a.email} in ${DEMO_TEAM_NAME}`);
    }
    return team.id;
  });
  // The designs, scans and decisions only in development: tests build their own.
  if (opts.nodeEnv === 'development') created.push(...(await seedWorkflow(db, teamId)));
  return { teamId, created };
}
