import type { ProjectRole } from '../db/schema/projects';

/** The signed-in person as pages and endpoints see it (Astro.locals.user). */
export interface SessionUser {
  id: string;
  email: string;
  name: string;
  isAdmin: boolean;
  /** Roles held in each project, keyed by project id. */
  projectRoles: Record<string, ProjectRole[]>;
}

/** Every role the user holds in any project, plus 'admin' for the global flag. */
export function allRoles(user: SessionUser): Array<ProjectRole | 'admin'> {
  const roles = new Set<ProjectRole | 'admin'>(Object.values(user.projectRoles).flat());
  if (user.isAdmin) roles.add('admin');
  return [...roles].sort();
}
