import bcrypt from 'bcryptjs';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Role } from '@shared/schemas/user';
import { User } from '../models';

/** What req.user holds for a signed-in request. */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends SessionUser {}
  }
}

// A hash to compare against when the e-mail is unknown, so timing does not reveal which e-mails exist.
const DUMMY_HASH = bcrypt.hashSync('not-a-real-password', 4);

/** Configures a passport instance with the local strategy and id-only session serialisation. */
export function createPassport(): passport.PassportStatic {
  const pp = new passport.Passport() as unknown as passport.PassportStatic;
  pp.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      (async () => {
        const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
        const ok = await bcrypt.compare(password, user?.passwordHash ?? DUMMY_HASH);
        if (!user || !ok || !user.active) return done(null, false);
        return done(null, { id: user.id, email: user.email, name: user.name, role: user.role });
      })().catch(done);
    }),
  );
  pp.serializeUser((user, done) => done(null, (user as SessionUser).id));
  pp.deserializeUser((id: number, done) => {
    User.findByPk(id)
      .then((u) => done(null, u && u.active ? { id: u.id, email: u.email, name: u.name, role: u.role } : false))
      .catch(done);
  });
  return pp;
}

/** bcrypt hash of a password at the configured cost. */
export function hashPassword(password: string, cost: number): Promise<string> {
  return bcrypt.hash(password, cost);
}
