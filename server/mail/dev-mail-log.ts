/**
 * Development only (no SMTP_HOST, NODE_ENV not production): mail that no team's Outbox lists (a
 * sign-up confirmation, the note to an address's owner) is also written to the server log with its
 * links, so whoever runs the server can finish a sign-up. Never in production, where such a link
 * is a credential and the log is shared; app.ts decides, this file only wraps the mailer.
 */
import type { Logger } from '../logging';
import type { Mailer } from './mailer';

export function logTeamlessMail(mailer: Mailer, logger: Logger): Mailer {
  return {
    async send(mail) {
      // Logged before sending: by the time the mail is in the outbox, its line is in the log.
      if (!mail.teamId) {
        const links = mail.text.match(/https?:\/\/\S+/g) ?? [];
        logger.info({ devMail: { to: mail.to, subject: mail.subject } }, `Development mail to ${mail.to}: "${mail.subject}" ${links.join(' ')}`.trim());
      }
      await mailer.send(mail);
    },
    close: () => mailer.close(),
  };
}
