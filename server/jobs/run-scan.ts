// Runs one scan: claims the row (queued, or running with a dead heartbeat), then hands parse →
// flatten → extract → each rule (with its proofs, margins and savings) to an engine thread
// (engine-host.ts), and stores what it found. The main thread stays free while the engine works:
// it writes each stage and percent the thread reports, keeps the heartbeat, and polls the cancel
// flag, stopping the thread at once on cancel. The sweeper (sweeper.ts) recovers scans whose
// worker died; a thread that crashes or runs out of memory fails its scan, not the worker.
import { QueryTypes } from 'sequelize';
import { InputError } from '@/optimizer/errors';
import type { MapFamily } from '@/optimizer/logic/family-parts';
import type { Minimiser } from '@/optimizer/logic/minimiser';
import { RULES } from '@/optimizer/rules';
import type { Db } from '@/server/db';
import type { Scan } from '@/server/db/models';
import type { Mailer } from '@/server/mail/mailer';
import { recordAudit } from '@/server/features/audit/service';
import { notifyReviewers } from '@/server/features/review/mail';
import { EnginePool, type EngineRun } from '@/server/jobs/engine-host';
import type { EngineJob } from '@/server/jobs/engine-protocol';
import { storeResults } from '@/server/jobs/store-results';

export type RunScanDeps = {
  db: Db;
  workerId: string;
  /** Serves the engine's minimise calls when no `engines` pool is given (a pool has its own). */
  minimiser?: Minimiser;
  mailer?: Mailer;
  publicUrl?: string;
  stageDelayMs?: number;
  heartbeatMs?: number;
  heartbeatTimeoutS: number;
  maxAttempts: number;
  /** How often the cancel flag is read while the engine runs (default 1000 ms). */
  cancelPollMs?: number;
  /** The worker's engine threads; without it, scans share one kept thread per minimiser (the seed's case). */
  engines?: EnginePool;
  log?: (msg: string, err: unknown) => void;
};

export type RunOutcome = 'skipped' | 'done' | 'failed' | 'cancelled' | 'lost';

class Cancelled extends Error {}
class Lost extends Error {}
/** The engine thread failed; `quiet` for bad input, which is the design's fault, not the worker's. */
class EngineFailed extends Error {
  constructor(
    message: string,
    readonly quiet: boolean,
    readonly detail?: unknown,
  ) {
    super(message);
  }
}

/**
 * Engine threads for callers without a worker's pool (the demo seed runs its scans one after the
 * other): one kept thread per minimiser, so the engine loads once rather than once per scan. The
 * idle thread does not keep the process alive.
 */
const sharedEngines = new WeakMap<Minimiser | typeof NO_MINIMISER, EnginePool>();
const NO_MINIMISER = {};
function defaultEngines(minimiser: Minimiser | undefined): EnginePool {
  const key = minimiser ?? NO_MINIMISER;
  let pool = sharedEngines.get(key);
  if (!pool) sharedEngines.set(key, (pool = new EnginePool({ keep: 1, memoryMb: 4_096, minimiser })));
  return pool;
}

async function claim(db: Db, scanId: string, workerId: string, timeoutS: number): Promise<Scan | null> {
  const rows = await db.sequelize.query<{ id: string }>(
    `UPDATE scans SET status = 'running', attempts = attempts + 1, worker = :worker, heartbeat_at = now(),
       started_at = COALESCE(started_at, now()), stage = 'starting', progress = 0, error = NULL, updated_at = now()
     WHERE id = :id AND NOT cancel_requested
       AND (status = 'queued' OR (status = 'running' AND (heartbeat_at IS NULL OR heartbeat_at < now() - make_interval(secs => :timeout))))
     RETURNING id`,
    { replacements: { id: scanId, worker: workerId, timeout: timeoutS }, type: QueryTypes.SELECT },
  );
  return rows.length ? db.models.Scan.findByPk(scanId) : null;
}

