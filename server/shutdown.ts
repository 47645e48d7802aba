// Graceful shutdown shared by the API server and the scan worker: on SIGTERM or SIGINT, run the
// process's own close once, then exit; a close that never finishes is cut off after a grace period.

export function exitOnSignals(what: string, close: () => Promise<unknown>, graceMs: number): void {
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal} received, ${what} stopping`);
    setTimeout(() => process.exit(1), graceMs).unref();
    close().then(
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
