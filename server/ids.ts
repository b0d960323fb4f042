/** Ids in URLs: every table key is a UUID; anything else in an id position names nothing (404, not a database error). */
import { ApiError } from './errors';

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: string): boolean {
  return UUID.test(value);
}

/** `raw` (a route parameter) as a UUID, or 404 with `notFound` as the message. */
export function uuidParam(raw: unknown, notFound: string): string {
  const value = String(raw);
  if (!isUuid(value)) throw new ApiError('not-found', notFound);
  return value;
}
