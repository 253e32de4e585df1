import { eq } from 'drizzle-orm';
import { z } from 'zod';
import type { AppServices } from '../services';
import type { SessionUser } from '../auth/roles';
import type { Database } from '../db/client';
import { recordSettings } from '../db/schema';
import { inTransaction } from '../db/transaction';
import { appendAudit } from '../audit/audit-log';

const ROW = 'records';

export const recordSettingsSchema = z.strictObject({
  appendValidation: z.boolean({ error: 'appendValidation: true to append the validation table to records, false to link to it.' }),
});

export type RecordSettings = z.output<typeof recordSettingsSchema>;

/** The installation's record settings; the defaults until an administrator sets them. */
export async function recordSettingsOf(db: Database): Promise<RecordSettings> {
  const [row] = await db.select({ appendValidation: recordSettings.appendValidation }).from(recordSettings).where(eq(recordSettings.id, ROW));
  return { appendValidation: row?.appendValidation ?? false };
}

/** Sets them; records already issued keep what they were issued with. */
export async function setRecordSettings(s: AppServices, admin: SessionUser, settings: RecordSettings): Promise<RecordSettings> {
  return inTransaction(s.pool, async (tx) => {
    const [before] = await tx.select().from(recordSettings).where(eq(recordSettings.id, ROW)).for('update');
    await tx
      .insert(recordSettings)
      .values({ id: ROW, appendValidation: settings.appendValidation, updatedBy: admin.id, updatedAt: new Date() })
      .onConflictDoUpdate({ target: recordSettings.id, set: { appendValidation: settings.appendValidation, updatedBy: admin.id, updatedAt: new Date() } });
    await appendAudit(tx, { actorId: admin.id, type: 'record-settings.set', detail: { appendValidation: { from: before?.appendValidation ?? false, to: settings.appendValidation } } });
    return recordSettingsOf(tx);
  });
}
