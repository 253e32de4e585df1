import pg from 'pg';
import { createDatabase } from '../../src/lib/db/client';
import { testEnv } from './env';

/**
 * A database of its own on the suite's PostgreSQL cluster, for tests of migrations: created on
 * `open()`, dropped (with its connections) by `drop()`.
 */
export function scratchDatabase(prefix: string) {
  const name = `${prefix}_${process.pid}_${Date.now()}`;
  const adminUrl = testEnv().databaseUrl;
  const admin = new pg.Client({ connectionString: adminUrl });
  return {
    async open() {
      await admin.connect();
      await admin.query(`create database ${name}`);
      const url = new URL(adminUrl);
      url.pathname = `/${name}`;
      return createDatabase(url.toString(), 2);
    },
    async drop() {
      await admin.query(`drop database if exists ${name} with (force)`);
      await admin.end();
    },
  };
}
