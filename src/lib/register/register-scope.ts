import type { SessionUser } from '../auth/roles';
import { authorize } from '../server/authorize';
import { READERS } from '../server/scope';

/**
 * The projects a person's register covers: one project they read (checked), or every project
 * they hold a role in. An administrator sees only the projects they are a member of: the flag
 * does not stand in for a project role.
 */
export function registerProjectIds(user: SessionUser | null | undefined, projectId?: string): string[] {
  if (projectId) {
    authorize(user, { anyRole: READERS, projectId });
    return [projectId];
  }
  const person = authorize(user, { signedIn: true });
  return Object.keys(person.projectRoles).filter((p) => person.projectRoles[p].length > 0).sort();
}

/** Today as a UTC calendar date: the register's "today" everywhere. */
export const todayUtc = () => new Date().toISOString().slice(0, 10);
