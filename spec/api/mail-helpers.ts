/** Reading what the app mailed (the capture sink stores each message in `outbox`). */
import { asc, ilike } from 'drizzle-orm';
import { outbox } from '../../drizzle/schema';
import type { TestApp } from './test-app';

export interface SentMail {
  to: string;
  subject: string;
  text: string;
}

export async function mailsTo(t: TestApp, address: string): Promise<SentMail[]> {
  return t.db
    .select({ to: outbox.to, subject: outbox.subject, text: outbox.text })
    .from(outbox)
    .where(ilike(outbox.to, `%${address}%`))
    .orderBy(asc(outbox.id));
}

/** Waits (bounded) until `count` mails to `address` have arrived, and returns the newest. */
export async function mailTo(t: TestApp, address: string, count = 1): Promise<SentMail> {
  for (let i = 0; i < 200; i++) {
    const mails = await mailsTo(t, address);
    if (mails.length >= count) return mails[mails.length - 1];
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error(`no mail #${count} to ${address} within 5 s`);
}

/** The sign-up token in a confirmation mail: the fragment of its `/sign-up/confirm#…` link. */
export function confirmTokenIn(mail: SentMail): string {
  const link = /https?:\/\/\S+\/sign-up\/confirm#\S+/.exec(mail.text);
  if (!link) throw new Error(`no confirmation link in: ${mail.text}`);
  return new URL(link[0]).hash.slice(1);
}
