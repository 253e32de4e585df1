import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, desc, eq, inArray, isNull, like, or, sql } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents } from '../../src/lib/db/schema';
import { testEnv } from '../helpers/env';
import { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoIds, demoSessions, json } from '../helpers/workflow-api';
import { makeOutsider, type Outsider } from './outsider.fixture';

// The audit trail is scoped by project: a reader sees the events of the projects they are a
// member of, plus the shared limit-set, cable-type and obligation-type events; administrators see everything.
// Verification still walks the whole chain, which runs across projects.

interface Row {
  id: number;
  type: string;
  projectId: string | null;
  actorId: string | null;
}

describe('audit trail scoped by project', () => {
  const { db, pool } = createDatabase(testEnv().databaseUrl, 2);
  let sessions: Record<DemoRole, HttpSession>;
  let outsider: Outsider;
  let demoProjectId: string;

  const shared = or(like(auditEvents.type, 'limit-set.%'), like(auditEvents.type, 'cable-type.%'), like(auditEvents.type, 'obligation-type.%'));
  /** What a member of these projects should see, counted straight from the table. */
  const expectedCount = async (projectIds: string[]) =>
    (await db.select({ n: sql<number>`count(*)::int` }).from(auditEvents).where(or(inArray(auditEvents.projectId, projectIds), and(isNull(auditEvents.projectId), shared))))[0].n;
  // A record job may append an event between the two reads; read again until they agree.
  const settled = async <T extends { total: number }>(read: () => Promise<T>, expected: () => Promise<number>) => {
    for (let attempt = 0; ; attempt++) {
      const [got, want] = [await read(), await expected()];
      if (got.total === want || attempt === 3) return { ...got, want };
    }
  };
  const allEvents = async (s: HttpSession, query = '') => {
    const first = await json(await s.fetch(`/api/audit?pageSize=100${query}`), 200);
    const events: Row[] = [...first.events];
    for (let page = 1; events.length < first.total; page++) events.push(...(await json(await s.fetch(`/api/audit?pageSize=100&page=${page}${query}`), 200)).events);
    return { total: first.total as number, events };
  };

  beforeAll(async () => {
    sessions = await demoSessions();
    demoProjectId = (await demoIds(sessions.designer)).projectId;
    outsider = await makeOutsider();
  });
  afterAll(async () => pool.end());

  it('shows an outsider only their own project and the shared reference data, in the list, the filters and the export', async () => {
    const { total, events, want } = await settled(() => allEvents(outsider.session), () => expectedCount([outsider.projectId]));
    expect(total).toBe(want);
    expect(events.some((e) => e.projectId === outsider.projectId && e.type === 'study.created')).toBe(true);
    for (const e of events) expect(e.projectId === outsider.projectId || (e.projectId === null && /^(limit-set|cable-type|obligation-type)\./.test(e.type)), JSON.stringify(e)).toBe(true);

    // Asking for the demo project by name, or for one of its revisions, finds nothing.
    expect((await json(await outsider.session.fetch(`/api/audit?projectId=${demoProjectId}`), 200)).total).toBe(0);
    const [demoEvent] = await db.select().from(auditEvents).where(and(eq(auditEvents.projectId, demoProjectId), sql`${auditEvents.revisionId} is not null`)).orderBy(desc(auditEvents.id)).limit(1);
    expect((await json(await outsider.session.fetch(`/api/audit?revisionId=${demoEvent.revisionId}`), 200)).total).toBe(0);

    const csv = await (await outsider.session.fetch('/api/audit/export')).text();
    expect(csv.trim().split('\r\n')).toHaveLength(total + 1);
    expect(csv).not.toContain(demoProjectId);

    // The person filter lists only people who appear in the visible events.
    const facets = await json(await outsider.session.fetch('/api/audit/facets'), 200);
    const visibleActors = new Set(events.map((e) => e.actorId));
    expect(facets.people.length).toBeGreaterThan(0);
    for (const p of facets.people) expect(visibleActors.has(p.id), p.name).toBe(true);
    const demoTypes = (await db.selectDistinct({ type: auditEvents.type }).from(auditEvents).where(eq(auditEvents.projectId, demoProjectId))).map((r) => r.type);
    const visibleTypes = new Set(events.map((e) => e.type));
    for (const t of facets.types) expect(visibleTypes.has(t), t).toBe(true);
    expect(demoTypes.filter((t) => !visibleTypes.has(t)).length).toBeGreaterThan(0);
  });

  it('keeps the outsider project out of the demo auditor\'s trail, and account events with administrators', async () => {
    const { total, events, want } = await settled(() => allEvents(sessions.auditor), () => expectedCount([demoProjectId]));
    expect(total).toBe(want);
    expect(events.some((e) => e.projectId === outsider.projectId)).toBe(false);
    expect(events.some((e) => e.type.startsWith('user.'))).toBe(false);
    expect(await (await sessions.auditor.fetch('/api/audit/export')).text()).not.toContain(outsider.projectId);
    // A designer is a member but not an auditor: the trail is refused.
    expect((await sessions.designer.fetch('/api/audit')).status).toBe(403);
  });

  it('shows administrators every event', async () => {
    const count = async () => (await db.select({ n: sql<number>`count(*)::int` }).from(auditEvents))[0].n;
    const page = await settled(async () => json(await sessions.admin.fetch('/api/audit?pageSize=1'), 200), count);
    expect(page.total).toBe(page.want);
  });

  it('serves the audit page to the outsider and refuses it to a designer', async () => {
    const page = await outsider.session.fetch('/audit');
    expect(page.status).toBe(200);
    expect(await page.text()).toContain('your own projects');
    expect((await sessions.designer.fetch('/audit')).status).toBe(403);
  });

  it('verifies the whole chain for everyone but names a broken event only to those who may see it', async () => {
    const counted = await json(await outsider.session.fetch('/api/audit/verify'), 200);
    expect(counted).toEqual({ ok: true, checked: await expectedCount([outsider.projectId]), mode: 'full' });

    const [victim] = await db.select().from(auditEvents).where(eq(auditEvents.projectId, demoProjectId)).orderBy(desc(auditEvents.id)).limit(1);
    try {
      await db.update(auditEvents).set({ detail: sql`${auditEvents.detail} || '{"tampered": true}'::jsonb` }).where(eq(auditEvents.id, victim.id));
      const forOutsider = await json(await outsider.session.fetch('/api/audit/verify'), 200);
      expect(forOutsider).toEqual({ ok: false, checked: counted.checked, brokenOutsideScope: true, mode: 'full' });
      const forAuditor = await json(await sessions.auditor.fetch('/api/audit/verify'), 200);
      expect(forAuditor).toMatchObject({ ok: false, firstBroken: { id: victim.id } });
      expect(forAuditor.brokenOutsideScope).toBeUndefined();
      expect(await json(await sessions.admin.fetch('/api/audit/verify'), 200)).toMatchObject({ ok: false, firstBroken: { id: victim.id } });
    } finally {
      await db.update(auditEvents).set({ detail: victim.detail }).where(eq(auditEvents.id, victim.id));
    }
    expect(await json(await outsider.session.fetch('/api/audit/verify'), 200)).toMatchObject({ ok: true });
    expect(await json(await sessions.auditor.fetch('/api/audit/verify'), 200)).toMatchObject({ ok: true });
  });
});
