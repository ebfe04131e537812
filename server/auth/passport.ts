import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../models/user';
import { decoyHash, verifyPassword } from './passwords';

/** passport-local over the users table; only active accounts sign in. */
export function configurePassport(): passport.PassportStatic {
  const p = new passport.Passport() as unknown as passport.PassportStatic;
  p.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, async (email, password, done) => {
      try {
        const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
        const ok = await verifyPassword(user?.passwordHash ?? (await decoyHash()), password);
        if (!user || !ok || !user.active) return done(null, false);
        return done(null, user);
      } catch (err) {
        return done(err);
      }
    }),
  );
  p.serializeUser((user, done) => done(null, (user as User).id));
  p.deserializeUser(async (id: number, done) => {
    try {
      const user = await User.findByPk(id);
      done(null, user?.active ? user : false);
    } catch (err) {
      done(err);
    }
  });
  return p;
}
