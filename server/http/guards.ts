import type { RequestHandler } from 'express';
import { AppError, forbidden, notFound } from './errors';
import { membersRepo } from '../repositories/projects';
import type { Actor } from '../services/context';
import type { User } from '../../src/shared/api/auth';
import type { ProjectRole } from '../../src/shared/api/projects';
import type { Db } from '../db/knex';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // eslint-disable-next-line @typescript-eslint/no-empty-object-type
    interface User extends Omit<import('../../src/shared/api/auth').User, never> {}
    interface Request {
      projectRole?: ProjectRole;
      /** the signed-in user's role in the path's project, read with the user (server/auth/passport.ts); role undefined: not a member */
      projectMembership?: { projectId: string; role: ProjectRole | undefined };
    }
  }
}

export const actorOf = (user: User | Express.User | undefined): Actor => {
  if (!user) throw new AppError(401, 'NOT_SIGNED_IN', 'Sign in to continue.');
  return { id: user.id, isAdmin: user.isAdmin, accountRole: user.accountRole };
};

export const requireUser: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new AppError(401, 'NOT_SIGNED_IN', 'Sign in to continue.');
  next();
};

export const requireAdmin: RequestHandler = (req, _res, next) => {
  if (!req.user) throw new AppError(401, 'NOT_SIGNED_IN', 'Sign in to continue.');
  if (!req.user.isAdmin) throw forbidden('Only administrators manage accounts.');
  next();
};

export const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * Loads the signed-in user's role in :projectId. A non-member gets 404 — the project's
 * existence is not revealed — and a member whose role is not in `roles` gets 403.
 * With `administrators`, a site administrator passes too (membership management).
 */
export function requireProjectRole(db: Db, roles: readonly ProjectRole[] | 'any', opts: { administrators?: boolean } = {}): RequestHandler {
  return async (req, _res, next) => {
    if (!req.user) throw new AppError(401, 'NOT_SIGNED_IN', 'Sign in to continue.');
    const projectId = String(req.params.projectId ?? '');
    if (!UUID.test(projectId)) throw notFound('The project');
    const known = req.projectMembership?.projectId === projectId ? req.projectMembership : undefined;
    const role = known ? known.role : await membersRepo.roleOf(db, projectId, req.user.id);
    if (!role && req.user.isAdmin) {
      // site administrators see every project and manage membership (DESIGN.md) without being members
      if (!(await db('projects').where({ id: projectId }).first('id'))) throw notFound('The project');
      if (!opts.administrators) throw forbidden('Administrators manage members; the project’s designers edit it.');
      req.projectRole = undefined;
      return next();
    }
    if (!role) throw notFound('The project');
    if (roles !== 'any' && !roles.includes(role)) throw forbidden(`This needs the ${roles.join(' or ')} role in this project.`);
    req.projectRole = role;
    next();
  };
}

/**
 * After `requireProjectRole`: the :systemId of the path is the project's and the :revisionId is
 * that system's, else 404 (as for a revision that does not exist). For routes whose service reads
 * by the revision alone (issue 13 finding 2: a revision's messages were listed for any revision id).
 */
export function requireRevisionInPath(db: Db): RequestHandler {
  return async (req, _res, next) => {
    const { projectId, systemId, revisionId } = req.params as Record<string, string | undefined>;
    if (![projectId, systemId, revisionId].every((id) => id && UUID.test(id))) throw notFound('The revision');
    const found = await db('revisions as r')
      .join('systems as s', 's.id', 'r.system_id')
      .where({ 'r.id': revisionId, 's.id': systemId, 's.project_id': projectId })
      .first('r.id');
    if (!found) throw notFound('The revision');
    next();
  };
}
