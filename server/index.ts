// Entry point: `tsx server/index.ts` serves the app and API, and shuts down cleanly on SIGTERM or
// SIGINT (finishing requests in flight, then closing the database).
import { startServer } from '@/server/serve';
import { EnvError } from '@/server/env';
import { exitOnSignals } from '@/server/shutdown';

export { startServer } from '@/server/serve';

async function main(): Promise<void> {
  const server = await startServer();
  console.log(`Trimwire is serving ${server.url} (${server.env.NODE_ENV})`);
  // Requests that never finish must not keep the process alive forever.
  exitOnSignals('server', () => server.close(), 10_000);
}

if (require.main === module) {
  main().catch((err: unknown) => {
    if (err instanceof EnvError) console.error(err.message);
    else console.error('Trimwire could not start:', err);
    process.exit(1);
  });
}
