import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type SQL, sql } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { revisionDetail } from '../../src/lib/db/revisions.repo';
import { revisionDetailBytes } from '../../src/lib/db/revision-detail-bytes';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { demoIds, demoSessions, drive, fixtureInputs, json, readyDraft, send } from '../helpers/workflow-api';

// The revision screen's data is written as JSON by PostgreSQL in one query (revisionDetailBytes).
// It must be exactly what the application's own reading of the rows gives once sent as JSON
// (revisionDetail through JSON.stringify): every field name, timestamp, number and jsonb value.

const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
let auditor: HttpSession;
/** Revisions with each kind of part: sign-offs, remarks and replies, check values, answered checklists; and one never calculated. */
let ids: string[];

beforeAll(async () => {
  const sessions = await demoSessions();
  auditor = sessions.auditor;
  // One revision in check with a remark thread (a reply too), a check value and signed submission.
  const { revisionId: inCheck } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'RD');
  await drive(sessions, inCheck, [['designer', 'submit'], ['checker', 'startCheck']]);
  const thread = await json(await send(sessions.checker, 'POST', `/api/revisions/${inCheck}/remarks`, { body: 'Which survey gave the soil resistivity?' }), 201);
  await json(await send(sessions.designer, 'POST', `/api/revisions/${inCheck}/remarks`, { body: 'The 2025 survey, table 3 (invented for this test).', parentId: thread.id }), 201);
  const target = (await json(await sessions.checker.fetch(`/api/revisions/${inCheck}`), 200)).checklist.find((i: { kind: string; value: number | null }) => i.kind === 'computed' && i.value);
  await json(await send(sessions.checker, 'POST', `/api/revisions/${inCheck}/check-values`, { itemKey: target.itemKey, checkerValue: target.value * 1.01 }), 201);
  // One never calculated.
  const { projectId, limitSetId } = await demoIds(sessions.designer);
  const created = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/studies`, { code: `RDN${process.pid % 1000}${Date.now() % 100000}`, title: 'Never calculated', kind: 'bonding', limitSetId, inputs: fixtureInputs('kestrel-single-point-ecc') }), 201);
  // And the demo's issued revisions (sign-offs of every role, answered checklists).
  const issued = (await db.execute<{ id: string }>(sql`select r.id from revisions r where r.state = 'issued' order by r.created_at limit 3`)).rows.map((r) => r.id);
  ids = [inCheck, created.revision.id, ...issued];
  // Each kind of part is there: the comparison below covers every one.
  const parts = await Promise.all(ids.map((id) => revisionDetail(db, id)));
  expect(parts.some((d) => d.remarks.some((r) => r.parentId))).toBe(true);
  expect(parts.some((d) => d.checkValues.length > 0)).toBe(true);
  expect(parts.some((d) => d.signOffs.some((x) => x.role === 'approver'))).toBe(true);
  expect(parts.some((d) => d.revision.results === null)).toBe(true);
});
afterAll(() => pool.end());

describe('revision detail as JSON written by the database', () => {
  it('equals the rows as the application reads and serialises them', async () => {
    for (const id of ids) {
      const expected = JSON.parse(JSON.stringify(await revisionDetail(db, id)));
      const { projectId, body } = await revisionDetailBytes(db, id);
      expect(projectId).toBe(expected.project.id);
      expect(JSON.parse(body.toString()), `revision ${id}`).toEqual(expected);
    }
  });

  it('answers from memory while nothing it shows has changed, and follows any write to it, by whatever path', async () => {
    const id = ids[0];
    const read = async () => (await revisionDetailBytes(db, id)).body;
    const fresh = async () => JSON.parse(JSON.stringify(await revisionDetail(db, id)));
    const first = await read();
    expect(await read()).toBe(first); // the very bytes kept from the first reading
    const ofRevision = (table: SQL) => sql`(select id from ${table} where revision_id = ${id} order by id limit 1)`;
    const one = async (query: SQL) => (await db.execute<{ v: string }>(query)).rows[0].v;
    // The thread was started by the checker, who has not signed; the designer replied and signed the submission.
    const remarker = await one(sql`select author_id as v from remarks where revision_id = ${id} and parent_id is null`);
    const signer = await one(sql`select user_id as v from sign_offs where revision_id = ${id}`);
    expect(await one(sql`select count(*)::text as v from sign_offs where revision_id = ${id} and user_id = ${remarker}`)).toBe('0');
    const names = (await db.execute<{ id: string; name: string }>(sql`select id, name from users`)).rows;
    const project = await one(sql`select s.project_id as v from studies s join revisions r on r.study_id = s.id where r.id = ${id}`);
    const projectName = await one(sql`select name as v from projects where id = ${project}`);
    // Written behind the application's back, as a migration or an administrator might: no code path raises anything.
    const writes: [string, SQL][] = [
      ['the revision', sql`update revisions set updated_at = updated_at + interval '1 second' where id = ${id}`],
      ['its study', sql`update studies set title = title || ' (renamed)' where id = (select study_id from revisions where id = ${id})`],
      ['its project', sql`update projects set name = name || ' (renamed)' where id = ${project}`],
      ['a checklist item', sql`update checklist_items set title = title || ' (reworded)' where id = ${ofRevision(sql`checklist_items`)}`],
      ['a check value', sql`update check_values set explanation = 'Hand calculation, second sheet' where id = ${ofRevision(sql`check_values`)}`],
      ['the name beside a remark (of someone who has not signed)', sql`update users set name = name || ' (renamed)' where id = ${remarker}`],
      ['a remark taken away (the signer\'s reply)', sql`delete from remarks where revision_id = ${id} and parent_id is not null and author_id = ${signer}`],
      ['the name beside a sign-off (of someone with no remark left)', sql`update users set name = name || ' (renamed)' where id = ${signer}`],
      ['a remark added', sql`insert into remarks (revision_id, author_id, body) values (${id}, ${remarker}, 'Added directly')`],
    ];
    try {
      for (const [what, write] of writes) {
        expect((await db.execute(write)).rowCount, what).toBe(1);
        const body = await read();
        expect(JSON.parse(body.toString()), `after a write to ${what}`).toEqual(await fresh());
        expect(await read(), what).toBe(body);
      }
    } finally {
      // Other tests know the demo's people and project by name.
      for (const { id: userId, name } of names) await db.execute(sql`update users set name = ${name} where id = ${userId} and name <> ${name}`);
      await db.execute(sql`update projects set name = ${projectName} where id = ${project}`);
    }
  });

  it('is what the API answers, to anyone who may read the project', async () => {
    for (const id of ids.slice(0, 3)) {
      expect(await json(await auditor.fetch(`/api/revisions/${id}`), 200)).toEqual(JSON.parse(JSON.stringify(await revisionDetail(db, id))));
    }
    expect(await json(await auditor.fetch('/api/revisions/00000000-0000-4000-8000-000000000000'), 404)).toMatchObject({ error: 'NotFound' });
  });
});
