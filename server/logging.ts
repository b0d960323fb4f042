/**
 * Structured logging (pino, one JSON object a line) and what may appear in it. Secrets never do:
 * request lines carry method, path (no query string, invitation tokens masked), status and time,
 * never headers, cookies or bodies; errors are serialised by `safeError`, which keeps the SQL text
 * of a failed query but drops its parameters (password hashes, whole documents) and the row values
 * a database puts in `detail`. The `redact` list is a second net for anything logged by hand.
 */
import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import pino, { type Logger } from 'pino';
import { pinoHttp, type HttpLogger } from 'pino-http';

export type { Logger };

/** Where log lines go: a function receiving each JSON line, false for silence, or stdout by default. */
export type LogDestination = ((line: string) => void) | false | undefined;

export const LOG_LEVELS = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'] as const;
export type LogLevel = (typeof LOG_LEVELS)[number];

/** Keys masked wherever they appear at the top level or one object down. */
const SECRET_KEYS = ['password', 'passwordHash', 'token', 'csrf', 'cookie', 'authorization', 'params', 'body', 'detail'];
export const REDACT_PATHS = [
  'req.headers.cookie',
  'req.headers.authorization',
  'req.headers["x-csrf-token"]',
  'res.headers["set-cookie"]',
  ...SECRET_KEYS,
  ...SECRET_KEYS.map((k) => `*.${k}`),
];
export const REDACTED = '[redacted]';

export function createLogger(destination: LogDestination, level: LogLevel = 'info'): Logger {
  const options: pino.LoggerOptions = {
    level,
    base: { pid: process.pid },
    redact: { paths: REDACT_PATHS, censor: REDACTED },
    serializers: { err: safeError },
  };
  if (destination === false) return pino({ ...options, enabled: false });
  if (destination) return pino(options, { write: (line: string) => destination(line.replace(/\n$/, '')) });
  return pino(options);
}

/** One line per finished request (pino-http) at info, error for 5xx; `req.log` carries the request id. */
export function requestLogger(logger: Logger): HttpLogger {
  return pinoHttp({
    logger,
    genReqId: () => randomUUID(),
    wrapSerializers: false,
    serializers: {
      req: (req: IncomingMessage & { id?: unknown; originalUrl?: string }) => ({
        id: req.id,
        method: req.method,
        path: safePath(req.originalUrl ?? req.url ?? ''),
      }),
      res: (res: ServerResponse) => ({ statusCode: res.statusCode }),
      err: safeError,
    },
    customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : 'info'),
    customSuccessMessage: (req, res) => `${req.method} ${safePath((req as { originalUrl?: string }).originalUrl ?? req.url ?? '')} ${res.statusCode}`,
    customErrorMessage: (req, res) => `${req.method} ${safePath((req as { originalUrl?: string }).originalUrl ?? req.url ?? '')} ${res.statusCode}`,
  });
}

/** The path without its query string, with invitation link tokens masked (a token is a credential). */
export function safePath(url: string): string {
  const path = url.split('?')[0];
  return path.replace(/(\/invitations\/)([^/]+)/g, (whole, prefix: string, id: string) =>
    /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id) ? whole : `${prefix}${REDACTED}`,
  );
}

/** Fields of a database error that name things (never the row's values). */
const DATABASE_FIELDS = ['code', 'severity', 'schema', 'table', 'column', 'constraint', 'routine'] as const;

/**
 * An error as it may be logged: type, message, stack, and for a failed query its SQL text (with
 * $1… placeholders) and SQLSTATE, never `params` (Drizzle puts them in the message too), `detail`
 * ("Failing row contains (…)") or `where`. Causes are followed three deep.
 */
export function safeError(err: unknown, depth = 0): Record<string, unknown> {
  if (!(err instanceof Error)) return { type: typeof err, message: REDACTED };
  const code = (err as { code?: unknown }).code;
  const message = scrubMessage(err.message, typeof code === 'string' ? code : undefined);
  const frames = (err.stack ?? '').split('\n').filter((line) => /^\s+at /.test(line));
  const out: Record<string, unknown> = { type: err.name, message, stack: [`${err.name}: ${message}`, ...frames].join('\n') };
  const query = (err as { query?: unknown }).query;
  if (typeof query === 'string') out['query'] = query;
  for (const field of DATABASE_FIELDS) {
    const value = (err as unknown as Record<string, unknown>)[field];
    if (typeof value === 'string' || typeof value === 'number') out[field] = value;
  }
  if (err.cause !== undefined && depth < 3) out['cause'] = safeError(err.cause, depth + 1);
  return out;
}

function scrubMessage(message: string, sqlstate: string | undefined): string {
  // Drizzle: "Failed query: <sql>\nparams: <every value>".
  let m = message.replace(/\nparams: [\s\S]*$/, `\nparams: ${REDACTED}`);
  // Data exceptions (SQLSTATE class 22) quote the offending value: `invalid input syntax for type uuid: "…"`.
  if (sqlstate?.startsWith('22')) m = m.replace(/: "[\s\S]*"$/, `: ${REDACTED}`);
  return m;
}
