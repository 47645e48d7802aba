// Helpers for the review-workflow API tests: upload a demo deck as a client, wait for a scan to
// settle, and an in-process scan worker on the test database.
import fs from 'node:fs';
import path from 'node:path';
import { expect } from 'vitest';
import type { Client } from './harness';
import { TEST_DATABASE_URL } from './harness';
import { startWorker, type RunningWorker } from '@/server/jobs/worker';

// Jobs of this test run go to a queue of their own: other runs (and their workers) may share the
// test database, and must neither take these scans nor hand theirs to this run's workers.
process.env.TRIMWIRE_SCAN_QUEUE ??= `trimwire-scan-test-${process.pid}-${Date.now()}`;

export const DEMO_DIR = path.resolve(__dirname, '../../../server/db/demo');
export const demoDeck = (file: string) => fs.readFileSync(path.join(DEMO_DIR, file));

export async function upload(c: Client, file: string, fields: Record<string, string> = {}, content?: Buffer | string) {
  let req = c.agent.post('/api/designs').set('X-CSRF-Token', c.csrf);
  for (const [k, v] of Object.entries({ name: file, ...fields })) req = req.field(k, v);
  return req.attach('file', content !== undefined ? Buffer.from(content) : demoDeck(file), file);
}

/** Polls GET /api/scans/:id until the scan leaves queued/running (or the deadline passes). */
export async function settle(c: Client, scanId: string, ms = 60_000) {
  const until = Date.now() + ms;
  for (;;) {
    const res = await c.agent.get(`/api/scans/${scanId}`).expect(200);
    if (!['queued', 'running'].includes(res.body.status)) return res.body;
    if (Date.now() > until) throw new Error(`scan ${scanId} still ${res.body.status} at ${res.body.stage}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

export async function inProcessWorker(settings: Parameters<typeof startWorker>[0]['settings'] = {}, smtpUrl?: string): Promise<RunningWorker> {
  return startWorker({
    databaseUrl: TEST_DATABASE_URL,
    smtpUrl,
    publicUrl: 'http://127.0.0.1:8080',
    settings: { stageDelayMs: 0, heartbeatMs: 500, heartbeatTimeoutS: 120, sweepMs: 60_000, maxAttempts: 3, concurrency: 1, ...settings },
    log: () => undefined,
  });
}

export function expectError(res: { status: number; body: unknown }, status: number, code: string) {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
  expect((res.body as { error: { code: string } }).error.code).toBe(code);
}

/** Mail is sent after the scan row is done and lands through SMTP, so wait for it a little. */
export async function waitForMail<T extends { subject: string }>(read: () => Promise<T[]>, match: (m: T) => boolean, ms = 10_000): Promise<T[]> {
  const until = Date.now() + ms;
  for (;;) {
    const mails = await read();
    if (mails.some(match) || Date.now() > until) return mails;
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** Polls `read` until `ok` holds, failing with what it last read after `ms` (poll every `everyMs`). */
export async function until<T>(read: () => Promise<T>, ok: (v: T) => boolean, ms: number, what: string, everyMs = 50): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await read();
    if (ok(v)) return v;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}: ${JSON.stringify(v)}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}
