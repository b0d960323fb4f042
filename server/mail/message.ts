/**
 * Reading a captured single-part text e-mail (what the mailer sends): headers, subject and body,
 * decoding quoted-printable, base64 and RFC 2047 encoded words.
 */

export interface CapturedMessage {
  from: string;
  to: string;
  subject: string;
  text: string;
  teamId: string | null;
  headers: Map<string, string>;
}

export function readMessage(raw: string): CapturedMessage {
  const split = raw.search(/\r?\n\r?\n/);
  const head = split < 0 ? raw : raw.slice(0, split);
  const body = split < 0 ? '' : raw.slice(split).replace(/^\r?\n\r?\n/, '');
  const headers = new Map<string, string>();
  for (const line of head.replace(/\r?\n[ \t]+/g, ' ').split(/\r?\n/)) {
    const colon = line.indexOf(':');
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  const encoding = (headers.get('content-transfer-encoding') ?? '7bit').toLowerCase();
  return {
    from: decodeWords(headers.get('from') ?? ''),
    to: decodeWords(headers.get('to') ?? ''),
    subject: decodeWords(headers.get('subject') ?? ''),
    text: decodeBody(body, encoding).replace(/\r\n/g, '\n').trimEnd(),
    teamId: headers.get('x-runnel-team') ?? null,
    headers,
  };
}

function decodeBody(body: string, encoding: string): string {
  if (encoding === 'base64') return Buffer.from(body.replace(/\s+/g, ''), 'base64').toString('utf8');
  if (encoding === 'quoted-printable') return decodeQuotedPrintable(body);
  return body;
}

function decodeQuotedPrintable(text: string): string {
  const soft = text.replace(/=\r?\n/g, '');
  const bytes: number[] = [];
  for (let i = 0; i < soft.length; i++) {
    const hex = soft.slice(i + 1, i + 3);
    if (soft[i] === '=' && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else {
      bytes.push(...Buffer.from(soft[i], 'utf8'));
    }
  }
  return Buffer.from(bytes).toString('utf8');
}

/** RFC 2047: =?charset?Q|B?text?= (UTF-8 only, which is what nodemailer writes). */
function decodeWords(value: string): string {
  return value
    .replace(/\?=\s+=\?/g, '?==?')
    .replace(/=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g, (_m, _charset: string, mode: string, data: string) =>
      mode.toUpperCase() === 'B' ? Buffer.from(data, 'base64').toString('utf8') : decodeQuotedPrintable(data.replace(/_/g, ' ')),
    );
}
