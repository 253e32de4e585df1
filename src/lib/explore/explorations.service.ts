import { EventEmitter } from 'node:events';
import { and, desc, eq, sql } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import { AppError } from '../errors';
import { bondingChoices, explorations, limitSets } from '../db/schema';
import { withLockedRevision } from '../db/revision-lock';
import { latestLimitSetVersion, loadRevisionScope } from '../db/revisions.repo';
import { appendAudit } from '../audit/audit-log';
import { ENGINE_VERSION } from '../calc';
import { ExploreError, checkSweep } from '../calc/explore';
import type { BondingStudy } from '../schemas/bonding-study.schema';
import type { LimitSet } from '../schemas/limit-set.schema';
import type { ExplorationRequest } from '../schemas/exploration.schema';
import { editableStates } from '../workflow/revision.machine';
import { parseStudyInputs } from '../studies/study-input';
import { runExploration, type ExplorationTask } from './run-exploration';

// Exploration jobs: a row per run (status and count done while it runs, the result after),
// run off the request (the runner yields to the event loop between chunks), cancellable, and
// saved with the revision as evidence.

/** Runs at once per revision: each holds a core between chunks, and two is enough to compare. */
const MAX_RUNNING_PER_REVISION = 2;
/** How often progress is written to the job row, ms. */
const PROGRESS_WRITE_MS = 250;
/** Longer than any grid under the limit takes on a busy machine (1,000 points at some 0.2 s each). */
const STALE_MINUTES = 15;

const running = new Map<string, AbortController>();

/** Progress of the runs in this process as it is reported (the event stream pushes it); runs elsewhere are read from their rows. */
const progressEvents = new EventEmitter().setMaxListeners(0);

/** Calls `listener` with each progress report of a run in this process, and with null when it ends; returns the unsubscribe. */
export function onExplorationProgress(id: string, listener: (p: { done: number; total: number } | null) => void): () => void {
  progressEvents.on(id, listener);
  return () => void progressEvents.off(id, listener);
}

function assertEditableBy(actor: SessionUser, revision: { state: string; designerId: string }) {
  if (!editableStates.has(revision.state as never)) throw new AppError('ReadOnly', `The revision is ${revision.state.replace(/_/g, ' ')}: explorations can no longer be saved with it.`);
  if (revision.designerId !== actor.id) throw new AppError('Forbidden', 'Only the designer of this revision can save explorations with it.');
}

const refused = (err: ExploreError) => new AppError('InvalidInput', err.message, [{ field: err.field, message: err.message }]);

function task(request: ExplorationRequest, study: BondingStudy, limits: LimitSet): ExplorationTask {
  switch (request.kind) {
    case 'appraisal':
      return { kind: 'appraisal', study, limits };
    case 'sweep':
      return { kind: 'sweep', study, limits, axes: request.axes };
    case 'tornado':
      return { kind: 'tornado', study, limits, inputs: request.inputs };
    case 'placement':
      return { kind: 'placement', study, limits, request: { windows: request.windows, drumLengthM: request.drumLengthM, minMinorLengthM: request.minMinorLengthM } };
  }
}

