/**
 * Sending mail through nodemailer: to the configured SMTP server, or to the local sink.
 */
import nodemailer from 'nodemailer';
import type { SmtpConfig } from '../config';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  teamId?: string;
}
export interface Mailer {
  send(mail: OutgoingMail): Promise<void>;
  close(): void;
}

export function createMailer(smtp: SmtpConfig, from: string, { secure = false } = {}): Mailer {
  const transport = nodemailer.createTransport({
    host: smtp.host,
    port: smtp.port,
    secure: secure || smtp.port === 465,
    ignoreTLS: smtp.host === '127.0.0.1' && !smtp.user,
    auth: smtp.user ? { user: smtp.user, pass: smtp.pass ?? '' } : undefined,
  });
  return {
    async send(mail) {
      await transport.sendMail({
        from,
        to: mail.to,
        subject: mail.subject,
        text: mail.text,
        headers: mail.teamId ? { 'X-Runnel-Team': mail.teamId } : undefined,
      });
    },
    close: () => transport.close(),
  };
}
