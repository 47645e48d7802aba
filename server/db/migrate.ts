// Runs pending migrations with umzug (state kept in the SequelizeMeta table).
import { SequelizeStorage, Umzug } from 'umzug';
import type { Sequelize } from 'sequelize';
import { MIGRATIONS } from '@/server/db/migrations';

export function createMigrator(sequelize: Sequelize): Umzug<ReturnType<Sequelize['getQueryInterface']>> {
  return new Umzug({
    migrations: MIGRATIONS.map((m) => ({ name: m.name, up: m.up, down: m.down })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  });
}

/** Applies every pending migration; returns the names applied. */
export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const applied = await createMigrator(sequelize).up();
  return applied.map((m) => m.name);
}