export async function runScan(deps: RunScanDeps, scanId: string): Promise<RunOutcome> {
  const { db, workerId } = deps;
  const log = deps.log ?? ((m, e) => console.error(`[trimwire worker] ${m}:`, e));
  const scan = await claim(db, scanId, workerId, deps.heartbeatTimeoutS);
  if (!scan) return 'skipped';
  if (scan.attempts > deps.maxAttempts) {
    await scan.update({ status: 'failed', stage: 'failed', finishedAt: new Date(), error: `The scan was started ${scan.attempts - 1} times without finishing; given up.` });
    return 'failed';
  }
  const mine = { id: scan.id, worker: workerId };
  let timings: Record<string, number> = {};

  // While the engine thread runs, every answer about the row can stop it: cancel requested, or the
  // row no longer this worker's (swept and taken over). Once its outcome is in, the row's later
  // changes (this worker's own store) are no reason to stop anything.
  let engine: EngineRun | undefined;
  let stopReason: 'cancelled' | 'lost' | undefined;
  const judge = (rows: { cancel_requested: boolean }[]) => {
    if (!engine) return;
    const why = !rows.length ? 'lost' : rows[0]!.cancel_requested ? 'cancelled' : undefined;
    if (why && !stopReason) {
      stopReason = why;
      engine.stop();
    }
  };
  let polling = false;
  const pollCancel = () => {
    if (polling || !engine) return;
    polling = true;
    db.sequelize
      .query<{ cancel_requested: boolean }>(`SELECT cancel_requested FROM scans WHERE id = :id AND worker = :worker AND status = 'running'`, { replacements: mine, type: QueryTypes.SELECT })
      .then(judge, (err: unknown) => log('cancel check failed', err))
      .finally(() => (polling = false));
  };
  const beat = setInterval(() => {
    db.sequelize
      .query(`UPDATE scans SET heartbeat_at = now() WHERE id = :id AND worker = :worker AND status = 'running'`, { replacements: mine })
      .catch((err: unknown) => log('heartbeat failed', err));
  }, deps.heartbeatMs ?? 5_000);
  const poll = setInterval(pollCancel, deps.cancelPollMs ?? 1_000);

  /** Writes stage and percent; the answer says whether the scan was cancelled or taken over. */
  const stageRow = (name: string, progress: number) =>
    db.sequelize.query<{ cancel_requested: boolean }>(
      `UPDATE scans SET stage = :stage, progress = :progress, heartbeat_at = now(), updated_at = now()
       WHERE id = :id AND worker = :worker AND status = 'running' RETURNING cancel_requested`,
      { replacements: { ...mine, stage: name, progress }, type: QueryTypes.SELECT },
    );
  // Stage writes go one after another so the percent shown never steps back.
  let stageWrites: Promise<void> = Promise.resolve();
  const onStage = (name: string, progress: number, done: Record<string, number>) => {
    timings = done;
    stageWrites = stageWrites.then(() => stageRow(name, progress).then(judge, (err: unknown) => log('stage update failed', err)));
  };

  try {
    const design = await db.models.Design.findByPk(scan.designId);
    const rev = await db.models.Revision.findByPk(scan.revisionId);
    if (!design || !rev) throw new InputError([{ severity: 'error', code: 'scan.missing', message: 'the design or revision was deleted' }]);
    const rules = scan.rules ?? Object.keys(RULES);
    const unknown = rules.filter((r) => !Object.prototype.hasOwnProperty.call(RULES, r));
    if (unknown.length) throw InputError.at('rules.unknown', `unknown rule id(s): ${unknown.join(', ')}`);
    const assumptionRows = await db.models.Assumption.findAll({ where: { designId: design.id, status: 'active' } });
    const job: EngineJob = {
      source: rev.source,
      fileName: rev.fileName,
      format: rev.format,
      rules,
      assumptions: assumptionRows.map((a) => ({ id: a.id, text: a.expression })),
      targetFamily: design.family as MapFamily,
      clockPeriod: design.clockPeriodNs ? design.clockPeriodNs * 1e-9 : undefined,
      minimiser: null,
      stageDelayMs: deps.stageDelayMs ?? 0,
    };
    const engines = deps.engines ?? defaultEngines(deps.minimiser);
    engine = engines.run(job, onStage);
    const outcome = await engine.outcome;
    await stageWrites;
    if (stopReason === 'cancelled') throw new Cancelled();
    if (stopReason === 'lost' || outcome.kind === 'stopped') throw new Lost();
    if (outcome.kind === 'crashed') throw new EngineFailed(`The scan failed: ${outcome.message}.`, false, outcome.cause);
    if (outcome.kind === 'error') {
      timings = outcome.timings;
      throw new EngineFailed(outcome.error.message, outcome.error.input, outcome.error.stack ?? outcome.error.message);
    }
    const { result } = outcome;
    timings = result.timings;
    engine = undefined;

    const rows = await stageRow('store', 95);
    if (!rows.length) throw new Lost();
    if (rows[0]!.cancel_requested) throw new Cancelled();
    const t0 = performance.now();
    const stored = await storeResults(db, { scan, workerId, flat: { devices: result.devices }, findings: result.findings, overlaps: result.overlaps, ruleErrors: result.ruleErrors, timings });
    // A cancel that came in after the check above makes the store refuse; it is still a cancel.
    if (stored === null) throw (await cancelRequested(db, scan.id)) ? new Cancelled() : new Lost();
    timings.store = Math.round(performance.now() - t0);
    await db.sequelize.query('UPDATE scans SET timings = :timings WHERE id = :id', { replacements: { id: scan.id, timings: JSON.stringify(timings) } });
    await recordAudit(db, {
      teamId: design.teamId,
      actor: null,
      action: 'scan-finished',
      target: design.name,
      details: { scanId: scan.id, revision: scan.revisionNumber, proposals: stored, ruleErrors: result.ruleErrors.length },
    }).catch((err: unknown) => log('audit failed', err));
    if (stored > 0 && deps.mailer && deps.publicUrl) {
      await notifyReviewers(db, deps.mailer, { teamId: design.teamId, designId: design.id, designName: design.name, revision: scan.revisionNumber, count: stored, startedBy: scan.startedBy, publicUrl: deps.publicUrl }, log);
    }
    return 'done';
  } catch (err) {
    if (err instanceof Lost) return 'lost';
    if (err instanceof Cancelled) {
      await db.sequelize.query(
        `UPDATE scans SET status = 'cancelled', stage = 'cancelled', finished_at = now(), timings = :timings, updated_at = now() WHERE id = :id AND worker = :worker AND status = 'running'`,
        { replacements: { ...mine, timings: JSON.stringify(timings) } },
      );
      return 'cancelled';
    }
    // Engine errors are deterministic: running again would fail the same way, so the scan fails now.
    if (err instanceof EngineFailed) {
      if (!err.quiet) log(`scan ${scan.id} failed`, err.detail ?? err);
    } else if (!(err instanceof InputError)) log(`scan ${scan.id} failed`, err);
    const message = err instanceof Error ? err.message : String(err);
    await db.sequelize.query(
      `UPDATE scans SET status = 'failed', stage = 'failed', finished_at = now(), error = :error, timings = :timings, updated_at = now() WHERE id = :id AND worker = :worker AND status = 'running'`,
      { replacements: { ...mine, error: message.slice(0, 2000), timings: JSON.stringify(timings) } },
    );
    return 'failed';
  } finally {
    clearInterval(beat);
    clearInterval(poll);
    engine?.stop();
  }
}

async function cancelRequested(db: Db, id: string): Promise<boolean> {
  const rows = await db.sequelize.query<{ cancel_requested: boolean }>(`SELECT cancel_requested FROM scans WHERE id = :id`, { replacements: { id }, type: QueryTypes.SELECT });
  return rows[0]?.cancel_requested ?? false;
}
