// Runs one scan: claims the row (queued, or running with a dead heartbeat), then parse → flatten →
// extract → each rule (with its proofs, margins and savings) → store, writing stage and percent
// as it goes and checking the cancel flag between stages. A heartbeat timer keeps the row fresh
// while the worker lives; the sweeper (sweeper.ts) recovers scans whose worker died.
import { QueryTypes } from 'sequelize';
import { flatten, InputError, readDesign } from '@/optimizer';
import { extractLogic } from '@/optimizer/extract';
import { parseExpr } from '@/optimizer/logic/expr-parse';
import type { Minimiser } from '@/optimizer/logic/minimiser';
import { RULES } from '@/optimizer/rules';
import { overlapGraph, type RuleErrorRecord } from '@/optimizer/rules/run-rules';
import { scan as scanRules, type ScannedFinding } from '@/optimizer/rules/scan';
import type { Assumption as EngineAssumption } from '@/optimizer/rules/types';
import type { Db } from '@/server/db';
import type { Scan } from '@/server/db/models';
import type { Mailer } from '@/server/mail/mailer';
import { recordAudit } from '@/server/features/audit/service';
import { notifyReviewers } from '@/server/features/review/mail';
import { storeResults } from '@/server/jobs/store-results';

export type RunScanDeps = {
  db: Db;
  workerId: string;
  minimiser?: Minimiser;
  mailer?: Mailer;
  publicUrl?: string;
  stageDelayMs?: number;
  heartbeatMs?: number;
  heartbeatTimeoutS: number;
  maxAttempts: number;
  log?: (msg: string, err: unknown) => void;
};

export type RunOutcome = 'skipped' | 'done' | 'failed' | 'cancelled' | 'lost';

class Cancelled extends Error {}
class Lost extends Error {}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

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
  const beat = setInterval(() => {
    db.sequelize
      .query(`UPDATE scans SET heartbeat_at = now() WHERE id = :id AND worker = :worker AND status = 'running'`, { replacements: mine })
      .catch((err: unknown) => log('heartbeat failed', err));
  }, deps.heartbeatMs ?? 5_000);
  const timings: Record<string, number> = {};

  /** Writes stage and percent, checks cancel and ownership, then runs the step and times it. */
  async function stage<T>(name: string, progress: number, step: () => T | Promise<T>): Promise<T> {
    const rows = await db.sequelize.query<{ cancel_requested: boolean }>(
      `UPDATE scans SET stage = :stage, progress = :progress, heartbeat_at = now(), updated_at = now()
       WHERE id = :id AND worker = :worker AND status = 'running' RETURNING cancel_requested`,
      { replacements: { ...mine, stage: name, progress }, type: QueryTypes.SELECT },
    );
    if (!rows.length) throw new Lost();
    if (rows[0]!.cancel_requested) throw new Cancelled();
    if (deps.stageDelayMs) await sleep(deps.stageDelayMs);
    const t0 = performance.now();
    const out = await step();
    timings[name] = Math.round(performance.now() - t0);
    return out;
  }

  try {
    const design = await db.models.Design.findByPk(scan.designId);
    const rev = await db.models.Revision.findByPk(scan.revisionId);
    if (!design || !rev) throw new InputError([{ severity: 'error', code: 'scan.missing', message: 'the design or revision was deleted' }]);
    const rules = scan.rules ?? Object.keys(RULES);
    const unknown = rules.filter((r) => !Object.prototype.hasOwnProperty.call(RULES, r));
    if (unknown.length) throw InputError.at('rules.unknown', `unknown rule id(s): ${unknown.join(', ')}`);
    const assumptionRows = await db.models.Assumption.findAll({ where: { designId: design.id, status: 'active' } });
    const assumptions: EngineAssumption[] = assumptionRows.map((a) => ({ id: a.id, text: a.expression, expr: parseExpr(a.expression, `assumption ${a.id}`) }));

    const parsed = await stage('parse', 5, () => readDesign(rev.source, { file: rev.fileName, format: rev.format }).design);
    const flat = await stage('flatten', 10, () => flatten(parsed));
    const view = await stage('extract', 20, () => extractLogic(flat));
    const findings: ScannedFinding[] = [];
    const ruleErrors: RuleErrorRecord[] = [];
    for (const [k, ruleId] of rules.entries()) {
      const r = await stage(`rule ${ruleId}`, 20 + Math.round((70 * k) / rules.length), () =>
        scanRules(flat, {
          view,
          enabled: [ruleId],
          assumptions,
          minimiser: deps.minimiser,
          targetFamily: design.family,
          clockPeriod: design.clockPeriodNs ? design.clockPeriodNs * 1e-9 : undefined,
        }),
      );
      findings.push(...r.findings);
      ruleErrors.push(...r.ruleErrors);
    }
    const overlaps = overlapGraph(findings.map((f) => ({ ...f.finding, proposals: f.proposals.map((p) => p.proposal) })));
    const stored = await stage('store', 95, () => storeResults(db, { scan, workerId, flat, findings, overlaps, ruleErrors, timings }));
    if (stored === null) throw new Lost();
    await db.sequelize.query('UPDATE scans SET timings = :timings WHERE id = :id', { replacements: { id: scan.id, timings: JSON.stringify(timings) } });
    await recordAudit(db, {
      teamId: design.teamId,
      actor: null,
      action: 'scan-finished',
      target: design.name,
      details: { scanId: scan.id, revision: scan.revisionNumber, proposals: stored, ruleErrors: ruleErrors.length },
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
    if (!(err instanceof InputError)) log(`scan ${scan.id} failed`, err);
    const message = err instanceof Error ? err.message : String(err);
    await db.sequelize.query(
      `UPDATE scans SET status = 'failed', stage = 'failed', finished_at = now(), error = :error, timings = :timings, updated_at = now() WHERE id = :id AND worker = :worker AND status = 'running'`,
      { replacements: { ...mine, error: message.slice(0, 2000), timings: JSON.stringify(timings) } },
    );
    return 'failed';
  } finally {
    clearInterval(beat);
  }
}
