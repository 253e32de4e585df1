import { desc, eq } from 'drizzle-orm';
import type { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import { limitSetVersions, limitSets } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import type { limitSetVersionSchema } from '../schemas/limit-set.schema';
import { jsonDiff } from '../json-diff';

/** Every limit set with its latest version. */
export async function listLimitSets(db: Database) {
  const sets = await db.select().from(limitSets).orderBy(limitSets.name);
  return Promise.all(
    sets.map(async (set) => {
      const [latest] = await db.select().from(limitSetVersions).where(eq(limitSetVersions.limitSetId, set.id)).orderBy(desc(limitSetVersions.version)).limit(1);
      return { ...set, latest: latest ?? null };
    }),
  );
}

/** Publishes a new version of a limit set; earlier versions stay as they were for the revisions checked against them. */
export async function publishLimitSetVersion(s: AppServices, admin: SessionUser | null, limitSetId: string, body: z.output<typeof limitSetVersionSchema>) {
  return inTransaction(s.pool, async (tx) => {
    const [set] = await tx.select().from(limitSets).where(eq(limitSets.id, limitSetId)).for('update');
    if (!set) throw new AppError('NotFound', 'There is no limit set with this id.');
    const [previous] = await tx.select().from(limitSetVersions).where(eq(limitSetVersions.limitSetId, limitSetId)).orderBy(desc(limitSetVersions.version)).limit(1);
    const [version] = await tx
      .insert(limitSetVersions)
      .values({ limitSetId, version: (previous?.version ?? 0) + 1, limits: body.limits, manualItems: body.manualItems, checkTolerancePct: body.checkTolerancePct, createdBy: admin?.id ?? null })
      .returning();
    await appendAudit(tx, { actorId: admin?.id ?? null, type: 'limit-set.published', detail: { limitSet: set.name, version: version.version, changes: jsonDiff(previous ? { limits: previous.limits, manualItems: previous.manualItems, checkTolerancePct: previous.checkTolerancePct } : {}, body) } });
    return version;
  });
}