/** Starts an exploration of the revision's inputs; returns the job row at once. */
export async function startExploration(s: AppServices, actor: SessionUser, revisionId: string, request: ExplorationRequest) {
  const { revision, study } = await loadRevisionScope(s.db, revisionId);
  if (study.kind !== 'bonding') throw new AppError('StepRefused', 'Design exploration is for bonding studies.');
  const inputs = parseStudyInputs(revision.inputs, 'bonding') as BondingStudy;
  const version = await latestLimitSetVersion(s.db, study.limitSetId);
  const [{ name }] = await s.db.select({ name: limitSets.name }).from(limitSets).where(eq(limitSets.id, study.limitSetId));
  const limits: LimitSet = { name, version: version.version, limits: version.limits };
  let total = 1;
  try {
    if (request.kind === 'sweep') total = checkSweep(inputs, request.axes);
  } catch (err) {
    if (err instanceof ExploreError) throw refused(err);
    throw err;
  }
  // A run whose server stopped never finishes: after STALE_MINUTES it no longer holds a place.
  await s.db
    .update(explorations)
    .set({ status: 'failed', error: 'Interrupted: the server stopped while it ran. Run it again.', finishedAt: new Date() })
    .where(and(eq(explorations.revisionId, revisionId), eq(explorations.status, 'running'), sql`${explorations.createdAt} < now() - make_interval(mins => ${STALE_MINUTES})`));
  const [{ count }] = await s.db.select({ count: sql<number>`count(*)::int` }).from(explorations).where(and(eq(explorations.revisionId, revisionId), eq(explorations.status, 'running')));
  if (count >= MAX_RUNNING_PER_REVISION) throw new AppError('StepRefused', `${count} explorations are already running on this revision: wait for one to finish or cancel it.`);
  const { kind, ...params } = request;
  const [row] = await s.db
    .insert(explorations)
    .values({ revisionId, kind, params, total, inputsHash: revision.inputsHash, engineVersion: ENGINE_VERSION, limitSetVersionId: version.id, createdBy: actor.id })
    .returning();
  void execute(s, row.id, task(request, inputs, limits));
  return row;
}

async function execute(s: AppServices, id: string, t: ExplorationTask) {
  const controller = new AbortController();
  running.set(id, controller);
  let lastWrite = 0;
  let writing: Promise<unknown> = Promise.resolve();
  try {
    const result = await runExploration(t, {
      signal: controller.signal,
      onProgress: ({ done, total }) => {
        progressEvents.emit(id, { done, total });
        const now = Date.now();
        if (now - lastWrite < PROGRESS_WRITE_MS || done === total) return;
        lastWrite = now;
        // A row no longer running was cancelled (perhaps through another server): stop.
        writing = s.db
          .update(explorations)
          .set({ done, total })
          .where(and(eq(explorations.id, id), eq(explorations.status, 'running')))
          .returning({ id: explorations.id })
          .then((rows) => rows.length === 0 && controller.abort())
          .catch(() => undefined);
      },
    });
    await writing;
    await s.db.update(explorations).set({ status: 'done', result, done: sql`${explorations.total}`, finishedAt: new Date() }).where(and(eq(explorations.id, id), eq(explorations.status, 'running')));
  } catch (err) {
    await writing;
    if (controller.signal.aborted) return;
    // Refused as asked: the core's own words (an AppError when it came back from a worker thread).
    const refused = err instanceof ExploreError || (err instanceof AppError && err.errorName === 'InvalidInput');
    const message = refused ? (err as Error).message : 'The exploration failed on the server; it has been logged.';
    if (!refused) console.error('[exploration]', err);
    await s.db.update(explorations).set({ status: 'failed', error: message, finishedAt: new Date() }).where(and(eq(explorations.id, id), eq(explorations.status, 'running'))).catch(() => undefined);
  } finally {
    running.delete(id);
    progressEvents.emit(id, null);
  }
}

async function loadExploration(s: AppServices, revisionId: string, id: string) {
  if (!/^[0-9a-f-]{36}$/i.test(id)) throw new AppError('NotFound', 'There is no exploration with this id.');
  const [row] = await s.db.select().from(explorations).where(and(eq(explorations.id, id), eq(explorations.revisionId, revisionId)));
  if (!row) throw new AppError('NotFound', 'There is no exploration with this id on this revision.');
  return row;
}

export const getExploration = loadExploration;

/** The revision's explorations, newest first, without their results (which can be large). */
export function listExplorations(s: AppServices, revisionId: string) {
  return s.db
    .select({ id: explorations.id, kind: explorations.kind, params: explorations.params, status: explorations.status, done: explorations.done, total: explorations.total, createdAt: explorations.createdAt, savedAt: explorations.savedAt, inputsHash: explorations.inputsHash, engineVersion: explorations.engineVersion })
    .from(explorations)
    .where(eq(explorations.revisionId, revisionId))
    .orderBy(desc(explorations.createdAt));
}

