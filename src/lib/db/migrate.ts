import { migrate } from 'drizzle-orm/node-postgres/migrator';
import type { Database } from './client';

/** Applies the committed migrations in drizzle/ (idempotent). */
export async function migrateDatabase(db: Database, migrationsFolder = 'drizzle'): Promise<void> {
  await migrate(db, { migrationsFolder });
}
