/**
 * The network document's schema check on the page's main thread. The CSP forbids eval, so zod is
 * told not to compile its checks before anything here runs. It lives here rather than in main.ts so
 * that zod (~450 kB) loads with the screens that parse documents, not in the first download
 * (importing even `config` from zod keeps every module zod re-exports in the initial chunks).
 * Main-thread code parses documents through this module; the Web Workers set the same flag themselves.
 */
import { config } from 'zod';
import { parseDocument as parseWithEngine, type DocumentParse } from '../../../../engine/validate';

config({ jitless: true });

/** engine/validate.ts parseDocument: migrate, check the schema and the physical bounds. */
export function parseDocument(input: unknown): DocumentParse {
  return parseWithEngine(input);
}
