import { and, eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { recomputations } from '../db/schema';
import { ENGINE_VERSION } from '../calc';

/** The results hash a fresh calculation gave for these inputs with this engine, if one is known. */
export async function knownRecomputation(db: Database, inputsHash: string): Promise<string | null> {
  const [row] = await db.select({ resultsHash: recomputations.resultsHash }).from(recomputations).where(and(eq(recomputations.inputsHash, inputsHash), eq(recomputations.engineVersion, ENGINE_VERSION)));
  return row?.resultsHash ?? null;
}

/** Keeps what a fresh calculation gave (the first one stays: the engine is deterministic for one version). */
export async function rememberRecomputation(db: Database, inputsHash: string, resultsHash: string): Promise<void> {
  await db.insert(recomputations).values({ inputsHash, engineVersion: ENGINE_VERSION, resultsHash }).onConflictDoNothing();
}
