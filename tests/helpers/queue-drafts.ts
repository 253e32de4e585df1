import { sql } from 'drizzle-orm';
import type { Database } from '../../src/lib/db/client';
import { QUEUE_PAGE } from '../../src/lib/studies/queue.service';
import type { HttpSession } from './http-session';
import { DEMO, demoIds, fixtureInputs, json, send } from './workflow-api';

/** The demo designer's waiting drafts and returned revisions, as the database counts them. */
export async function designerWaiting(db: Database): Promise<number> {
  const { rows } = await db.execute<{ n: number }>(sql`select count(*)::int as n from revisions r join users u on u.id = r.designer_id where u.email = ${DEMO.designer} and r.state in ('draft', 'returned')`);
  return rows[0].n;
}

/** Enough new drafts that the designer's queue runs past its first page (the suite's other tests may have made some already). */
export async function fillDesignerQueue(designer: HttpSession, db: Database, atLeast = QUEUE_PAGE + 5): Promise<void> {
  const { projectId, limitSetId } = await demoIds(designer);
  const stamp = `Q${process.pid % 1000}${Date.now() % 100000}`;
  for (let n = await designerWaiting(db); n < atLeast; n++) {
    await json(await send(designer, 'POST', `/api/projects/${projectId}/studies`, { code: `${stamp}-${n}`, title: `Queue filler ${n}`, kind: 'bonding', limitSetId, inputs: fixtureInputs('kestrel-single-point-ecc') }), 201);
  }
}
