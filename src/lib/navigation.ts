import { allRoles, type SessionUser } from './auth/roles';

export interface NavItem {
  href: string;
  label: string;
}

/** Navigation entries the user's roles can use; a link that would only answer 403 is not shown. */
export function navigationFor(user: SessionUser): NavItem[] {
  const roles = allRoles(user);
  const items: NavItem[] = [{ href: '/', label: 'My desk' }];
  if (roles.some((r) => r !== 'admin')) items.push({ href: '/projects', label: 'Projects' }, { href: '/register', label: 'Register' });
  if (roles.includes('auditor')) items.push({ href: '/audit', label: 'Audit trail' });
  if (roles.includes('admin')) items.push({ href: '/admin', label: 'Administration' });
  // Everyone may read how the figures are computed and how the engine was validated.
  items.push({ href: '/methods', label: 'Method' });
  return items;
}
