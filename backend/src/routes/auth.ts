import { Router, type RequestHandler } from 'express';
import type passport from 'passport';
import { ipKeyGenerator } from 'express-rate-limit';
import type { Sequelize } from 'sequelize';
import { LoginInput } from '@shared/schemas/user';
import { markSignedIn, type SessionUser } from '../auth/passport';
import { currentUser, requireUser } from '../auth/guards';
import { HttpError } from '../http/errors';
import { pgRateLimit } from '../http/rateLimit';
import { parseOr400 } from '../http/validate';
import { audit } from '../services/audit/audit';

export interface AuthLimits {
  /** Attempts per account (the parsed, normalised e-mail) and address per window. */
  limit: number;
  /** Attempts per address across every account per window (password spraying). */
  ipLimit: number;
  windowMs: number;
}

/** POST /auth/login, POST /auth/logout, GET /auth/me. */
export function authRouter(pp: passport.PassportStatic, sequelize: Sequelize, opts: AuthLimits & { now: () => Date }): Router {
  const r = Router();
  const message = 'Too many sign-in attempts. Wait a few minutes and try again.';
  const ipLimiter = pgRateLimit(sequelize, { name: 'login-ip', limit: opts.ipLimit, windowMs: opts.windowMs, key: (req) => ipKeyGenerator(req.ip ?? ''), message });
  // Keyed on the e-mail as the schema reads it, so " a@b.c", "\ta@b.c" and "A@B.C" share one count.
  const accountLimiter = pgRateLimit(sequelize, {
    name: 'login',
    limit: opts.limit,
    windowMs: opts.windowMs,
    key: (req) => `${ipKeyGenerator(req.ip ?? '')}|${(req.body as LoginInput).email}`,
    message,
  });
  const parseLogin: RequestHandler = (req, _res, next) => {
    req.body = parseOr400(LoginInput, req.body, 'Sign-in');
    next();
  };

  r.post('/auth/login', ipLimiter, parseLogin, accountLimiter, (req, res, next) => {
    pp.authenticate('local', (err: unknown, user: SessionUser | false) => {
      if (err) return next(err);
      if (!user) return next(new HttpError(401, 'bad_credentials', 'E-mail or password is not right, or the account is deactivated.'));
      // passport ≥ 0.6 regenerates the session here (no fixation).
      req.logIn(user, (e) => {
        if (e) return next(e);
        markSignedIn(req, opts.now());
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
