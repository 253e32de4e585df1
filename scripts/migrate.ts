// Applies the committed migrations; with --seed, also loads the demo scenario once.
import { createDatabase } from '../src/lib/db/client';
import { migrateDatabase } from '../src/lib/db/migrate';
import { seedDemo } from './seed-demo';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('DATABASE_URL is not set: run this through npm start or npm test.');

// The seed runs before the build, so dist/workers may be missing or older than the sources:
// its few calculations run on this thread.
process.env.COMPUTE_THREADS ??= '0';
const { db, pool } = createDatabase(url, 2);
try {
  await migrateDatabase(db);
  console.log('[sheathwise] migrations applied');
  if (process.argv.includes('--seed')) {
    const seeded = await seedDemo(db, pool);
    console.log(seeded ? '[sheathwise] demo scenario seeded' : '[sheathwise] demo scenario already present (kept)');
  }
} finally {
  await pool.end();
}
