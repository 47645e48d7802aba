// The scan worker: a separate process (`tsx server/jobs/worker.ts`, started by scripts/start.sh;
// several may run, on any machine that reaches DATABASE_URL). It takes scan jobs from pg-boss, runs
// each scan's engine work in a worker thread of its own (run-scan.ts) with minimise calls served by
// this process's Espresso pool, sweeps scans whose worker died, and shuts down cleanly on SIGTERM/SIGINT. startWorker() runs the same loop in-process for tests and the seed.
import os from 'node:os';
import crypto from 'node:crypto';
import type PgBoss from 'pg-boss';
import { createEspressoMinimiser, type EspressoMinimiser } from '@/optimizer/logic/espresso/espresso-minimiser';
import { createDb, type Db } from '@/server/db';
import { loadEnv, EnvError } from '@/server/env';
import { exitOnSignals } from '@/server/shutdown';
import { createSmtpMailer, type Mailer } from '@/server/mail/mailer';
import { ensureScanQueue, newBoss, scanQueueName, sendScan } from '@/server/jobs/queue';
import { EnginePool } from '@/server/jobs/engine-host';
import { runScan, type RunOutcome } from '@/server/jobs/run-scan';
import { loadScanSettings, type ScanSettings } from '@/server/jobs/settings';
import { sweepStaleScans } from '@/server/jobs/sweeper';

export type WorkerOptions = {
  databaseUrl: string;
  smtpUrl?: string;
  mailFrom?: string;
  publicUrl?: string;
  settings?: Partial<ScanSettings>;
  /** Another engine thread entry (tests only: one that misbehaves on purpose). */
  engineEntry?: string;
  /** Called after every job (tests wait on it). */
  onOutcome?: (scanId: string, outcome: RunOutcome) => void;
  log?: (msg: string, err: unknown) => void;
};

export type RunningWorker = { id: string; db: Db; stop: () => Promise<void>; sweep: () => Promise<void> };

export async function startWorker(opts: WorkerOptions): Promise<RunningWorker> {
  const settings: ScanSettings = { ...loadScanSettings(), ...opts.settings };
  const log = opts.log ?? ((m: string, e: unknown) => console.error(`[trimwire worker] ${m}:`, e));
  const id = `${os.hostname()}:${process.pid}:${crypto.randomBytes(3).toString('hex')}`;
  const db = createDb(opts.databaseUrl);
  const boss: PgBoss = newBoss({ databaseUrl: opts.databaseUrl, max: 2 + settings.concurrency, supervise: true, log });
  const minimiser: EspressoMinimiser = createEspressoMinimiser({ size: 1 });
  const engines = new EnginePool({ keep: settings.concurrency, memoryMb: settings.threadMemoryMb, minimiser, entry: opts.engineEntry });
  const mailer: Mailer | undefined = opts.smtpUrl ? createSmtpMailer(opts.smtpUrl, opts.mailFrom ?? 'Trimwire <no-reply@trimwire.test>') : undefined;
  await boss.start();
  await ensureScanQueue(boss);

  const sweep = async () => {
    await sweepStaleScans(db, { heartbeatTimeoutS: settings.heartbeatTimeoutS, maxAttempts: settings.maxAttempts, send: (scanId) => sendScan(boss, scanId) });
  };
  for (let k = 0; k < settings.concurrency; k++) {
    await boss.work<{ scanId: string }>(scanQueueName(), { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
      if (!job) return;
      const scanId = job.data?.scanId;
      if (typeof scanId !== 'string') return;
      const outcome = await runScan(
        { db, workerId: id, minimiser, mailer, publicUrl: opts.publicUrl, stageDelayMs: settings.stageDelayMs, heartbeatMs: settings.heartbeatMs, heartbeatTimeoutS: settings.heartbeatTimeoutS, maxAttempts: settings.maxAttempts,
          cancelPollMs: settings.cancelPollMs, engines, log },
        scanId,
      );
      opts.onOutcome?.(scanId, outcome);
    });
  }
  const sweeper = setInterval(() => void sweep().catch((err: unknown) => log('sweep failed', err)), settings.sweepMs);
  void sweep().catch((err: unknown) => log('sweep failed', err));

  let stopping: Promise<void> | undefined;
  return {
    id,
    db,
    sweep,
    stop: () =>
      (stopping ??= (async () => {
        clearInterval(sweeper);
        await boss.stop({ graceful: true, wait: true, timeout: 10_000 }).catch((err: unknown) => log('queue stop failed', err));
        engines.close();
        minimiser.close();
        mailer?.close();
        await db.close();
      })()),
  };
}

async function main(): Promise<void> {
  const env = loadEnv();
  const worker = await startWorker({ databaseUrl: env.DATABASE_URL, smtpUrl: env.SMTP_URL, mailFrom: env.MAIL_FROM, publicUrl: env.PUBLIC_URL });
  console.log(`Trimwire scan worker ${worker.id} is waiting for scans`);
  exitOnSignals('worker', () => worker.stop(), 15_000);
}

if (require.main === module) {
  main().catch((err: unknown) => {
    console.error(err instanceof EnvError ? err.message : err);
    process.exit(1);
  });
}
