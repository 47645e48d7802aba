// passport with the local (e-mail + password) strategy. One Passport instance per app so two apps
// in one process (tests) never share strategies or serializers.
import { Passport } from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import type { Db } from '@/server/db';
import { checkPassword } from '@/server/auth/passwords';
import type { User } from '@/server/db/models';

export type CredentialCheck = { user: User | null; email: string };

export function createPassport(db: Db, bcryptCost: number): InstanceType<typeof Passport> {
  const passport = new Passport();
  passport.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password', session: false }, (email, password, done) => {
      const normalised = email.trim().toLowerCase();
      db.models.User.findOne({ where: { email: normalised } })
        .then(async (user) => {
          const ok = await checkPassword(password, user?.passwordHash ?? null, bcryptCost);
          done(null, ok && user ? user : false);
        })
        .catch((err: unknown) => done(err));
    }),
  );
  passport.serializeUser((user, done) => done(null, (user as User).id));
  passport.deserializeUser((id: string, done) => {
    db.models.User.findByPk(id)
      // A deleted account simply ends the session (false), rather than failing every request.
      .then((user) => done(null, user ?? false))
      .catch((err: unknown) => done(err));
  });
  return passport;
}
