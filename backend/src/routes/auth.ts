import { Router } from 'express';
import type passport from 'passport';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { LoginInput } from '@shared/schemas/user';
import type { SessionUser } from '../auth/passport';
import { currentUser, requireUser } from '../auth/guards';
import { HttpError } from '../http/errors';
import { parseOr400 } from '../http/validate';
import { audit } from '../services/audit/audit';

/** POST /auth/login, POST /auth/logout, GET /auth/me. */
export function authRouter(pp: passport.PassportStatic, opts: { limit: number; windowMs: number }): Router {
  const r = Router();
  const loginLimiter = rateLimit({
    windowMs: opts.windowMs,
    limit: opts.limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${String((req.body as { email?: unknown } | undefined)?.email ?? '').toLowerCase()}`,
    handler: (_req, _res, next) =>
      next(new HttpError(429, 'rate_limited', 'Too many sign-in attempts. Wait a few minutes and try again.')),
  });

  r.post('/auth/login', loginLimiter, (req, res, next) => {
    const input = parseOr400(LoginInput, req.body, 'Sign-in');
    req.body = input;
    pp.authenticate('local', (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) return next(new HttpError(401, 'bad_credentials', 'E-mail or password is not right, or the account is deactivated.'));
      // passport ≥ 0.6 regenerates the session here (no fixation).
      req.logIn(user, (e) => {
        if (e) return next(e);
        audit(user.id, 'auth.login', 'user', user.id)
          .then(() => res.json({ user }))
          .catch(next);
      });
    })(req, res, next);
  });

  r.post('/auth/logout', requireUser, (req, res, next) => {
    const user = currentUser(req);
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((e) => {
        if (e) return next(e);
        res.clearCookie('rf.sid');
        audit(user.id, 'auth.logout', 'user', user.id).then(() => res.status(204).end(), next);
      });
    });
  });

  r.get('/auth/me', requireUser, (req, res) => {
    res.json({ user: currentUser(req) });
  });
  return r;
}
