// The database handle the server passes around: one Sequelize instance with the models, and a pg
// pool for the session store.
import pg from 'pg';
import { Sequelize } from 'sequelize';
import { initModels, type Models } from '@/server/db/models';

export type Db = {
  sequelize: Sequelize;
  models: Models;
  pool: pg.Pool;
  close: () => Promise<void>;
};

export function createDb(databaseUrl: string): Db {
  const sequelize = new Sequelize(databaseUrl, {
    dialect: 'postgres',
    logging: false,
    pool: { max: 5, min: 0, idle: 10_000, acquire: 15_000 },
    dialectOptions: { connectionTimeoutMillis: 5_000 },
  });
  const models = initModels(sequelize);
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 3, connectionTimeoutMillis: 5_000 });
  // An idle client losing its connection (database restart) must not crash the process.
  pool.on('error', (err) => console.error('[trimwire] session pool error:', err.message));
  return {
    sequelize,
    models,
    pool,
    close: async () => {
      await Promise.allSettled([sequelize.close(), pool.end()]);
    },
  };
}
