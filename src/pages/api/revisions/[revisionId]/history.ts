import { asc, eq } from 'drizzle-orm';
import { authorize } from '../../../../lib/server/authorize';
import { endpoint } from '../../../../lib/server/http';
import { services } from '../../../../lib/server/services.server';
import { READERS, projectOfRevision } from '../../../../lib/server/scope';
import { auditEvents, revisions, studies, users } from '../../../../lib/db/schema';

// The revision's own history for everyone who can read it (told with its number and study code);
// the full trail is the auditor's.
export const GET = endpoint(async ({ locals, params }) => {
  const { db } = await services();
  authorize(locals.user, { anyRole: READERS, projectId: await projectOfRevision(db, params.revisionId!) });
  const events = await db
    .select({ id: auditEvents.id, at: auditEvents.at, type: auditEvents.type, actorName: users.name, detail: auditEvents.detail, revisionNumber: revisions.number, studyCode: studies.code })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .innerJoin(revisions, eq(revisions.id, auditEvents.revisionId))
    .innerJoin(studies, eq(studies.id, revisions.studyId))
    .where(eq(auditEvents.revisionId, params.revisionId!))
    .orderBy(asc(auditEvents.id));
  return Response.json({ events });
});
