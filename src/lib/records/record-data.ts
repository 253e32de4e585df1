import { eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { limitSetVersions, limitSets } from '../db/schema';
import { revisionDetail } from '../db/revisions.repo';
import { parseStudyInputs } from '../studies/study-input';
import type { Study, StudyResults } from '../calc';
import { xmlSafe } from './xml-safe-text';

/** Everything a record shows, gathered from the database. */
export async function gatherRecordData(db: Database, revisionId: string) {
  const detail = await revisionDetail(db, revisionId);
  const [limitSet] = detail.revision.limitSetVersionId
    ? await db
        .select({ name: limitSets.name, version: limitSetVersions.version })
        .from(limitSetVersions)
        .innerJoin(limitSets, eq(limitSets.id, limitSetVersions.limitSetId))
        .where(eq(limitSetVersions.id, detail.revision.limitSetVersionId))
    : [];
  // The record boundary: whatever text was stored, the document must be well-formed XML.
  return xmlSafe({
    draft: !['issued', 'superseded'].includes(detail.revision.state),
    project: { code: detail.project.code, name: detail.project.name },
    study: { code: detail.study.code, title: detail.study.title, kind: detail.study.kind },
    revision: detail.revision,
    limitSet: limitSet ?? null,
    inputs: parseStudyInputs(detail.revision.inputs, detail.study.kind) as Study,
    results: (detail.revision.results ?? null) as StudyResults | null,
    checklist: detail.checklist,
    remarks: detail.remarks,
    checkValues: detail.checkValues,
    signOffs: detail.signOffs,
  });
}

export type RecordData = Awaited<ReturnType<typeof gatherRecordData>>;
