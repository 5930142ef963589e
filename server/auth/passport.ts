import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { authService } from '../services/auth';
import type { ServiceContext } from '../services/context';
import type { Request } from 'express';
import { UUID } from '../http/guards';

/** A project's API paths (relative to /api, where the session is read): /projects/:projectId/… */
const PROJECT_PATH = /^\/projects\/([^/]+)/;

/** A passport instance of this app (not the global one), so tests can build several apps. */
export function createPassport(ctx: ServiceContext) {
  const instance = new passport.Passport();
  instance.use(
    new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, (email, password, done) => {
      authService.verifyCredentials(ctx, email, password).then((user) => done(null, user ?? false), done);
    }),
  );
  instance.serializeUser((user, done) => done(null, (user as Express.User).id));
  // On a project's path, the user's role there is read in the same query and kept for the guard
  // (server/http/guards.ts requireProjectRole): one database round trip fewer on every project request.
  instance.deserializeUser((req: Request, id: string, done: (err: unknown, user?: Express.User | false) => void) => {
    const projectId = PROJECT_PATH.exec(req.path)?.[1];
    if (!projectId || !UUID.test(projectId)) {
      authService.findActiveUser(ctx, id).then((user) => done(null, user ?? false), done);
      return;
    }
    authService.findActiveUserWithRole(ctx, id, projectId).then((found) => {
      if (found) req.projectMembership = { projectId, role: found.role };
      done(null, found?.user ?? false);
    }, done);
  });
  return instance;
}
