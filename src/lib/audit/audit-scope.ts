import { and, inArray, isNull, like, or, sql, type SQL, type SQLWrapper } from 'drizzle-orm';
import type { SessionUser } from '../auth/roles';
import { auditEvents } from '../db/schema';
import { authorize } from '../server/authorize';

/**
 * Which events a reader of the audit trail may see. Administrators see every event. Anyone else
 * sees the events of the projects they are a member of (any role), plus organisation-wide
 * events about the shared reference data every project uses (limit sets, cable types, obligation
 * types); account
 * events (invitations, joins, locks) name people outside the reader's projects, so they stay
 * with administrators.
 */
export type AuditScope = { all: true } | { all: false; projectIds: string[] };

/** Project-less event types that every auditor may read (the prefix before the dot). */
const SHARED_TYPE_PREFIXES = ['limit-set.', 'cable-type.', 'obligation-type.'];

/** Authorises a reader of the audit trail (an auditor in some project, or an administrator) and returns their scope. */
export function auditScopeFor(user: SessionUser | null | undefined): AuditScope {
  if (user?.isAdmin) {
    authorize(user, { admin: true });
    return { all: true };
  }
  const reader = authorize(user, { anyRole: ['auditor'] });
  return { all: false, projectIds: Object.keys(reader.projectRoles).filter((p) => reader.projectRoles[p].length > 0).sort() };
}

/** Project-less events about the shared reference data. */
const sharedEvents = and(isNull(auditEvents.projectId), or(...SHARED_TYPE_PREFIXES.map((p) => like(auditEvents.type, `${p}%`))));

/** The SQL condition for events inside the scope (undefined: no restriction). */
export function scopeCondition(scope: AuditScope): SQL | undefined {
  if (scope.all) return undefined;
  return scope.projectIds.length ? or(inArray(auditEvents.projectId, scope.projectIds), sharedEvents) : sharedEvents;
}

/** scopeCondition with the reader's projects as a parameter (a uuid[]; empty for none), for prepared statements. */
export const scopeConditionOf = (projectIds: SQLWrapper) => or(sql`${auditEvents.projectId} = any(${projectIds}::uuid[])`, sharedEvents);

/** The same rule as scopeCondition, for rows already loaded. */
export function inScope(scope: AuditScope, event: { projectId: string | null; type: string }): boolean {
  if (scope.all) return true;
  if (event.projectId === null) return SHARED_TYPE_PREFIXES.some((p) => event.type.startsWith(p));
  return scope.projectIds.includes(event.projectId);
}
