// Entry point: `tsx server/index.ts` serves the app and API, and shuts down cleanly on SIGTERM or
// SIGINT (finishing requests in flight, then closing the database).
import { startServer } from '@/server/serve';
import { EnvError } from '@/server/env';

export { startServer } from '@/server/serve';

async function main(): Promise<void> {
  const server = await startServer();
  console.log(`Trimwire is serving ${server.url} (${server.env.NODE_ENV})`);
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal} received, shutting down`);
    // Requests that never finish must not keep the process alive forever.
    setTimeout(() => process.exit(1), 10_000).unref();
    server.close().then(
      () => process.exit(0),
      (err: unknown) => {
        console.error(err);
        process.exit(1);
      },
    );
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
}

if (require.main === module) {
  main().catch((err: unknown) => {
    if (err instanceof EnvError) console.error(err.message);
    else console.error('Trimwire could not start:', err);
    process.exit(1);
  });
}
