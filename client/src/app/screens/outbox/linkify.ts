/** A piece of mail text: plain, a link inside the app (routerLink), or an outside link. */
export type TextPart = { kind: 'text'; text: string } | { kind: 'app-link'; text: string; path: string } | { kind: 'link'; text: string; href: string };

const URL_PATTERN = /https?:\/\/[^\s<>"')\]]+/g;
const APP_PATHS = /^\/(join|sign-in|sign-up|projects)(\/|$)/;

/**
 * Splits plain text into text and links without producing HTML, so nothing in a mail can inject markup.
 * Links to the app's own pages (e.g. /join/:token) become in-app links whatever host the mail names.
 *
 * @example
 * linkify('Open https://x.test/join/abc now') // → text, app-link '/join/abc', text
 */
export function linkify(text: string): TextPart[] {
  const parts: TextPart[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    const start = match.index ?? 0;
    if (start > last) parts.push({ kind: 'text', text: text.slice(last, start) });
    const raw = match[0].replace(/[.,;:!?]+$/, '');
    parts.push(toLink(raw));
    last = start + raw.length;
  }
  if (last < text.length) parts.push({ kind: 'text', text: text.slice(last) });
  return parts;
}

function toLink(raw: string): TextPart {
  try {
    const url = new URL(raw);
    if (APP_PATHS.test(url.pathname)) return { kind: 'app-link', text: raw, path: url.pathname };
    return { kind: 'link', text: raw, href: url.href };
  } catch {
    return { kind: 'text', text: raw };
  }
}
