/**
 * Errors as the API reports them (server/API.md "Errors"), and the one central error handler.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { z } from 'zod';
import type { Logger } from './logging';

export type ErrorCode =
  | 'validation'
  | 'unauthenticated'
  | 'forbidden'
  | 'csrf'
  | 'not-found'
  | 'conflict'
  | 'too-large'
  | 'unsupported-type'
  | 'rate-limited'
  | 'internal'
  | 'unavailable';

const STATUS: Record<ErrorCode, number> = {
  validation: 400,
  unauthenticated: 401,
  forbidden: 403,
  csrf: 403,
  'not-found': 404,
  conflict: 409,
  'too-large': 413,
  'unsupported-type': 415,
  'rate-limited': 429,
  internal: 500,
  unavailable: 503,
};

export interface FieldError {
  path: string;
  message: string;
  element?: string;
}

/** Thrown by handlers; `extra` is merged into the `error` object (e.g. `line`), `body` beside it (e.g. `current`). */
export class ApiError extends Error {
  readonly status: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly extra: { fields?: FieldError[]; line?: number; point?: number } = {},
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
    this.status = STATUS[code];
  }
}

/** "document.nodes.3.elevation_m" style path for a zod issue. */
export function issuePath(path: readonly PropertyKey[]): string {
  return path.map(String).join('.');
}

/** Parses `value` with `schema` or throws a 400 listing every field path. */
export function parseBody<T extends z.ZodType>(schema: T, value: unknown, message = 'Invalid request body'): z.output<T> {
  const parsed = schema.safeParse(value ?? {});
  if (parsed.success) return parsed.data;
  throw new ApiError('validation', message, {
    fields: parsed.error.issues.map((i) => ({ path: issuePath(i.path) || '(body)', message: i.message })),
  });
}

/** Unknown /api routes. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new ApiError('not-found', `No API route ${req.method} ${req.path}`));
};

/** Anything else nobody answered (a missing asset, a POST outside /api). */
export const notFoundHandler: RequestHandler = (req, _res, next) => {
  next(new ApiError('not-found', `Not found: ${req.method} ${req.path}`));
};

/** Maps any error to the API's error shape; logs unexpected ones with their stack, never sends it. */
export function errorHandler(logger: Logger): ErrorRequestHandler {
  return (err, req, res, _next) => {
    let apiError: ApiError;
    if (err instanceof ApiError) apiError = err;
    else if (isBodyParserError(err, 'entity.too.large')) apiError = new ApiError('too-large', 'Request body is too large');
    else if (isBodyParserError(err, 'entity.parse.failed')) apiError = new ApiError('validation', 'Request body is not valid JSON');
    else if (err instanceof URIError && (err as { status?: number }).status === 400) {
      // Express could not percent-decode a path parameter (e.g. /api/projects/%C0%AF).
      apiError = new ApiError('validation', 'The address holds malformed percent-encoding', {
        fields: [{ path: 'url', message: 'is not valid percent-encoded UTF-8' }],
      });
    } else if (databaseInputError(err)) {
      // A backstop: input the routes let through but the database refuses is the client's, not a crash.
      apiError = new ApiError('validation', databaseInputError(err)!);
    } else if (isClientError(err)) {
      apiError = new ApiError(err.status === 415 ? 'unsupported-type' : err.status === 413 ? 'too-large' : 'validation', err.message);
    } else {
      // The logger's `err` serializer (safeError in logging.ts) keeps the SQL text, never its parameters.
      (req.log ?? logger).error({ err }, 'unexpected error');
      apiError = new ApiError('internal', 'Something went wrong on the server; it has been logged.');
    }
    if (res.headersSent) return;
    res.status(apiError.status).json({ ...apiError.body, error: { code: apiError.code, message: apiError.message, ...apiError.extra } });
  };
}

/** An http-errors style 4xx meant for the client (body-parser's charset or encoding errors). */
function isClientError(err: unknown): err is { status: number; message: string } {
  if (typeof err !== 'object' || err === null || !('status' in err) || !('expose' in err)) return false;
  return err.expose === true && typeof err.status === 'number' && err.status >= 400 && err.status < 500 && 'message' in err;
}

/** PostgreSQL SQLSTATEs that mean "this input cannot be stored", with what to tell the client. */
const INPUT_SQLSTATES: Record<string, string> = {
  '22003': 'A number in the request is out of range',
  '22021': 'The request holds text that is not valid UTF-8',
  '22P05': 'The request holds text the database cannot store (a NUL character or a lone surrogate)',
  '22001': 'A text in the request is too long',
  '54000': 'A value in the request is too large to store',
};

function databaseInputError(err: unknown): string | null {
  for (let e: unknown = err, i = 0; e && typeof e === 'object' && i < 3; e = (e as { cause?: unknown }).cause, i++) {
    const code = (e as { code?: unknown }).code;
    if (typeof code === 'string' && INPUT_SQLSTATES[code]) return INPUT_SQLSTATES[code];
  }
  return null;
}

function isBodyParserError(err: unknown, type: string): boolean {
  return typeof err === 'object' && err !== null && 'type' in err && err.type === type;
}
