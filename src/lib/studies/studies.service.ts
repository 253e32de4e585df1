import { and, asc, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { checklistItems, limitSets, revisions, studies, studySummaries } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { decodeCursor, encodeCursor } from '../db/keyset-cursor';
import { withLockedRevision } from '../db/revision-lock';
import { appendAudit } from '../audit/audit-log';
import { inputsHash } from '../canonical-json';
import { jsonDiff } from '../json-diff';
import { describeInputChanges } from '../compare/input-changes';
import { ENGINE_VERSION } from '../calc';
import { compute } from '../compute/compute-pool';
import { rememberRecomputation } from './recomputations.repo';
import { REVISION_MACHINE_VERSION, editableStates, type RevisionState } from '../workflow/revision.machine';
import { type CalculationScope, latestLimitSetVersion, loadRevisionScope, loadStudyScope, resultsCheckOf, storedResultsBytes } from '../db/revisions.repo';
import { checklistRows } from './checklist-rows';
import { parseStudyInputs } from './study-input';
import { issuedRevisionOf } from './study-copy.service';
import type { Database } from '../db/client';

export interface NewStudy {
  code: string;
  title: string;
  kind: 'bonding' | 'exposure';
  limitSetId: string;
  inputs: unknown;
}

/** Creates a study and its first revision (draft, designed by the actor). */
export async function createStudy(s: AppServices, actor: SessionUser, projectId: string, input: NewStudy) {
  const inputs = parseStudyInputs(input.inputs, input.kind);
  return inTransaction(s.pool, async (tx) => {
    const [limitSet] = await tx.select({ id: limitSets.id }).from(limitSets).where(eq(limitSets.id, input.limitSetId));
    if (!limitSet) throw new AppError('InvalidInput', undefined, [{ field: 'limitSetId', message: 'There is no limit set with this id: choose one from the list.' }]);
    const [clash] = await tx.select({ id: studies.id }).from(studies).where(and(eq(studies.projectId, projectId), eq(studies.code, input.code)));
    if (clash) throw new AppError('InvalidInput', undefined, [{ field: 'code', message: `Code ${input.code} is already used in this project.` }]);
    // Two people creating the same code at once: the unique key decides, and the loser is told why.
    const [study] = await tx
      .insert(studies)
      .values({ projectId, code: input.code, title: input.title, kind: input.kind, limitSetId: input.limitSetId, createdBy: actor.id })
      .onConflictDoNothing()
      .returning();
    if (!study) throw new AppError('Conflict', `Code ${input.code} was taken in this project a moment ago: choose another.`, [{ field: 'code', message: `Code ${input.code} is already used in this project.` }]);
    const [revision] = await tx
      .insert(revisions)
      .values({ studyId: study.id, number: 1, machineVersion: REVISION_MACHINE_VERSION, inputs, inputsHash: inputsHash(inputs), designerId: actor.id })
      .returning();
    await appendAudit(tx, { actorId: actor.id, type: 'study.created', projectId, studyId: study.id, revisionId: revision.id, detail: { code: study.code, title: study.title, kind: study.kind } });
    return { study, revision };
  });
}

function assertEditableBy(actor: SessionUser, revision: { state: RevisionState; designerId: string }, refused = 'its inputs can no longer change') {
  if (!editableStates.has(revision.state)) throw new AppError('ReadOnly', `The revision is ${revision.state.replace(/_/g, ' ')}: ${refused}.`);
  if (revision.designerId !== actor.id) throw new AppError('Forbidden', 'Only the designer of this revision can change it.');
}

/** Replaces a revision's inputs; stale writers (another version) get Conflict; the same inputs again change nothing. */
export async function updateInputs(s: AppServices, actor: SessionUser, revisionId: string, raw: unknown, expectedVersion: number) {
  const { study } = await loadRevisionScope(s.db, revisionId);
  const inputs = parseStudyInputs(raw, study.kind);
  return withLockedRevision(s, revisionId, async ({ revision }, tx) => {
    assertEditableBy(actor, revision);
    if (revision.version !== expectedVersion) throw new AppError('Conflict');
    const hash = inputsHash(inputs);
    // The same inputs again: nothing to record (no new version, no empty history entry).
    if (hash === revision.inputsHash) return revision;
    const [updated] = await tx
      .update(revisions)
      .set({ inputs, inputsHash: hash, version: sql`${revisions.version} + 1`, updatedAt: new Date() })
      .where(eq(revisions.id, revisionId))
      .returning();
    await appendAudit(tx, {
      actorId: actor.id,
      type: 'revision.inputs-changed',
      projectId: study.projectId,
      studyId: study.id,
      revisionId,
      // `changes` stays machine-readable (path, before, after); `sentences` is what people read.
      detail: { changes: jsonDiff(revision.inputs, inputs), sentences: describeInputChanges(revision.inputs, inputs).slice(0, 50) },
    });
    return updated;
  });
}

/**
 * Calculates a revision in a worker thread, stores the results (compact: no route profiles) with
 * the engine version and inputs hash, and refreshes its checklist. Results already stored for
 * the same inputs hash and engine version are kept when they match the recorded recomputation
 * (`recomputations`): only the limit set is applied again. When the limit set version is the one
 * applied last as well, and the stored figures are untouched, nothing would change: nothing is
 * written and the answer says `unchanged`.
 */
export async function calculateRevision(s: AppServices, actor: SessionUser, scope: CalculationScope) {
  // The cheap refusals (state, designer) come first; the calculation runs outside the lock, and
  // the inputs hash under the lock proves the inputs are still the ones calculated (two people
  // calculating the same inputs at once both succeed; an edit in between is a conflict). The
  // results travel as JSON bytes: the request thread never decodes, parses or serialises them.
  const { revision, study, knownResultsHash } = scope;
  const revisionId = revision.id;
  assertEditableBy(actor, revision, CALCULATE_REFUSED);
  if (scope.upToDate) return { id: revisionId, version: revision.version, engineVersion: revision.engineVersion, inputsHash: revision.inputsHash, unchanged: true };
  const sameInputs = scope.calculated && revision.resultsInputsHash === revision.inputsHash && revision.engineVersion === ENGINE_VERSION;
  const storedBytes = sameInputs && knownResultsHash ? await storedResultsBytes(s.db, revisionId) : null;
  const reuse = storedBytes && knownResultsHash ? { storedBytes, knownHash: knownResultsHash } : undefined;
  const limits = await latestLimitSetVersion(s.db, study.limitSetId);
  const [{ name }] = await s.db.select({ name: limitSets.name }).from(limitSets).where(eq(limitSets.id, study.limitSetId));
  const limitSet = { name, version: limits.version, limits: limits.limits };
  const { inputs, resultsBytes, computed, resultsHash, fresh } = await compute({ task: 'calculate', studyKind: study.kind, rawInputs: revision.inputs, limits: limitSet, reuse });
  return withLockedRevision(s, revisionId, async ({ revision: current }, tx) => {
    assertEditableBy(actor, current, CALCULATE_REFUSED);
    if (current.inputsHash !== revision.inputsHash) throw new AppError('Conflict', 'The inputs changed while they were being calculated: calculate again.');
    const existing = await tx.select().from(checklistItems).where(eq(checklistItems.revisionId, revisionId));
    const [updated] = await tx
      .update(revisions)
      .set({
        // New figures, or the kept ones (just checked against the recorded recomputation), with their check.
        ...(resultsBytes ? { results: newResults(resultsBytes), resultsCheck: resultsCheckOf(newResults(resultsBytes)) } : { resultsCheck: resultsCheckOf(revisions.results) }),
        resultsInputsHash: revision.inputsHash,
        engineVersion: ENGINE_VERSION,
        limitSetVersionId: limits.id,
        version: sql`${revisions.version} + 1`,
        updatedAt: new Date(),
      })
      .where(eq(revisions.id, revisionId))
      .returning({ id: revisions.id, version: revisions.version, engineVersion: revisions.engineVersion, inputsHash: revisions.inputsHash });
    if (fresh) await rememberRecomputation(tx, revision.inputsHash, resultsHash);
    await tx.delete(checklistItems).where(eq(checklistItems.revisionId, revisionId));
    const rows = checklistRows(revisionId, computed, limits.manualItems, existing, inputs);
    if (rows.length) await tx.insert(checklistItems).values(rows);
    await appendAudit(tx, {
      actorId: actor.id,
      type: 'revision.calculated',
      projectId: study.projectId,
      studyId: study.id,
      revisionId,
      detail: {
        engineVersion: ENGINE_VERSION,
        inputsHash: revision.inputsHash,
        limitSetVersion: limits.version,
        ...(fresh ? {} : { resultsReused: true }),
        verdicts: { pass: computed.filter((c) => c.status === 'pass').length, fail: computed.filter((c) => c.status === 'fail').length, noLimit: computed.filter((c) => c.status === 'no-limit').length },
      },
    });
    return { ...updated, unchanged: false };
  });
}

const CALCULATE_REFUSED = 'it is not calculated again (its inputs and results stay as they are); start a new revision to change them';

/** JSON bytes from a worker as a jsonb value (a bytea parameter: the request thread never decodes them). */
const newResults = (bytes: Uint8Array) => sql`convert_from(${Buffer.from(bytes.buffer, bytes.byteOffset, bytes.length)}::bytea, 'UTF8')::jsonb`;

const OPEN_STATES: RevisionState[] = ['draft', 'ready_for_check', 'in_check', 'returned', 'checked'];

/** Starts the next revision of a study from a copy of the inputs of the latest revision, or of the issued one chosen. */
export async function startNewRevision(s: AppServices, actor: SessionUser, studyId: string, fromRevisionId?: string) {
  const { study } = await loadStudyScope(s.db, studyId);
  return inTransaction(s.pool, async (tx) => {
    const all = await tx.select().from(revisions).where(eq(revisions.studyId, studyId)).orderBy(desc(revisions.number)).for('update');
    const open = all.find((r) => OPEN_STATES.includes(r.state));
    if (open) throw new AppError('StepRefused', `Revision ${open.number} is still ${open.state.replace(/_/g, ' ')}: finish or withdraw it first.`);
    const latest = all[0];
    const from = fromRevisionId ? await issuedRevisionOf(tx, studyId, fromRevisionId) : latest;
    // A second request in the same moment cannot see the first one's new row: the unique key
    // (study, number) refuses it, and the person is told what happened.
    const [revision] = await tx
      .insert(revisions)
      .values({ studyId, number: latest.number + 1, machineVersion: REVISION_MACHINE_VERSION, inputs: from.inputs, inputsHash: from.inputsHash, designerId: actor.id, basedOnId: from.id })
      .onConflictDoNothing()
      .returning();
    if (!revision) throw new AppError('Conflict', `Revision ${latest.number + 1} was started by someone else a moment ago: reload the study.`);
    await appendAudit(tx, { actorId: actor.id, type: 'revision.created', projectId: study.projectId, studyId, revisionId: revision.id, detail: { number: revision.number, basedOn: from.number } });
    return revision;
  });
}

export interface StudyListQuery {
  pageSize: number;
  /** Position of the last row of the previous page (from its `next`); absent for the first page. */
  after?: string;
  sort: 'code' | 'title' | 'updated';
  direction: 'asc' | 'desc';
  state?: RevisionState;
  kind?: 'bonding' | 'exposure';
  search?: string;
}

/**
 * A page of a project's studies with their latest revision, keyset-paged: one indexed range
 * read of `study_summaries` (kept current by triggers, the study's code and title included),
 * so a page costs the same at any depth and however many revisions, checklist items or remarks
 * there are. `next` is the position to ask for the page after this one; null on the last page.
 */
export async function listStudies(db: Database, projectId: string, q: StudyListQuery) {
  const s = studySummaries;
  const filters = and(
    eq(s.projectId, projectId),
    q.kind ? eq(s.kind, q.kind) : undefined,
    q.state ? eq(s.state, q.state) : undefined,
    q.search ? or(ilike(s.code, `%${likeEscaped(q.search)}%`), ilike(s.title, `%${likeEscaped(q.search)}%`)) : undefined,
  );
  const sortColumn = q.sort === 'code' ? s.code : q.sort === 'title' ? s.title : s.updatedAt;
  const order = q.direction === 'asc' ? asc : desc;
  let position: SQL | undefined;
  if (q.after) {
    const [[key], id] = decodeCursor(q.after, `${q.sort} ${q.direction}`, [q.sort === 'updated' ? 'timestamptz' : 'text'], 'the studies list');
    const typedKey = q.sort === 'updated' ? sql`${key}::timestamptz` : sql`${key}::text`;
    position = q.direction === 'asc' ? sql`(${sortColumn}, ${s.studyId}) > (${typedKey}, ${id}::uuid)` : sql`(${sortColumn}, ${s.studyId}) < (${typedKey}, ${id}::uuid)`;
  }
  const [[{ total }], found] = await Promise.all([
    db.select({ total: sql<number>`count(*)::int` }).from(s).where(filters),
    db
      .select({
        id: s.studyId,
        code: s.code,
        title: s.title,
        kind: s.kind,
        revisionId: s.revisionId,
        revisionNumber: s.revisionNumber,
        state: s.state,
        updatedAt: s.updatedAt,
        worstMarginPct: s.worstMarginPct,
        openRemarks: s.openRemarks,
        sortKey: sql<string>`${sortColumn}::text`,
      })
      .from(s)
      .where(and(filters, position))
      .orderBy(order(sortColumn), order(s.studyId))
      .limit(q.pageSize + 1),
  ]);
  const more = found.length > q.pageSize;
  const rows = found.slice(0, q.pageSize).map(({ sortKey: _key, ...row }) => row);
  const last = found[rows.length - 1];
  return { total, pageSize: q.pageSize, rows, next: more && last ? encodeCursor(`${q.sort} ${q.direction}`, [last.sortKey], last.id) : null };
}

/** A search term with LIKE's own wildcards taken literally. */
const likeEscaped = (term: string) => term.replace(/[\\%_]/g, (c) => `\\${c}`);
