import type { Database } from '../db/client';
import { loadRevisionScope, loadStudyScope } from '../db/revisions.repo';
import type { ProjectRole } from '../db/schema/projects';

/** Roles that may read a project's studies. */
export const READERS: ProjectRole[] = ['designer', 'checker', 'approver', 'auditor'];
/** Roles that take part in the work (everyone but the auditor). */
export const PARTICIPANTS: ProjectRole[] = ['designer', 'checker', 'approver'];

export const projectOfRevision = async (db: Database, revisionId: string) => (await loadRevisionScope(db, revisionId)).project.id;
export const projectOfStudy = async (db: Database, studyId: string) => (await loadStudyScope(db, studyId)).project.id;
