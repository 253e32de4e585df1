import { and, eq, inArray, or } from 'drizzle-orm';
import type { Database } from '../db/client';
import { assetObligations, obligationRecords, obligationTypes, type Asset } from '../db/schema';
import { nextDueOn } from './due-dates';

/** The obligation types an asset owes: those of its owner standard that apply to its kind. */
export function owedTypesOf(tx: Database, asset: Pick<Asset, 'ownerStandard' | 'kind'>) {
  return tx
    .select()
    .from(obligationTypes)
    .where(and(eq(obligationTypes.ownerStandard, asset.ownerStandard), or(eq(obligationTypes.appliesTo, asset.kind), eq(obligationTypes.appliesTo, 'both'))));
}

/**
 * Recomputes an asset's standing against the given obligation types (all it owes when omitted)
 * from its records, inside the caller's transaction: the register reads these rows.
 */
export async function refreshStanding(tx: Database, asset: Asset, typeIds?: string[]): Promise<void> {
  const owed = (await owedTypesOf(tx, asset)).filter((t) => !typeIds || typeIds.includes(t.id));
  if (!owed.length) return;
  const records = await tx
    .select({ obligationTypeId: obligationRecords.obligationTypeId, doneOn: obligationRecords.doneOn, result: obligationRecords.result })
    .from(obligationRecords)
    .where(and(eq(obligationRecords.assetId, asset.id), inArray(obligationRecords.obligationTypeId, owed.map((t) => t.id))));
  for (const type of owed) {
    const mine = records.filter((r) => r.obligationTypeId === type.id);
    const latest = [...mine].sort((a, b) => b.doneOn.localeCompare(a.doneOn))[0];
    const row = { lastDoneOn: latest?.doneOn ?? null, lastResult: latest?.result ?? null, nextDueOn: nextDueOn(type, asset.inServiceOn, mine) };
    await tx
      .insert(assetObligations)
      .values({ assetId: asset.id, obligationTypeId: type.id, ...row })
      .onConflictDoUpdate({ target: [assetObligations.assetId, assetObligations.obligationTypeId], set: row });
  }
}
