// Command line for the scripts: `tsx server/db/cli.ts migrate` and `… seed` against DATABASE_URL.
import { createDb } from '@/server/db';
import { migrate } from '@/server/db/migrate';
import { seedDemo, SeedRefused } from '@/server/db/seed';
import { EnvError, loadEnv } from '@/server/env';

async function main(command: string | undefined): Promise<void> {
  const env = loadEnv();
  const db = createDb(env.DATABASE_URL);
  try {
    if (command === 'migrate') {
      const applied = await migrate(db.sequelize);
      console.log(applied.length ? `Applied migrations: ${applied.join(', ')}` : 'Database schema is up to date.');
    } else if (command === 'seed') {
      const { created } = await seedDemo(db, { nodeEnv: env.NODE_ENV, bcryptCost: env.BCRYPT_COST });
      console.log(created.length ? `Demo data created: ${created.join(', ')}` : 'Demo data already present.');
    } else {
      throw new Error(`Unknown command "${command ?? ''}". Use: migrate | seed`);
    }
  } finally {
    await db.close();
  }
}

main(process.argv[2]).catch((err: unknown) => {
  console.error(err instanceof EnvError || err instanceof SeedRefused || err instanceof Error ? err.message : err);
  process.exit(1);
});
