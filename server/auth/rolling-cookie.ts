/**
 * The session cookie's expiry moves with use, so an active user is not signed out a fixed 14 days
 * after signing in. express-session re-sends the cookie only when the session's data changed, so
 * once a minute at most (the pace at which session-store.ts moves the row's expiry) this stamps
 * `renewedAt`: the session is saved with a new expiry and the cookie goes out with it. The stored
 * cookie expiry is that of the last cookie sent, which is what "a minute since" is measured from.
 */
import type { RequestHandler } from 'express';
import { TOUCH_EVERY_MS } from './session-store';

export function rollingSessionCookie(maxAgeMs: number): RequestHandler {
  return (req, _res, next) => {
    const expires = req.session?.cookie.expires;
    if (req.user && expires && expires.getTime() - Date.now() <= maxAgeMs - TOUCH_EVERY_MS) req.session.renewedAt = Date.now();
    next();
  };
}
