import type { RequestHandler } from 'express';
import { forbidden } from '../http/errors';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request check for state-changing methods: when the browser sends Origin (or, failing
 * that, Referer), it must be this site's own origin or one configured in ALLOWED_ORIGINS. Together
 * with SameSite=Lax session cookies this stops cross-site form posts and fetches.
 */
export function sameOriginGuard(extraOrigins: string[]): RequestHandler {
  const extra = new Set(extraOrigins.map((o) => o.replace(/\/$/, '')));
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin') ?? refererOrigin(req.get('referer'));
    if (!origin) return next();
    const own = `${req.protocol}://${req.get('host')}`;
    if (origin === own || extra.has(origin)) return next();
    next(forbidden(`Cross-site request refused (origin ${origin}).`));
  };
}

function refererOrigin(referer: string | undefined): string | undefined {
  if (!referer) return undefined;
  try {
    return new URL(referer).origin;
  } catch {
    return 'invalid';
  }
}
