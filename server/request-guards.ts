/**
 * Checks every /api request passes before any route sees it, so odd input is a clear 4xx naming the
 * field instead of a database error (500):
 * - a body must be JSON (or multipart on the upload routes, which check that themselves): 415;
 *   PUT and PATCH must carry one;
 * - no string or key of a JSON body may hold a NUL character (PostgreSQL text cannot) or a lone
 *   UTF-16 surrogate (not Unicode; jsonb refuses it), and nesting stops at MAX_JSON_DEPTH: 400 with
 *   the path of the first offending field.
 */
import type { RequestHandler } from 'express';
import { ApiError } from './errors';

/** No request of ours nests deeper; a network document is about 6 levels. */
export const MAX_JSON_DEPTH = 64;
const BODY_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** 415 for a body that is neither JSON nor multipart; PUT and PATCH need a JSON body. */
export const requireJsonOrMultipart: RequestHandler = (req, _res, next) => {
  if (!BODY_METHODS.has(req.method)) return next();
  const hasBody = req.headers['transfer-encoding'] !== undefined || Number(req.headers['content-length'] ?? 0) > 0;
  if (hasBody) {
    if (req.is(['application/json', 'multipart/form-data'])) return next();
    const sent = req.headers['content-type'] ?? 'no Content-Type';
    return next(new ApiError('unsupported-type', `Send the request body as application/json (got ${sent})`));
  }
  if (req.method === 'PUT' || req.method === 'PATCH') {
    return next(new ApiError('unsupported-type', `${req.method} needs a JSON body with Content-Type: application/json`));
  }
  next();
};

/** What is wrong with a string, or null. */
export function textProblem(value: string): string | null {
  if (value.includes('\u0000')) return 'must not contain a NUL character (\\u0000)';
  if (LONE_SURROGATE.test(value)) return 'is not valid Unicode text (it holds a lone UTF-16 surrogate)';
  return null;
}

interface Frame {
  value: unknown;
  key: string;
  parent: Frame | null;
  depth: number;
}

function pathOf(frame: Frame): string {
  const keys: string[] = [];
  // The NUL is what is being replaced: it would end the text in a log line.
  // eslint-disable-next-line no-control-regex
  for (let f: Frame | null = frame; f && f.parent; f = f.parent) keys.unshift(f.key.replace(/[\u0000\uD800-\uDFFF]/g, '?'));
  const shown = keys.length > 12 ? [...keys.slice(0, 6), '…', ...keys.slice(-3)] : keys;
  return shown.join('.') || '(body)';
}

/** The first problem in a parsed JSON value, walked without recursion: `{ path, message }` or null. */
export function jsonProblem(root: unknown, maxDepth = MAX_JSON_DEPTH): { path: string; message: string } | null {
  const stack: Frame[] = [{ value: root, key: '', parent: null, depth: 0 }];
  while (stack.length) {
    const frame = stack.pop()!;
    const { value } = frame;
    if (typeof value === 'string') {
      const problem = textProblem(value);
      if (problem) return { path: pathOf(frame), message: problem };
      continue;
    }
    if (value === null || typeof value !== 'object') continue;
    if (frame.depth >= maxDepth) return { path: pathOf(frame), message: `is nested more than ${maxDepth} levels deep` };
    const depth = frame.depth + 1;
    if (Array.isArray(value)) {
      for (let i = value.length - 1; i >= 0; i--) stack.push({ value: value[i], key: String(i), parent: frame, depth });
      continue;
    }
    const keys = Object.keys(value);
    for (let i = keys.length - 1; i >= 0; i--) {
      const key = keys[i];
      const child: Frame = { value: (value as Record<string, unknown>)[key], key, parent: frame, depth };
      const keyProblem = textProblem(key);
      if (keyProblem) return { path: pathOf(child), message: `(a key) ${keyProblem}` };
      stack.push(child);
    }
  }
  return null;
}

/** 400 naming the first field with a NUL, a lone surrogate or too deep a nesting (body and query). */
export const checkJsonText: RequestHandler = (req, _res, next) => {
  for (const [where, value] of [
    ['body', req.body],
    ['query', req.query],
  ] as const) {
    const problem = jsonProblem(value);
    if (problem) {
      return next(new ApiError('validation', `Invalid request ${where}: ${problem.path} ${problem.message}`, { fields: [problem] }));
    }
  }
  next();
};
