import { afterAll, describe, expect, it } from 'vitest';
import { migrateDatabase } from '../../src/lib/db/migrate';
import { scratchDatabase } from '../helpers/scratch-database';

const scratch = scratchDatabase('migrations');

describe('migrations', () => {
  afterAll(() => scratch.drop());

  it('apply on an empty database, and again without change', async () => {
    const { db, pool } = await scratch.open();
    try {
      await migrateDatabase(db);
      await migrateDatabase(db);
      const { rows } = await pool.query(
        `select table_name from information_schema.tables where table_schema = 'public' order by table_name`,
      );
      expect(rows.map((r) => r.table_name)).toEqual(expect.arrayContaining(['memberships', 'projects', 'users']));
    } finally {
      await pool.end();
    }
  });
});
