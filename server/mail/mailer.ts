// Sends mail through nodemailer to SMTP_URL. Each message names the teams it concerns in a header
// so the local fake SMTP server can show it in those teams' outbox.
import nodemailer from 'nodemailer';

export const TEAM_HEADER = 'X-Trimwire-Team';

export type OutgoingMail = {
  to: string;
  subject: string;
  text: string;
  html: string;
  /** Teams the message concerns (the outbox shows it to their admins). */
  teamIds: string[];
};

export type Mailer = {
  send: (mail: OutgoingMail) => Promise<void>;
  close: () => void;
};

export function createSmtpMailer(smtpUrl: string, from: string): Mailer {
  const transport = nodemailer.createTransport(smtpUrl);
  return {
    async send(mail) {
      await transport.sendMail({
        from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        html: mail.html,
        headers: mail.teamIds.length ? { [TEAM_HEADER]: mail.teamIds.join(', ') } : {},
      });
    },
    close: () => transport.close(),
  };
}
