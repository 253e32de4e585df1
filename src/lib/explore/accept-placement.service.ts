import { and, desc, eq } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { explorations, revisions } from '../db/schema';
import { withLockedRevision } from '../db/revision-lock';
import { appendAudit } from '../audit/audit-log';
import { inputsHash } from '../canonical-json';
import { parseStudyInputs } from '../studies/study-input';
import { REVISION_MACHINE_VERSION } from '../workflow/revision.machine';
import type { PlacementResult } from './run-exploration';

// "Accept the suggested joint positions into a new draft", one audited action. From a closed
// revision (issued, withdrawn…) that is the study's latest, the next revision is started with
// the suggested minor-section lengths; nothing else in the inputs changes.

const OPEN_STATES = ['draft', 'ready_for_check', 'in_check', 'returned', 'checked'];

export async function acceptPlacement(s: AppServices, actor: SessionUser, revisionId: string, explorationId: string) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    const [row] = await tx.select().from(explorations).where(and(eq(explorations.id, explorationId), eq(explorations.revisionId, revisionId)));
    if (!row || row.kind !== 'placement' || row.status !== 'done') throw new AppError('InvalidInput', undefined, [{ field: 'explorationId', message: 'Choose a finished joint-bay placement of this revision.' }]);
    if (row.inputsHash !== revision.inputsHash) throw new AppError('StepRefused', 'The inputs changed after this placement ran: run it again on the current inputs.');
    const suggested = (row.result as PlacementResult).placement.suggestedStudy;
    if (!suggested) throw new AppError('StepRefused', 'This placement found no feasible joint positions: there is nothing to accept.');
    // Every revision of the study, locked, so two accepts cannot both start the next number.
    const all = await tx.select().from(revisions).where(eq(revisions.studyId, study.id)).orderBy(desc(revisions.number)).for('update');
    const open = all.find((r) => OPEN_STATES.includes(r.state));
    if (open) throw new AppError('StepRefused', `Revision ${open.number} is still ${open.state.replace(/_/g, ' ')}: accept the placement once it is finished or withdrawn, or enter the lengths in that draft.`);
    if (all[0].id !== revisionId) throw new AppError('StepRefused', `Revision ${all[0].number} is newer than this one: run the placement on it.`);
    const inputs = parseStudyInputs(suggested, 'bonding');
    const [created] = await tx
      .insert(revisions)
      .values({ studyId: study.id, number: all[0].number + 1, machineVersion: REVISION_MACHINE_VERSION, inputs, inputsHash: inputsHash(inputs), designerId: actor.id, basedOnId: revisionId })
      .returning();
    await appendAudit(tx, { actorId: actor.id, type: 'revision.created', projectId: study.projectId, studyId: study.id, revisionId: created.id, detail: { number: created.number, basedOn: revision.number } });
    await appendAudit(tx, {
      actorId: actor.id,
      type: 'exploration.placement-accepted',
      projectId: study.projectId,
      studyId: study.id,
      revisionId: created.id,
      detail: { explorationId, fromRevision: revision.number, lengths: (row.result as PlacementResult).placement.majorSections.map((m) => ({ sectionIds: m.sectionIds, from: m.currentLengthsM, to: m.suggestedLengthsM })) },
    });
    return created;
  });
}

