import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { revisionDetail, revisionDetailBytes } from '../../src/lib/db/revisions.repo';
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

  it('is what the API answers, to anyone who may read the project', async () => {
    for (const id of ids.slice(0, 3)) {
      expect(await json(await auditor.fetch(`/api/revisions/${id}`), 200)).toEqual(JSON.parse(JSON.stringify(await revisionDetail(db, id))));
    }
    expect(await json(await auditor.fetch('/api/revisions/00000000-0000-4000-8000-000000000000'), 404)).toMatchObject({ error: 'NotFound' });
  });
});
