import { afterAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { createDatabase } from '../../src/lib/db/client';
import { migrateDatabase } from '../../src/lib/db/migrate';
import { testEnv } from '../helpers/env';

const name = `migrations_${process.pid}_${Date.now()}`;
const adminUrl = testEnv().databaseUrl;

describe('migrations', () => {
  const admin = new pg.Client({ connectionString: adminUrl });

  afterAll(async () => {
    await admin.query(`drop database if exists ${name} with (force)`);
    await admin.end();
  });

  it('apply on an empty database, and again without change', async () => {
    await admin.connect();
    await admin.query(`create database ${name}`);
    const url = new URL(adminUrl);
    url.pathname = `/${name}`;
    const { db, pool } = createDatabase(url.toString(), 2);
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
