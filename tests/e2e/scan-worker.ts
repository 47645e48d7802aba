// Runs the scan worker for end-to-end tests as its own process (`tsx server/jobs/worker.ts`, the
// same entry the start script runs), in its own process group so stop() ends it and its children.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

const ROOT = path.resolve(__dirname, '../..');

export type ScanWorker = { process: ChildProcess; output: () => string; stop: () => Promise<void> };

export async function startScanWorker(env: Record<string, string>): Promise<ScanWorker> {
  let output = '';
  const child = spawn(path.join(ROOT, 'node_modules/.bin/tsx'), ['server/jobs/worker.ts'], {
    cwd: ROOT,
    env: { ...process.env, ...env },
    detached: true,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout?.on('data', (b: Buffer) => (output += b.toString()));
  child.stderr?.on('data', (b: Buffer) => (output += b.toString()));
  // Ready once it says it is waiting for scans; a worker that exits first is a failed start.
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`scan worker did not start within 60 s:\n${output}`)), 60_000);
    const check = () => {
      if (/waiting for scans/.test(output)) {
        clearTimeout(timer);
        resolve();
      }
    };
    child.stdout?.on('data', check);
    child.once('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`scan worker exited with ${code} before it was ready:\n${output}`));
    });
  });
  return {
    process: child,
    output: () => output,
    stop: async () => {
      if (child.exitCode !== null || child.pid === undefined) return;
      const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
      process.kill(-child.pid, 'SIGTERM');
      const timer = setTimeout(() => child.pid !== undefined && process.kill(-child.pid, 'SIGKILL'), 15_000);
      await exited;
      clearTimeout(timer);
    },
  };
}
