// The scan queue on pg-boss (its own schema `pgboss` in the application database). The API only
// sends; workers (server/jobs/worker.ts) fetch. Started lazily so an API that never starts a scan
// never opens the queue's connections.
import PgBoss from 'pg-boss';

/** The queue's name; TRIMWIRE_SCAN_QUEUE overrides it so test runs sharing one database keep their jobs apart. */
export const scanQueueName = (): string => process.env.TRIMWIRE_SCAN_QUEUE || 'trimwire-scan';
export const PGBOSS_SCHEMA = 'pgboss';
/** A job whose worker stopped answering is handed out again up to this many times by pg-boss. */
export const SCAN_RETRY_LIMIT = 2;
/** pg-boss's own backstop: an active job older than this is expired and retried. */
export const SCAN_EXPIRE_SECONDS = 15 * 60;

export type ScanQueue = {
  send: (scanId: string) => Promise<string | null>;
  close: () => Promise<void>;
};

export type BossOptions = { databaseUrl: string; max?: number; supervise?: boolean; log?: (msg: string, err: unknown) => void };

export function newBoss({ databaseUrl, max = 2, supervise = false, log }: BossOptions): PgBoss {
  const boss = new PgBoss({ connectionString: databaseUrl, schema: PGBOSS_SCHEMA, max, supervise, schedule: false, maintenanceIntervalSeconds: 30 });
  // An 'error' event without a listener would crash the process; a lost connection is logged.
  boss.on('error', (err) => (log ?? ((m, e) => console.error(`[trimwire] ${m}:`, e)))('job queue error', err));
  return boss;
}

export async function ensureScanQueue(boss: PgBoss): Promise<void> {
  const name = scanQueueName();
  if (await boss.getQueue(name)) return;
  await boss.createQueue(name, { name, retryLimit: SCAN_RETRY_LIMIT, retryDelay: 2, expireInSeconds: SCAN_EXPIRE_SECONDS });
}

export async function sendScan(boss: PgBoss, scanId: string): Promise<string | null> {
  return boss.send(scanQueueName(), { scanId }, { retryLimit: SCAN_RETRY_LIMIT, retryDelay: 2, expireInSeconds: SCAN_EXPIRE_SECONDS });
}

/** A sender that starts pg-boss on first use. */
export function createScanQueue(databaseUrl: string, log?: (msg: string, err: unknown) => void): ScanQueue {
  let started: Promise<PgBoss> | undefined;
  const start = () =>
    (started ??= (async () => {
      const boss = newBoss({ databaseUrl, log });
      await boss.start();
      await ensureScanQueue(boss);
      return boss;
    })().catch((err: unknown) => {
      started = undefined;
      throw err;
    }));
  return {
    send: async (scanId) => sendScan(await start(), scanId),
    close: async () => {
      if (!started) return;
      const boss = await started.catch(() => undefined);
      started = undefined;
      if (boss) await boss.stop({ graceful: false, close: true, wait: true });
    },
  };
}
