import type { ProjectRole } from '../db/schema/projects';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';

export type Requirement =
  | { admin: true }
  | { anyRole: ProjectRole[]; projectId?: string }
  | { signedIn: true };

/**
 * The one place that decides whether a request may proceed. Throws NotSignedIn (401) or
 * Forbidden (403); returns the user otherwise. Admin is a separate flag: it does not stand
 * in for a project role, so an admin cannot act as designer, checker or approver by it.
 */
export function authorize(user: SessionUser | null | undefined, need: Requirement): SessionUser {
  if (!user) throw new AppError('NotSignedIn');
  if ('signedIn' in need) return user;
  if ('admin' in need) {
    if (!user.isAdmin) throw new AppError('Forbidden', 'Only an administrator may do this.');
    return user;
  }
  const held = need.projectId
    ? (user.projectRoles[need.projectId] ?? [])
    : Object.values(user.projectRoles).flat();
  if (!need.anyRole.some((r) => held.includes(r))) {
    throw new AppError('Forbidden', `This needs the ${need.anyRole.join(' or ')} role${need.projectId ? ' in this project' : ''}.`);
  }
  return user;
}
