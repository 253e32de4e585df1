import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { migrateDatabase } from '../../src/lib/db/migrate';
import { scratchDatabase } from '../helpers/scratch-database';

// Asset codes unique whatever their case: the migrations meet a database whose register already
// holds codes that differ only in case. They must stop naming each clash and change nothing,
// then pass once people have renamed one asset of the pair.

const scratch = scratchDatabase('asset_codes');
const CHECK_TAG = 'asset_code_case_clash_check';

/** A copy of drizzle/ whose journal stops before the clash check (the lead may renumber it). */
function foldersBeforeCheck() {
  const dir = mkdtempSync(join(tmpdir(), 'sheathwise-migrations-'));
  cpSync('drizzle', dir, { recursive: true });
  const journalPath = join(dir, 'meta', '_journal.json');
  const journal = JSON.parse(readFileSync(journalPath, 'utf8')) as { entries: Array<{ tag: string }> };
  const at = journal.entries.findIndex((e) => e.tag.endsWith(CHECK_TAG));
  expect(at).toBeGreaterThan(0);
  writeFileSync(journalPath, JSON.stringify({ ...journal, entries: journal.entries.slice(0, at) }));
  return dir;
}

describe('asset codes unique whatever their case, on a database that already has clashes', () => {
  const before = foldersBeforeCheck();

  afterAll(async () => {
    await scratch.drop();
    rmSync(before, { recursive: true, force: true });
  });

  it('stops naming the clashes and changing nothing; passes once one asset is renamed; then refuses a new clash', async () => {
    const { db, pool } = await scratch.open();
    try {
      await migrateDatabase(db, before);
      const [{ id: userId }] = (await pool.query(`insert into users (email, name) values ('clash@example.test', 'Clash (invented)') returning id`)).rows;
      const [{ id: projectId }] = (await pool.query(`insert into projects (code, name) values ('CLASH', 'Clash project (invented)') returning id`)).rows;
      const add = async (code: string, removed = false) =>
        (await pool.query(`insert into assets (project_id, kind, site_kind, code, name, owner_standard, created_by, removed_at) values ($1, 'site', 'link-box-group', $2, $2, 'Invented', $3, $4) returning id`, [projectId, code, userId, removed ? new Date() : null])).rows[0].id as string;
      const upper = await add('LBX-01');
      const lower = await add('lbx-01');
      await add('Lbx-01', true); // removed: no longer in the register, so no clash
      await add('LBX-02');

      // Drizzle wraps PostgreSQL's error ("Failed query: …"); the database's own message is its cause.
      const failure = await migrateDatabase(db).then(() => null, (e: Error & { cause?: Error }) => e);
      expect(failure?.cause?.message).toMatch(/^Asset codes that differ only in case: project CLASH: LBX-01 \(asset [0-9a-f-]+\), lbx-01 \(asset [0-9a-f-]+\)\. Rename or remove one asset of each group in the register, then migrate again\.$/);
      // Nothing applied: the old index stands, the new one is absent, the codes are as they were.
      const indexes = async () => (await pool.query(`select indexname from pg_indexes where tablename = 'assets' order by indexname`)).rows.map((r) => r.indexname);
      expect(await indexes()).toContain('assets_project_code_live_idx');
      expect(await indexes()).not.toContain('assets_project_code_ci_live_idx');
      expect((await pool.query(`select code from assets where id = any($1) order by code`, [[upper, lower]])).rows.map((r) => r.code)).toEqual(['LBX-01', 'lbx-01']);

      await pool.query(`update assets set code = 'LBX-01A' where id = $1`, [lower]);
      await migrateDatabase(db);
      expect(await indexes()).toContain('assets_project_code_ci_live_idx');
      await expect(add('lbx-02')).rejects.toThrow(/assets_project_code_ci_live_idx/);
      // A removed asset's code, in any case, is free again.
      await pool.query(`update assets set removed_at = now() where project_id = $1 and code = 'LBX-02'`, [projectId]);
      expect(await add('lbx-02')).toMatch(/^[0-9a-f-]{36}$/);
    } finally {
      await pool.end();
    }
  });
});
