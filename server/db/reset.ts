// Empties a test database and brings it to the current schema. Refuses any database whose name
// does not end in "_test", so a mistyped DATABASE_URL cannot wipe development or production data.
import type { Sequelize } from 'sequelize';
import { migrate } from '@/server/db/migrate';

export async function resetTestDatabase(sequelize: Sequelize): Promise<void> {
  const name = sequelize.getDatabaseName();
  if (!name.endsWith('_test')) throw new Error(`Refusing to reset database "${name}": only *_test databases are reset.`);
  await sequelize.query('DROP SCHEMA IF EXISTS public CASCADE; CREATE SCHEMA public;');
  await migrate(sequelize);
}
