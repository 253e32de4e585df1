import { and, desc, eq } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { Database } from '../db/client';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { revisions, studies } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { inputsHash } from '../canonical-json';
import { REVISION_MACHINE_VERSION } from '../workflow/revision.machine';
import { loadStudyScope } from '../db/revisions.repo';
import type { copyStudySchema } from '../schemas/study-copy.schema';
import { parseStudyInputs } from './study-input';

const ISSUED = ['issued', 'superseded'];

/**
 * Copies a study's inputs (from the chosen revision, else the latest) into a new study with its
 * own code, in the same or another project, as revision 1 drafted by the actor. The source is
 * named in the audit event; the copy shares nothing else with it.
 */
export async function copyStudy(s: AppServices, actor: SessionUser, sourceStudyId: string, body: z.output<typeof copyStudySchema>) {
  const { study: source } = await loadStudyScope(s.db, sourceStudyId);
  return inTransaction(s.pool, async (tx) => {
    const [from] = body.fromRevisionId
      ? await tx.select().from(revisions).where(and(eq(revisions.id, body.fromRevisionId), eq(revisions.studyId, sourceStudyId)))
      : await tx.select().from(revisions).where(eq(revisions.studyId, sourceStudyId)).orderBy(desc(revisions.number)).limit(1);
    if (!from) throw new AppError('InvalidInput', undefined, [{ field: 'fromRevisionId', message: 'That revision is not one of this study\'s.' }]);
    // Stored inputs may predate today's schema: they are parsed again, so the copy starts valid.
    const inputs = parseStudyInputs({ ...(from.inputs as Record<string, unknown>), title: body.title }, source.kind);
    const [study] = await tx
      .insert(studies)
      .values({ projectId: body.projectId, code: body.code, title: body.title, kind: source.kind, limitSetId: source.limitSetId, createdBy: actor.id })
      .onConflictDoNothing()
      .returning();
    if (!study) throw new AppError('Conflict', `Code ${body.code} is already used in that project: choose another.`, [{ field: 'code', message: `Code ${body.code} is already used in that project.` }]);
    const [revision] = await tx
      .insert(revisions)
      .values({ studyId: study.id, number: 1, machineVersion: REVISION_MACHINE_VERSION, inputs, inputsHash: inputsHash(inputs), designerId: actor.id })
      .returning();
    await appendAudit(tx, {
      actorId: actor.id,
      type: 'study.created',
      projectId: body.projectId,
      studyId: study.id,
      revisionId: revision.id,
      detail: { code: study.code, title: study.title, kind: study.kind, copiedFrom: { studyId: source.id, studyCode: source.code, projectId: source.projectId, revisionNumber: from.number } },
    });
    return { study, revision };
  });
}

/** The issued (or since superseded) revision a new revision may start from; refused by name otherwise. */
export async function issuedRevisionOf(tx: Database, studyId: string, revisionId: string) {
  const [r] = await tx.select().from(revisions).where(and(eq(revisions.id, revisionId), eq(revisions.studyId, studyId)));
  if (!r) throw new AppError('InvalidInput', undefined, [{ field: 'fromRevisionId', message: 'That revision is not one of this study\'s.' }]);
  if (!ISSUED.includes(r.state)) throw new AppError('InvalidInput', undefined, [{ field: 'fromRevisionId', message: `Revision ${r.number} was never issued: a new revision starts from an issued one.` }]);
  return r;
}
