// A local fake SMTP server for development and tests: accepts every message on 127.0.0.1 and
// stores it in the mail_outbox table (nothing leaves the machine). Admins read it on the outbox.
import { simpleParser, type AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';
import pg from 'pg';
import { TEAM_HEADER } from '@/server/mail/mailer';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const MAX_MESSAGE_BYTES = 2 * 1024 * 1024;

export type FakeSmtp = { port: number; close: () => Promise<void> };

function addressText(a: AddressObject | AddressObject[] | undefined): string {
  if (!a) return '';
  return (Array.isArray(a) ? a : [a]).map((x) => x.text).join(', ');
}

export async function startFakeSmtp(opts: { databaseUrl: string; port?: number; host?: string }): Promise<FakeSmtp> {
  const pool = new pg.Pool({ connectionString: opts.databaseUrl, max: 2 });
  pool.on('error', (err) => console.error('[fake-smtp] database pool error:', err.message));
  const server = new SMTPServer({
    // Plain local SMTP: no TLS to negotiate, no login to give.
    disabledCommands: ['STARTTLS', 'AUTH'],
    authOptional: true,
    size: MAX_MESSAGE_BYTES,
    banner: 'Trimwire local mail catcher',
    logger: false,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then(async (mail) => {
          const header = mail.headers.get(TEAM_HEADER.toLowerCase());
          const teamIds = String(header ?? '')
            .split(',')
            .map((s) => s.trim())
            .filter((s) => UUID.test(s));
          const to = addressText(mail.to) || session.envelope.rcptTo.map((r) => r.address).join(', ');
          const from = addressText(mail.from) || (session.envelope.mailFrom ? session.envelope.mailFrom.address : '');
          // Stored before the 250 reply, so a sender that got "sent" can read it at once.
          await pool.query(
            'INSERT INTO mail_outbox (team_ids, to_address, from_address, subject, text, html) VALUES ($1, $2, $3, $4, $5, $6)',
            [teamIds, to, from, mail.subject ?? '', mail.text ?? '', typeof mail.html === 'string' ? mail.html : null],
          );
        })
        .then(() => callback())
        .catch((err: Error) => {
          console.error('[fake-smtp] could not store a message:', err.message);
          callback(Object.assign(new Error('Message not stored'), { responseCode: 451 }));
        });
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, opts.host ?? '127.0.0.1', () => resolve());
  });
  server.on('error', (err) => console.error('[fake-smtp] server error:', err.message));
  const address = server.server.address();
  const port = typeof address === 'object' && address ? address.port : (opts.port ?? 0);
  return {
    port,
    close: async () => {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await pool.end();
    },
  };
}
