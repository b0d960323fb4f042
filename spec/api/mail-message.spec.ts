/** The sink's reader against what nodemailer really writes (its stream transport gives the raw message). */
import { expect } from 'chai';
import nodemailer, { type SendMailOptions } from 'nodemailer';
import { readMessage } from '../../server/mail/message';

async function raw(mail: SendMailOptions): Promise<string> {
  const transport = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'unix' });
  const info = await transport.sendMail({ from: 'Runnel <no-reply@runnel.test>', ...mail });
  return (info.message as Buffer).toString('utf8');
}

describe('captured mail reader', () => {
  it('reads a plain ASCII message', async () => {
    const m = readMessage(await raw({ to: 'a@example.test', subject: 'Hello', text: 'Line one\nLine two', headers: { 'X-Runnel-Team': 't-1' } }));
    expect(m).to.include({ to: 'a@example.test', subject: 'Hello', text: 'Line one\nLine two', teamId: 't-1' });
    expect(m.from).to.equal('Runnel <no-reply@runnel.test>');
  });

  it('decodes non-ASCII subjects and quoted-printable bodies', async () => {
    const text =
      'Tank bank “North” – 2 × 1.5 m³.\n' +
      'A long line that nodemailer will fold with soft line breaks because it is longer than seventy-six characters in all.';
    const m = readMessage(await raw({ to: 'b@example.test', subject: 'Einladung für Café – Runnel', text }));
    expect(m.subject).to.equal('Einladung für Café – Runnel');
    expect(m.text).to.equal(text);
  });

  it('decodes base64 bodies', async () => {
    const text = 'Ünïcödé everywhere: ∑ ∆ ≈ ✓ '.repeat(10).trim();
    const m = readMessage(await raw({ to: 'c@example.test', subject: 'x', text, textEncoding: 'base64' }));
    expect(m.text).to.equal(text);
  });
});