export async function cancelExploration(s: AppServices, revisionId: string, id: string) {
  const row = await loadExploration(s, revisionId, id);
  const [updated] = await s.db.update(explorations).set({ status: 'cancelled', finishedAt: new Date() }).where(and(eq(explorations.id, row.id), eq(explorations.status, 'running'))).returning();
  if (!updated) throw new AppError('StepRefused', `The exploration is ${row.status}, not running: there is nothing to cancel.`);
  running.get(id)?.abort();
  return updated;
}

/** Keeps a finished exploration with the revision (audited); only for the inputs it was run on. */
export async function saveExploration(s: AppServices, actor: SessionUser, revisionId: string, id: string) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    assertEditableBy(actor, revision);
    const [row] = await tx.select().from(explorations).where(and(eq(explorations.id, id), eq(explorations.revisionId, revisionId)));
    if (!row) throw new AppError('NotFound', 'There is no exploration with this id on this revision.');
    if (row.status !== 'done') throw new AppError('StepRefused', `The exploration is ${row.status}: only a finished one can be saved.`);
    if (row.inputsHash !== revision.inputsHash) throw new AppError('StepRefused', 'The inputs changed after this exploration ran: run it again on the current inputs.');
    if (row.savedAt) return row;
    const [saved] = await tx.update(explorations).set({ savedBy: actor.id, savedAt: new Date() }).where(eq(explorations.id, id)).returning();
    await appendAudit(tx, { actorId: actor.id, type: 'exploration.saved', projectId: study.projectId, studyId: study.id, revisionId, detail: { explorationId: id, kind: row.kind, inputsHash: row.inputsHash, engineVersion: row.engineVersion, params: row.params } });
    return saved;
  });
}

/** Records the bonding option chosen from a saved appraisal, with the reason (audited). */
export async function chooseBondingOption(s: AppServices, actor: SessionUser, revisionId: string, choice: { explorationId: string; optionKey: string; reason: string }) {
  return withLockedRevision(s, revisionId, async ({ revision, study }, tx) => {
    assertEditableBy(actor, revision);
    const [row] = await tx.select().from(explorations).where(and(eq(explorations.id, choice.explorationId), eq(explorations.revisionId, revisionId)));
    if (!row || row.kind !== 'appraisal' || !row.savedAt) throw new AppError('InvalidInput', undefined, [{ field: 'explorationId', message: 'Choose from a saved bonding appraisal of this revision.' }]);
    if (row.inputsHash !== revision.inputsHash) throw new AppError('StepRefused', 'The inputs changed after this appraisal ran: run it again on the current inputs.');
    const rows = (row.result as { rows: Array<{ key: string; figures?: unknown }> }).rows;
    if (!rows.some((r) => r.key === choice.optionKey && r.figures)) throw new AppError('InvalidInput', undefined, [{ field: 'optionKey', message: 'This option could not be calculated for the route: choose one that was.' }]);
    const values = { revisionId, explorationId: row.id, optionKey: choice.optionKey, reason: choice.reason, chosenBy: actor.id, chosenAt: new Date() };
    const [saved] = await tx.insert(bondingChoices).values(values).onConflictDoUpdate({ target: bondingChoices.revisionId, set: values }).returning();
    await appendAudit(tx, { actorId: actor.id, type: 'bonding.chosen', projectId: study.projectId, studyId: study.id, revisionId, detail: { option: choice.optionKey, reason: choice.reason, explorationId: row.id } });
    return saved;
  });
}

export async function bondingChoiceOf(s: AppServices, revisionId: string) {
  const [row] = await s.db.select().from(bondingChoices).where(eq(bondingChoices.revisionId, revisionId));
  return row ?? null;
}

// Referenced by the record section: saved explorations in the order they were run.
export function savedExplorations(s: Pick<AppServices, 'db'>, revisionId: string) {
  return s.db.select().from(explorations).where(and(eq(explorations.revisionId, revisionId), sql`${explorations.savedAt} is not null`)).orderBy(explorations.createdAt);
}

