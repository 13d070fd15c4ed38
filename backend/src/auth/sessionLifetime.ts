import type { RequestHandler } from 'express';

/**
 * Session lifetimes, between express-session and passport.session():
 * - absolute: a session ends `lifetimeMs` after sign-in however busy it is (it is regenerated
 *   empty, so the request goes on signed out);
 * - idle: the cookie and the stored row expire `idleMs` after the last refresh. The refresh is
 *   written at most every tenth of the idle time instead of on every request, so an unchanged
 *   session costs one read and no write (express-session's own rolling and the store's touch are off).
 */
export function sessionLifetime(opts: { lifetimeMs: number; idleMs: number; now: () => Date }): RequestHandler {
  const refreshEvery = opts.idleMs / 10;
  return (req, _res, next) => {
    const s = req.session;
    if (!s || !(s as { passport?: { user?: unknown } }).passport?.user) return next();
    const t = opts.now().getTime();
    // A session signed in before lifetimes were kept starts counting now.
    s.signedInAt ??= t;
    if (t - s.signedInAt > opts.lifetimeMs) return s.regenerate((err) => next(err));
    if (s.refreshedAt === undefined || t - s.refreshedAt >= refreshEvery) s.refreshedAt = t;
    next();
  };
}
