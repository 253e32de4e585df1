import { and, asc, eq, inArray, like, lte } from 'drizzle-orm';
import { gatherExplorations } from './record-explorations';
import type { Database } from '../db/client';
import { auditEvents, documentNumberPatterns, limitSetVersions, limitSets, revisionFiles, revisions, users } from '../db/schema';
import { revisionDetail } from '../db/revisions.repo';
import { parseStudyInputs } from '../studies/study-input';
import type { Study, StudyResults } from '../calc';
import type { BondingResults } from '../calc/bonding/results';
import type { BondingStudy } from '../schemas/bonding-study.schema';
import type { ObjectStore } from '../storage/object-store';
import { compareMeasurements, parseMeasurements, type Comparison } from '../files/measurements';
import { documentNumber } from '../admin/document-number';
import { compareRevisions } from '../compare/compare.service';
import { xmlSafe } from './xml-safe-text';
import { resultsHash, signOffStanding } from '../workflow/sign-off';
import { committedValidationFile, type RecordValidation } from './record-validation';
import { recordSettingsOf } from '../admin/record-settings.service';

/** Everything a record shows, gathered from the database (and the object store for commissioning readings). */
export async function gatherRecordData(db: Database, revisionId: string, store?: ObjectStore | null, appUrl?: string) {
  const detail = await revisionDetail(db, revisionId);
  const { revision, study, project } = detail;
  const [limitSet] = revision.limitSetVersionId
    ? await db
        .select({ name: limitSets.name, version: limitSetVersions.version, limits: limitSetVersions.limits })
        .from(limitSetVersions)
        .innerJoin(limitSets, eq(limitSets.id, limitSetVersions.limitSetId))
        .where(eq(limitSetVersions.id, revision.limitSetVersionId))
    : [];
  const people = new Map((await db.select({ id: users.id, name: users.name }).from(users)).map((u) => [u.id, u.name]));
  const inputs = parseStudyInputs(revision.inputs, study.kind) as Study;
  const results = (revision.results ?? null) as StudyResults | null;
  const files = await db
    .select()
    .from(revisionFiles)
    .where(and(eq(revisionFiles.revisionId, revisionId), eq(revisionFiles.status, 'stored')))
    .orderBy(asc(revisionFiles.createdAt));
  // The record shows this study's history up to this revision, not what came after.
  const history = await db
    .select({ id: revisions.id, number: revisions.number, state: revisions.state, createdAt: revisions.createdAt, issuedAt: revisions.issuedAt, designerId: revisions.designerId, checkerId: revisions.checkerId, approverId: revisions.approverId })
    .from(revisions)
    .where(and(eq(revisions.studyId, study.id), lte(revisions.number, revision.number)))
    .orderBy(asc(revisions.number));
  const events = history.length
    ? await db
        .select({ at: auditEvents.at, type: auditEvents.type, actorId: auditEvents.actorId, revisionId: auditEvents.revisionId, detail: auditEvents.detail })
        .from(auditEvents)
        .where(and(inArray(auditEvents.revisionId, history.map((h) => h.id)), like(auditEvents.type, 'revision.%')))
        .orderBy(asc(auditEvents.id))
    : [];
  const numberOf = new Map(history.map((h) => [h.id, h.number]));
  const changes = await compareRevisions(db, revisionId, 'previous');
  const explorations = await gatherExplorations(db, revisionId);

  const current = { inputsHash: revision.inputsHash, resultsHash: resultsHash(revision.results) };
  return xmlSafe({
    draft: !['issued', 'superseded'].includes(revision.state),
    documentNumber: await recordDocumentNumber(db, detail),
    project: { code: project.code, name: project.name },
    study: { code: study.code, title: study.title, kind: study.kind },
    revision,
    designerName: people.get(revision.designerId) ?? '',
    limitSet: limitSet ?? null,
    inputs,
    results,
    checklist: detail.checklist,
    remarks: detail.remarks,
    checkValues: detail.checkValues,
    // Each signature with whether it still covers these inputs and results.
    signOffs: detail.signOffs.map((signed) => ({ ...signed, ...signOffStanding(signed, current) })),
    history: history.map((h) => ({ number: h.number, state: h.state, createdAt: h.createdAt, issuedAt: h.issuedAt, designer: people.get(h.designerId) ?? '', checker: h.checkerId ? (people.get(h.checkerId) ?? '') : '', approver: h.approverId ? (people.get(h.approverId) ?? '') : '' })),
    workflowEvents: events.map((e) => ({ at: e.at, revision: numberOf.get(e.revisionId!) ?? 0, type: e.type, actor: e.actorId ? (people.get(e.actorId) ?? '') : 'Sheathwise', reason: typeof (e.detail as { reason?: unknown }).reason === 'string' ? ((e.detail as { reason: string }).reason) : null })),
    files: files.map((f) => ({ fileName: f.fileName, kind: f.kind, sizeBytes: f.sizeBytes, sha256: f.sha256, uploadedBy: people.get(f.uploadedBy) ?? '', createdAt: f.createdAt })),
    commissioning: await commissioning(store, files, inputs, results),
    validation: {
      engineVersion: revision.engineVersion,
      report: committedValidationFile(revision.engineVersion),
      append: (await recordSettingsOf(db)).appendValidation,
      appUrl: appUrl ?? null,
    } satisfies RecordValidation,
    ...(explorations.choice || explorations.saved.length ? { explorations } : {}),
    changes: changes.from ? { fromNumber: changes.from.number, inputChanges: changes.inputChanges, worstChanges: changes.worstChanges.map((w) => w.text), verdictChanges: changes.verdictChanges.map((v) => v.text) } : null,
  });
}

export type RecordData = Awaited<ReturnType<typeof gatherRecordData>>;

type CommissioningFile = { fileName: string; caseId: string | null; rows: Comparison[]; error: string | null };

/** Each commissioning measurement file set beside the calculation (null where no store is at hand). */
async function commissioning(store: ObjectStore | null | undefined, files: Array<{ fileName: string; kind: string; storageKey: string }>, inputs: Study, results: StudyResults | null): Promise<CommissioningFile[] | null> {
  const measured = files.filter((f) => f.kind === 'measurements');
  if (!measured.length) return [];
  if (!store) return null;
  return Promise.all(
    measured.map(async (f): Promise<CommissioningFile> => {
      if (inputs.kind !== 'bonding' || !results || results.kind !== 'bonding') return { fileName: f.fileName, caseId: null, rows: [], error: 'the revision has no bonding calculation to compare with' };
      const parsed = parseMeasurements(new TextDecoder().decode(await store.get(f.storageKey)));
      if ('errors' in parsed) return { fileName: f.fileName, caseId: null, rows: [], error: parsed.errors[0] };
      const c = compareMeasurements(inputs as BondingStudy, results as BondingResults, parsed.rows);
      return { fileName: f.fileName, caseId: c.caseId, rows: c.rows, error: null };
    }),
  );
}

/** The document number of a revision's record, from its project's pattern. */
export async function recordDocumentNumber(db: Database, scope: { project: { id: string; code: string }; study: { code: string }; revision: { number: number } }): Promise<string> {
  const [pattern] = await db.select({ pattern: documentNumberPatterns.pattern }).from(documentNumberPatterns).where(eq(documentNumberPatterns.projectId, scope.project.id));
  return documentNumber(pattern?.pattern, { project: scope.project.code, study: scope.study.code, revision: scope.revision.number });
}
