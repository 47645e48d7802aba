// Worker settings from the environment: defaults, the engine thread's knobs, and the stage delay
// (a test knob) ignored in production.
import { describe, expect, it } from 'vitest';
import { loadScanSettings } from '@/server/jobs/settings';

describe('scan worker settings', () => {
  it('has defaults for every setting, the engine thread included', () => {
    expect(loadScanSettings({})).toEqual({
      stageDelayMs: 0,
      heartbeatTimeoutS: 120,
      heartbeatMs: 5_000,
      sweepMs: 15_000,
      maxAttempts: 3,
      concurrency: 1,
      cancelPollMs: 1_000,
      threadMemoryMb: 4_096,
    });
  });

  it('reads the engine thread knobs and ignores the stage delay in production', () => {
    const env = { TRIMWIRE_SCAN_CANCEL_POLL_MS: '250', TRIMWIRE_SCAN_THREAD_MEMORY_MB: '512', TRIMWIRE_SCAN_STAGE_DELAY_MS: '900' };
    expect(loadScanSettings(env)).toMatchObject({ cancelPollMs: 250, threadMemoryMb: 512, stageDelayMs: 900 });
    expect(loadScanSettings({ ...env, NODE_ENV: 'production' }).stageDelayMs).toBe(0);
  });

  it('refuses a thread heap under 64 MB and a cancel poll faster than 100 ms', () => {
    expect(() => loadScanSettings({ TRIMWIRE_SCAN_THREAD_MEMORY_MB: '16' })).toThrow();
    expect(() => loadScanSettings({ TRIMWIRE_SCAN_CANCEL_POLL_MS: '10' })).toThrow();
  });
});
