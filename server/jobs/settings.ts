// Worker and sweeper settings from the environment (separate from the API's Env so the API never
// needs them). TRIMWIRE_SCAN_QUEUE names the pg-boss queue (queue.ts). TRIMWIRE_SCAN_STAGE_DELAY_MS is a test knob: it makes
// the engine thread block that long at the start of every stage, as a long stage would, so a test
// can watch heartbeat, progress and cancel or kill a worker mid-scan; production ignores it.
import { z } from 'zod';

const Schema = z.object({
  NODE_ENV: z.string().default('development'),
  TRIMWIRE_SCAN_STAGE_DELAY_MS: z.coerce.number().int().min(0).max(60_000).default(0),
  /** A running scan whose heartbeat is older than this is taken to have lost its worker. */
  TRIMWIRE_SCAN_HEARTBEAT_TIMEOUT_S: z.coerce.number().min(1).default(120),
  /** How often a worker writes the heartbeat of the scan it runs. */
  TRIMWIRE_SCAN_HEARTBEAT_MS: z.coerce.number().int().min(100).default(5_000),
  /** How often a worker looks for scans whose worker died. */
  TRIMWIRE_SCAN_SWEEP_MS: z.coerce.number().int().min(100).default(15_000),
  /** Times a scan may be started before a lost worker fails it. */
  TRIMWIRE_SCAN_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(10).default(3),
  /** How often a worker looks at the cancel flag of the scan it runs (the engine thread is stopped at once). */
  TRIMWIRE_SCAN_CANCEL_POLL_MS: z.coerce.number().int().min(100).default(1_000),
  /** Heap limit of a scan's engine thread; a scan that needs more fails instead of taking the worker down. */
  TRIMWIRE_SCAN_THREAD_MEMORY_MB: z.coerce.number().int().min(64).default(4_096),
  /** Scans one worker process runs at once. */
  TRIMWIRE_WORKER_CONCURRENCY: z.coerce.number().int().min(1).max(8).default(1),
});

export type ScanSettings = {
  stageDelayMs: number;
  heartbeatTimeoutS: number;
  heartbeatMs: number;
  sweepMs: number;
  maxAttempts: number;
  concurrency: number;
  cancelPollMs: number;
  threadMemoryMb: number;
};

export function loadScanSettings(source: Record<string, string | undefined> = process.env): ScanSettings {
  const cleaned = Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined && v !== ''));
  const e = Schema.parse(cleaned);
  return {
    stageDelayMs: e.NODE_ENV === 'production' ? 0 : e.TRIMWIRE_SCAN_STAGE_DELAY_MS,
    heartbeatTimeoutS: e.TRIMWIRE_SCAN_HEARTBEAT_TIMEOUT_S,
    heartbeatMs: e.TRIMWIRE_SCAN_HEARTBEAT_MS,
    sweepMs: e.TRIMWIRE_SCAN_SWEEP_MS,
    maxAttempts: e.TRIMWIRE_SCAN_MAX_ATTEMPTS,
    concurrency: e.TRIMWIRE_WORKER_CONCURRENCY,
    cancelPollMs: e.TRIMWIRE_SCAN_CANCEL_POLL_MS,
    threadMemoryMb: e.TRIMWIRE_SCAN_THREAD_MEMORY_MB,
  };
}
