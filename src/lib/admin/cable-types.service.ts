import { asc } from 'drizzle-orm';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import { cableTypes } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';
import type { CableType } from '../schemas/bonding-study.schema';

export async function listCableTypes(db: Database) {
  return db.select().from(cableTypes).orderBy(asc(cableTypes.code));
}

/** Adds a cable type to the catalogue; its code must be new. */
export async function addCableType(s: Pick<AppServices, 'pool'>, admin: SessionUser | null, data: CableType) {
  return inTransaction(s.pool, async (tx) => {
    const [row] = await tx.insert(cableTypes).values({ code: data.id, data }).onConflictDoNothing().returning();
    if (!row) throw new AppError('InvalidInput', undefined, [{ field: 'id', message: `The catalogue already has a cable type ${data.id}.` }]);
    await appendAudit(tx, { actorId: admin?.id ?? null, type: 'cable-type.added', detail: { ...data } });
    return row;
  });
}
