import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { authService } from '../services/auth';
import type { ServiceContext } from '../services/context';

/** A passport instance of this app (not the global one), so tests can build several apps. */
export function createPassport(ctx: ServiceContext) {
  const instance = new passport.Passport();
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      authService.verifyCredentials(ctx, email, password).then((user) => done(null, user ?? false), done);
    }),
  );
  instance.serializeUser((user, done) => done(null, (user as Express.User).id));
  instance.deserializeUser((id: string, done) => {
    authService.findActiveUser(ctx, id).then((user) => done(null, user ?? false), done);
  });
  return instance;
}
