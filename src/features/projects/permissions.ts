import type { User } from '../../shared/api/auth';
import type { Project } from '../../shared/api/projects';

/**
 * What the screens offer. The server decides what is allowed; these only keep controls away
 * from people whose requests would be refused.
 */
export function canCreateProject(user: Pick<User, 'isAdmin' | 'accountRole'>): boolean {
  return user.isAdmin || user.accountRole === 'designer';
}

/** Project details are changed by the project's designers only. */
export function canEditProject(project: Pick<Project, 'myRole'>): boolean {
  return project.myRole === 'designer';
}

/** Members are managed by the project's designers, and by site administrators (member or not). */
export function canManageMembers(project: Pick<Project, 'myRole'>, user: Pick<User, 'isAdmin'>): boolean {
  return project.myRole === 'designer' || user.isAdmin;
}
