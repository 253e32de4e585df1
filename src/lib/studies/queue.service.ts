import { type SQL, type SQLWrapper, and, count, desc, eq, inArray, ne, or, sql } from 'drizzle-orm';
import type { Database } from '../db/client';
import { projects, revisions, studies } from '../db/schema';
import { decodeCursor, encodeCursor } from '../db/keyset-cursor';
import { snapshotCache } from '../db/snapshot-cache';
import { perHandle } from '../db/per-handle';
import type { SessionUser } from '../auth/roles';

/** A revision that waited longer than this in someone's queue is shown as overdue. */
export const OVERDUE_DAYS = 5;

/** A queue lists this many at a time, those that have waited longest first; its total is given beside. */
export const QUEUE_PAGE = 20;

/** Totals are counted up to this; past it a queue says "at least": counting ten thousand drafts on every visit is not worth it. */
export const QUEUE_COUNT_UP_TO = 200;

export const queueRoles = ['designer', 'checker', 'approver'] as const;
export type QueueRole = (typeof queueRoles)[number];

const LABELS: Record<QueueRole, string> = {
  designer: 'Your drafts and returned revisions',
  checker: 'Waiting for your check',
  approver: 'Waiting for your approval',
};

// Every query here is prepared once per database handle, with the person, their projects and the
// position as parameters: Drizzle builds and PostgreSQL parses each once, not on every visit to
// the home page (PostgreSQL still plans each call; see DEVELOPERS.md, Planning).
const me = sql.placeholder('user');
const inProjects = sql`${studies.projectId} = any(${sql.placeholder('projects')}::uuid[])`;

/** What puts a revision in the user's queue for a role. */
function waitingFor(role: QueueRole): SQL | undefined {
  switch (role) {
    case 'designer':
      return and(eq(revisions.designerId, me), inArray(revisions.state, ['draft', 'returned']));
    case 'checker':
      return or(and(eq(revisions.state, 'ready_for_check'), ne(revisions.designerId, me)), and(eq(revisions.state, 'in_check'), eq(revisions.checkerId, me)));
    case 'approver':
      return and(eq(revisions.state, 'checked'), ne(revisions.designerId, me));
  }
}

// The project's name comes from a scalar subquery rather than a third join: PostgreSQL plans every
// call of these (custom plans), and a join more costs more planning than the lookup costs running.
const projectName = (projectId: SQLWrapper) => sql<string>`(select ${projects.name} from ${projects} where ${projects.id} = ${projectId})`;

const rowShape = {
  revisionId: revisions.id,
  projectId: studies.projectId,
  studyCode: studies.code,
  studyTitle: studies.title,
  revisionNumber: revisions.number,
  state: revisions.state,
  updatedAt: revisions.updatedAt,
  // The position as text keeps the microseconds a Date would drop.
  position: sql<string>`${revisions.updatedAt}::text`.as('position'),
};

const overdue = (d: Date) => Date.now() - d.getTime() > OVERDUE_DAYS * 86_400_000;
/** Whether each row is overdue, decided now. */
const withOverdue = <T extends { updatedAt: Date }>(items: T[]) => items.map((i) => ({ ...i, overdue: overdue(i.updatedAt) }));
const mark = <T extends { updatedAt: Date; position: string }>(rows: T[]) => withOverdue(rows.map(({ position: _position, ...r }) => r));
const projectsAs = (user: SessionUser, role: string) => Object.entries(user.projectRoles).filter(([, r]) => r.includes(role as never)).map(([id]) => id);
const rows = (db: Database, where: SQL | undefined) =>
  db.select({ ...rowShape, projectName: projectName(studies.projectId) }).from(revisions).innerJoin(studies, eq(studies.id, revisions.studyId)).where(where);

