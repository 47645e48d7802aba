// Finds scans left "running" by a worker that stopped (no heartbeat for the timeout): each goes
// back to the queue for another attempt, or fails once it has used its attempts. Every update is
// guarded by the same staleness test, so a sweep racing a live worker or another sweeper is a no-op.
import { QueryTypes } from 'sequelize';
import type { Db } from '@/server/db';

export type SweepResult = { requeued: string[]; failed: string[] };

export async function sweepStaleScans(
  db: Db,
  opts: { heartbeatTimeoutS: number; maxAttempts: number; send: (scanId: string) => Promise<unknown>; onlyId?: string },
): Promise<SweepResult> {
  const result: SweepResult = { requeued: [], failed: [] };
  const stale = `status = 'running' AND (heartbeat_at IS NULL OR heartbeat_at < now() - make_interval(secs => :timeout))`;
  const failedRows = await db.sequelize.query<{ id: string }>(
    `UPDATE scans SET status = 'failed', finished_at = now(), updated_at = now(), stage = 'failed',
       error = 'The worker running this scan stopped answering ' || attempts || ' time(s); the scan was given up. Start it again.'
     WHERE ${stale} AND attempts >= :max ${opts.onlyId ? 'AND id = :id' : ''} RETURNING id`,
    { replacements: { timeout: opts.heartbeatTimeoutS, max: opts.maxAttempts, id: opts.onlyId ?? null }, type: QueryTypes.SELECT },
  );
  result.failed = failedRows.map((r) => r.id);
  const requeued = await db.sequelize.query<{ id: string }>(
    `UPDATE scans SET status = 'queued', stage = 'queued again (worker lost)', progress = 0, worker = NULL, updated_at = now()
     WHERE ${stale} AND attempts < :max ${opts.onlyId ? 'AND id = :id' : ''} RETURNING id`,
    { replacements: { timeout: opts.heartbeatTimeoutS, max: opts.maxAttempts, id: opts.onlyId ?? null }, type: QueryTypes.SELECT },
  );
  for (const { id } of requeued) {
    await opts.send(id);
    result.requeued.push(id);
  }
  return result;
}
