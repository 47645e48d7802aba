// Is the database reachable? A short query with a time limit, so a hung database reads as "down".
import type { Db } from '@/server/db';
import type { HealthResponse } from '@/shared/api/health';

export async function checkHealth(db: Db, timeoutMs = 2_000): Promise<HealthResponse> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<never>((_, reject) => {
    timer = setTimeout(() => reject(new Error('database check timed out')), timeoutMs);
  });
  try {
    await Promise.race([db.sequelize.query('SELECT 1'), timeout]);
    return { status: 'ok', database: 'ok' };
  } catch {
    return { status: 'degraded', database: 'down' };
  } finally {
    clearTimeout(timer);
  }
}
