import { eq } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { documentNumberPatterns, projects } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import { AppError } from '../errors';
import { DEFAULT_DOCUMENT_NUMBER_PATTERN, documentNumber } from './document-number';

/** The project's document-number pattern (the default when none is set) and an example. */
export async function projectDocumentNumberPattern(db: Database, projectId: string) {
  const [project] = await db.select({ code: projects.code }).from(projects).where(eq(projects.id, projectId));
  if (!project) throw new AppError('NotFound', 'There is no project with this id.');
  const [row] = await db.select().from(documentNumberPatterns).where(eq(documentNumberPatterns.projectId, projectId));
  const pattern = row?.pattern ?? DEFAULT_DOCUMENT_NUMBER_PATTERN;
  return { pattern, isDefault: !row, example: documentNumber(pattern, { project: project.code, study: 'B10', revision: 3 }) };
}

/** Sets the pattern; records already issued keep the number they were issued with. */
export async function setDocumentNumberPattern(s: AppServices, admin: SessionUser, projectId: string, pattern: string) {
  return inTransaction(s.pool, async (tx) => {
    const [project] = await tx.select({ id: projects.id }).from(projects).where(eq(projects.id, projectId));
    if (!project) throw new AppError('NotFound', 'There is no project with this id.');
    const [before] = await tx.select().from(documentNumberPatterns).where(eq(documentNumberPatterns.projectId, projectId)).for('update');
    await tx
      .insert(documentNumberPatterns)
      .values({ projectId, pattern, updatedBy: admin.id, updatedAt: new Date() })
      .onConflictDoUpdate({ target: documentNumberPatterns.projectId, set: { pattern, updatedBy: admin.id, updatedAt: new Date() } });
    await appendAudit(tx, { actorId: admin.id, type: 'project.document-number-pattern-set', projectId, detail: { from: before?.pattern ?? DEFAULT_DOCUMENT_NUMBER_PATTERN, to: pattern } });
  });
}
