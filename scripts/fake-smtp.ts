// Runs the local fake SMTP server (FAKE_SMTP_PORT, default 2525) storing mail in DATABASE_URL's
// mail_outbox table. Started in the background by start.sh and test.sh.
import { startFakeSmtp } from '@/server/mail/fake-smtp';
import { loadEnv } from '@/server/env';

async function main(): Promise<void> {
  const env = loadEnv();
  const port = Number(process.env.FAKE_SMTP_PORT ?? 2525);
  const smtp = await startFakeSmtp({ databaseUrl: env.DATABASE_URL, port, host: '127.0.0.1' });
  console.log(`Fake SMTP listening on 127.0.0.1:${smtp.port}, storing mail in ${new URL(env.DATABASE_URL).pathname.slice(1)}`);
  const stop = () => void smtp.close().then(() => process.exit(0));
  process.on('SIGTERM', stop);
  process.on('SIGINT', stop);
}

main().catch((err: unknown) => {
  console.error('Fake SMTP could not start:', err);
  process.exit(1);
});
