import bcrypt from 'bcryptjs';
import type { Request } from 'express';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Role } from '@shared/schemas/user';
import { User } from '../models';
import { audit } from '../services/audit/audit';

/** What req.user holds for a signed-in request. */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace -- Express declares its request user in this global namespace; merging into it is the only way to type req.user
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type -- an empty interface is how declaration merging adds SessionUser's fields to Express.User
    interface User extends SessionUser {}
  }
}

declare module 'express-session' {
  interface SessionData {
    /** When the user signed in (ms since epoch, app clock): the absolute lifetime counts from here. */
    signedInAt?: number;
    /** When the idle expiry was last pushed forward (ms since epoch, app clock). */
    refreshedAt?: number;
  }
}

// Hashes to compare against when the e-mail is unknown, at the configured cost (one per cost), so
// an unknown e-mail takes as long as a wrong password and timing does not reveal which e-mails exist.
const dummyHashes = new Map<number, Promise<string>>();
function dummyHash(cost: number): Promise<string> {
  let h = dummyHashes.get(cost);
  if (!h) dummyHashes.set(cost, (h = bcrypt.hash('not-a-real-password', cost)));
  return h;
}

// Signed-in requests come in bursts (a page asks for several resources at once); the user row they
// need is kept a few seconds per session instead of being read on every request. User changes that
// matter (deactivation, role, password) also delete the user's sessions, which ends them at once.
const USER_CACHE_MS = 5_000;
const USER_CACHE_MAX = 10_000;
const userCache = new Map<string, { user: SessionUser | false; at: number }>();

/** Forgets the cached user of every session of this user (after the row changed). */
export function forgetCachedUser(userId: number): void {
  for (const [k, v] of userCache) if (v.user && v.user.id === userId) userCache.delete(k);
}

const present = (u: User): SessionUser => ({ id: u.id, email: u.email, name: u.name, role: u.role });

/** Configures a passport instance with the local strategy and id-only session serialisation. */
export function createPassport(opts: { bcryptCost: number }): passport.PassportStatic {
  const pp = new passport.Passport() as unknown as passport.PassportStatic;
  void dummyHash(opts.bcryptCost);
  pp.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', passReqToCallback: true }, (req, email, password, done) => {
      (async () => {
        const normalised = email.trim().toLowerCase();
        const user = await User.findOne({ where: { email: normalised } });
        const ok = await bcrypt.compare(password, user?.passwordHash ?? (await dummyHash(opts.bcryptCost)));
        if (!user || !ok || !user.active) {
          // Recorded without the password; the reason is for the admin reading the log only.
          const reason = !user ? 'unknown_email' : !ok ? 'wrong_password' : 'deactivated';
          await audit(null, 'auth.login_failed', 'user', user?.id ?? null, { email: normalised, reason, ip: req.ip ?? null });
          return done(null, false);
        }
        return done(null, present(user));
      })().catch(done);
    }),
  );
  pp.serializeUser((user, done) => done(null, (user as SessionUser).id));
  pp.deserializeUser((req: Request, id: number, done: (err: unknown, user?: SessionUser | false) => void) => {
    const key = `${req.sessionID}|${id}`;
    const hit = userCache.get(key);
    const t = Date.now();
    if (hit && t - hit.at < USER_CACHE_MS) return done(null, hit.user);
    User.findByPk(id, { attributes: ['id', 'email', 'name', 'role', 'active'] })
      .then((u) => {
        const user = u && u.active ? present(u) : false;
        if (userCache.size >= USER_CACHE_MAX) userCache.clear();
        userCache.set(key, { user, at: t });
        done(null, user);
      })
      .catch(done);
  });
  return pp;
}

/** Starts the absolute lifetime of a session that was just signed in. */
export function markSignedIn(req: Request, now: Date): void {
  req.session.signedInAt = now.getTime();
  req.session.refreshedAt = now.getTime();
}

/** bcrypt hash of a password at the configured cost. */
export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}
