// Scans: start (a queued row plus a pg-boss job; the heavy work happens in a worker process),
// read (a scan whose worker stopped answering is swept on read too), and cancel (a flag the worker
// polls while the scan runs, stopping its engine thread; a queued scan is cancelled at once).
import type { Db } from '@/server/db';
import type { Design, Scan as ScanRow, User } from '@/server/db/models';
import { BadRequest, Conflict, HttpError, NotFound } from '@/server/http/errors';
import { RULES } from '@/optimizer/rules';
import { recordAudit } from '@/server/features/audit/service';
import { ENGINE_VERSION } from '@/server/features/designs/engine';
import { labelOf, userLabels } from '@/server/features/designs/users';
import { scanDto } from '@/server/features/scans/dto';
import type { ScanQueue } from '@/server/jobs/queue';
import { loadScanSettings } from '@/server/jobs/settings';
import { sweepStaleScans } from '@/server/jobs/sweeper';
import type { Scan, ScanStartBody } from '@/shared/api/scans';

export async function scanResponse(db: Db, s: ScanRow): Promise<Scan> {
  return scanDto(s, labelOf(await userLabels(db, [s.startedBy]), s.startedBy));
}

export async function startScan(db: Db, queue: ScanQueue, design: Design, user: User, body: ScanStartBody): Promise<Scan> {
  const unknown = (body.rules ?? []).filter((r) => !Object.prototype.hasOwnProperty.call(RULES, r));
  if (unknown.length) {
    throw new BadRequest(`Unknown rule${unknown.length > 1 ? 's' : ''}: ${unknown.join(', ')}.`, { issues: [{ path: 'body.rules', message: `known rules: ${Object.keys(RULES).join(', ')}` }] });
  }
  const rev = body.revision
    ? await db.models.Revision.findOne({ where: { designId: design.id, number: body.revision }, attributes: ['id', 'number'] })
    : await db.models.Revision.findOne({ where: { designId: design.id }, order: [['number', 'DESC']], attributes: ['id', 'number'] });
  if (!rev) throw new BadRequest(`The design has no revision ${body.revision}.`, { issues: [{ path: 'body.revision', message: 'no such revision' }] });
  const scan = await db.sequelize.transaction(async (transaction) => {
    const s = await db.models.Scan.create(
      { designId: design.id, revisionId: rev.id, revisionNumber: rev.number, rules: body.rules ? [...new Set(body.rules)] : null, startedBy: user.id, engineVersion: ENGINE_VERSION },
      { transaction },
    );
    await recordAudit(db, { teamId: design.teamId, actor: user, action: 'scan-started', target: design.name, details: { scanId: s.id, revision: rev.number, rules: body.rules ?? 'all' } }, transaction);
    return s;
  });
  try {
    const jobId = await queue.send(scan.id);
    await scan.update({ jobId });
  } catch (err) {
    await scan.update({ status: 'failed', stage: 'failed', finishedAt: new Date(), error: 'The scan queue could not be reached; start the scan again.' });
    throw new HttpError(503, 'unavailable', 'The scan queue is not available right now. Try again in a moment.', { cause: err instanceof Error ? err.message : String(err) });
  }
  return scanResponse(db, scan);
}

export async function scanRow(db: Db, id: string): Promise<ScanRow> {
  const s = await db.models.Scan.findByPk(id);
  if (!s) throw new NotFound('No such scan.');
  return s;
}

/** A running scan whose heartbeat is older than the timeout goes back to the queue (or fails) now. */
export async function sweepIfStale(db: Db, queue: ScanQueue, s: ScanRow): Promise<ScanRow> {
  if (s.status !== 'running') return s;
  const settings = loadScanSettings();
  if (s.heartbeatAt && Date.now() - s.heartbeatAt.getTime() < settings.heartbeatTimeoutS * 1000) return s;
  await sweepStaleScans(db, { heartbeatTimeoutS: settings.heartbeatTimeoutS, maxAttempts: settings.maxAttempts, send: (id) => queue.send(id), onlyId: s.id });
  return s.reload();
}

export async function cancelScan(db: Db, s: ScanRow, user: User): Promise<Scan> {
  if (s.status === 'done' || s.status === 'failed' || s.status === 'cancelled') {
    throw new Conflict(`The scan has already ${s.status === 'done' ? 'finished' : s.status === 'failed' ? 'failed' : 'been cancelled'}.`, 'scan-finished');
  }
  // A queued scan stops here; a running one stops when its worker next polls the flag.
  await db.sequelize.query(
    `UPDATE scans SET cancel_requested = true, updated_at = now(),
       status = CASE WHEN status = 'queued' THEN 'cancelled' ELSE status END,
       stage = CASE WHEN status = 'queued' THEN 'cancelled' ELSE stage END,
       finished_at = CASE WHEN status = 'queued' THEN now() ELSE finished_at END
     WHERE id = :id`,
    { replacements: { id: s.id } },
  );
  await s.reload();
  const design = await db.models.Design.findByPk(s.designId);
  if (design) await recordAudit(db, { teamId: design.teamId, actor: user, action: 'scan-finished', target: design.name, details: { scanId: s.id, cancelled: true } });
  return scanResponse(db, s);
}