function queueQueries(db: Database, role: QueueRole) {
  const where = and(inProjects, waitingFor(role));
  const oldestFirst = [revisions.updatedAt, revisions.id] as const;
  // The first page and the total in one statement: the queue's oldest rows up to the counting
  // limit, counted, of which the first page is named and returned.
  const upToLimit = db.select(rowShape).from(revisions).innerJoin(studies, eq(studies.id, revisions.studyId)).where(where).orderBy(...oldestFirst).limit(sql.placeholder('countLimit')).as('up_to_limit');
  const counted = db.select({ ...upToLimit._.selectedFields, counted: sql<number>`count(*) over ()`.mapWith(Number).as('counted') }).from(upToLimit).as('counted');
  // After a position: the next page, and the total apart.
  const from = sql`(${revisions.updatedAt}, ${revisions.id}) > (${sql.placeholder('key')}::timestamptz, ${sql.placeholder('id')}::uuid)`;
  const waiting = db.select({ one: sql`1` }).from(revisions).innerJoin(studies, eq(studies.id, revisions.studyId)).where(where).limit(sql.placeholder('countLimit'));
  return {
    first: db.select({ ...counted._.selectedFields, projectName: projectName(counted.projectId) }).from(counted).orderBy(counted.updatedAt, counted.revisionId).limit(QUEUE_PAGE + 1).prepare(`queue_${role}_first`),
    page: rows(db, and(where, from)).orderBy(...oldestFirst).limit(QUEUE_PAGE + 1).prepare(`queue_${role}_page`),
    count: db.select({ counted: count() }).from(waiting.as('waiting')).prepare(`queue_${role}_count`),
  };
}
const recentQuery = (db: Database) => rows(db, inProjects).orderBy(desc(revisions.updatedAt)).limit(8).prepare('queue_recent');

const queries = perHandle((db) => ({ recent: recentQuery(db), designer: queueQueries(db, 'designer'), checker: queueQueries(db, 'checker'), approver: queueQueries(db, 'approver') }));

/** The first page (and the count, up to the limit) in one call, or a later page and the count apart. */
async function pageAndCount(db: Database, user: SessionUser, role: QueueRole, projectIds: string[], countLimit: number, after?: [string, string]) {
  const q = queries(db)[role];
  if (!after) {
    const page = await q.first.execute({ user: user.id, projects: projectIds, countLimit });
    return { page: page.map(({ counted: _counted, ...row }) => row), counted: page[0]?.counted ?? 0 };
  }
  const [key, id] = after;
  const [page, [{ counted }]] = await Promise.all([q.page.execute({ user: user.id, projects: projectIds, key, id }), q.count.execute({ user: user.id, projects: projectIds, countLimit })]);
  return { page, counted };
}

/**
 * One page of the user's queue in a role, longest waiting first, with the queue's total (or, past
 * `countUpTo`, that it holds at least that many) and the position of the next page (null at the
 * end). A queue can be long (a designer with thousands of drafts), so it is paged by position,
 * like the studies table.
 */
export async function queuePage(db: Database, user: SessionUser, role: QueueRole, after?: string, countUpTo = QUEUE_COUNT_UP_TO) {
  const order = `queue ${role}`;
  let position: [string, string] | undefined;
  if (after) {
    const [[key], id] = decodeCursor(after, order, ['timestamptz'], 'this queue');
    position = [key, id];
  }
  const projectIds = projectsAs(user, role);
  if (!projectIds.length) return { role, label: LABELS[role], items: [], total: 0, totalAtLeast: false, next: null };
  const { page, counted } = await pageAndCount(db, user, role, projectIds, countUpTo + 1, position);
  const shown = page.slice(0, QUEUE_PAGE);
  const last = shown.at(-1);
  return {
    role,
    label: LABELS[role],
    items: mark(shown),
    total: Math.min(counted, countUpTo),
    totalAtLeast: counted > countUpTo,
    next: page.length > QUEUE_PAGE && last ? encodeCursor(order, [last.position], last.revisionId) : null,
  };
}

const queues = snapshotCache<Awaited<ReturnType<typeof readMyQueue>>>(16 * 1024 * 1024);

async function readMyQueue(db: Database, user: SessionUser) {
  const all = Object.keys(user.projectRoles);
  const [waiting, recent] = await Promise.all([
    Promise.all(queueRoles.filter((role) => projectsAs(user, role).length).map((role) => queuePage(db, user, role))),
    all.length ? queries(db).recent.execute({ projects: all }).then(mark) : [],
  ]);
  return { waiting, recent };
}

/**
 * What waits for the user in each of their roles (the first page of each), and recent activity in
 * their projects. Kept until the database next changes (see snapshotCache): the home page is
 * opened far more often than revisions move. Whether a row is overdue is decided as it is sent.
 */
export async function myQueue(db: Database, user: SessionUser) {
  const { waiting, recent } = await queues(db, `${user.id} ${JSON.stringify(user.projectRoles)}`, () => readMyQueue(db, user));
  return { waiting: waiting.map((w) => ({ ...w, items: withOverdue(w.items) })), recent: withOverdue(recent) };
}
