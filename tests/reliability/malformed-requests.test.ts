import { describe, expect, it } from 'vitest';
import { apiRoutes } from '../helpers/api-routes';
import type { HttpSession } from '../helpers/http-session';
import { demoIds, demoSessions, drive, json, readyDraft, send } from '../helpers/workflow-api';
import { figure } from './figures';

// Generated malformed requests over every endpoint: none may answer 5xx. Deterministic (a
// seeded generator), bounded in count, loopback only.
const REQUESTS = 1000;
const PARALLEL = 6;

/** A small seeded generator (mulberry32), so a failing request can be reproduced. */
function seeded(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

// Values that have broken servers: out-of-range numbers, characters a database refuses, dates
// outside PostgreSQL's range, wrong types, ids that do not exist.
const NASTY: unknown[] = [
  1e300, -1e300, 5e-324, -0, 2 ** 63, Number.MAX_SAFE_INTEGER + 2, 0, -1, 1.5,
  'a\u0000b', '\uD800', '\uDC00x', '\u0001\uFFFF', '', ' ', 'x'.repeat(20_000), '9999-12-31T23:59:59Z', '0001-01-01', '-infinity', '294277-01-01', 'NaN',
  null, true, [], {}, [[[[]]]], { __proto__: { admin: true } }, '00000000-0000-0000-0000-000000000000', 'not-a-uuid',
];
const FIELDS = ['version', 'step', 'reason', 'body', 'parentId', 'itemKey', 'checkerValue', 'explanation', 'answer', 'verdict', 'justification', 'resolved',
  'code', 'title', 'kind', 'limitSetId', 'inputs', 'email', 'name', 'userId', 'role', 'limits', 'manualItems', 'checkTolerancePct', 'token', 'password', 'from', 'to', 'page', 'pageSize'];
// A lone surrogate cannot be URI-encoded: send the bytes a careless client would (not UTF-8).
const queryValue = (v: unknown) => {
  try {
    return encodeURIComponent(String(v));
  } catch {
    return '%ED%A0%80';
  }
};
const PARAMS = ['%25', '%00', '%E0%A4%A', 'x'.repeat(300), 'not-a-uuid', '00000000-0000-0000-0000-000000000000', '..%2F..', '%F0%9F%98%80'];

describe('malformed requests over every endpoint', () => {
  it(`${REQUESTS} generated malformed requests: no 5xx`, { timeout: 180_000 }, async () => {
    const sessions = await demoSessions();
    const { projectId } = await demoIds(sessions.designer);
    const draft = await readyDraft(sessions.designer, 'kestrel-single-point-ecc', 'M');
    const inCheck = await readyDraft(sessions.designer, 'kestrel-single-point-ecc', 'M');
    await drive(sessions, inCheck.revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
    const remark = await json(await send(sessions.checker, 'POST', `/api/revisions/${inCheck.revisionId}/remarks`, { body: 'A remark to aim at.' }), 201);
    const detail = await json(await sessions.checker.fetch(`/api/revisions/${inCheck.revisionId}`), 200);
    const { limitSets } = await json(await sessions.designer.fetch('/api/limit-sets'), 200);
    // Real ids by parameter name, so that most requests get past routing and roles to the services.
    const realIds: Record<string, string[]> = {
      projectId: [projectId],
      revisionId: [draft.revisionId, inCheck.revisionId],
      studyId: [draft.studyId, inCheck.studyId],
      remarkId: [remark.id],
      limitSetId: limitSets.map((l: { id: string }) => l.id),
      itemKey: detail.checklist.map((i: { itemKey: string }) => encodeURIComponent(i.itemKey)),
    };
    const routes = apiRoutes().filter((r) => !r.includes('/api/auth/'));
    const random = seeded(20261202);
    const pick = <T>(list: T[]): T => list[Math.floor(random() * list.length)];
    const who = (route: string): HttpSession =>
      route.startsWith('/api/admin') ? sessions.admin : route.includes('check-values') ? sessions.checker : pick([sessions.designer, sessions.checker, sessions.approver]);

    const nastyBody = (): string => {
      const shape = random();
      if (shape < 0.1) return '{"unterminated": ';
      if (shape < 0.2) return JSON.stringify(pick(NASTY));
      const body: Record<string, unknown> = {};
      for (let i = 0, n = 1 + Math.floor(random() * 4); i < n; i++) body[pick(FIELDS)] = pick(NASTY);
      if (random() < 0.3) body.inputs = { kind: 'bonding', sections: [{ id: pick(NASTY), lengthM: pick(NASTY) }], frequencyHz: pick(NASTY) };
      return JSON.stringify(body);
    };
    const requests = Array.from({ length: REQUESTS }, () => {
      const [method, route] = pick(routes).split(' ');
      const path = route.replace(/\[([^\]]+)\]/g, (_m, name: string) => (random() < 0.7 && realIds[name]?.length ? pick(realIds[name]) : pick(PARAMS)));
      const query = random() < 0.3 ? `?page=${queryValue(pick(NASTY))}&search=${queryValue(pick(NASTY))}&from=${queryValue(pick(NASTY))}&state=${queryValue(pick(NASTY))}` : '';
      return { method, path: path + query, body: method === 'GET' ? undefined : nastyBody(), session: who(route) };
    });

    const statuses = new Map<number, number>();
    const failures: string[] = [];
    let notJson = 0;
    for (let i = 0; i < requests.length; i += PARALLEL) {
      await Promise.all(
        requests.slice(i, i + PARALLEL).map(async (r) => {
          const res = await r.session.fetch(r.path, { method: r.method, headers: { 'content-type': 'application/json' }, body: r.body });
          const text = await res.text();
          statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
          if (res.status >= 400 && !res.headers.get('content-type')?.includes('json')) notJson++;
          if (res.status >= 500) failures.push(`${r.method} ${r.path.slice(0, 120)} ${r.body?.slice(0, 200)} → ${res.status} ${text.slice(0, 200)}`);
        }),
      );
    }
    figure('malformed requests by status', [...statuses].sort(([a], [b]) => a - b).map(([s, n]) => `${s}×${n}`).join(', '));
    figure('malformed requests answered 5xx', failures.length, `of ${REQUESTS}`);
    figure('refusals not in JSON (from the HTTP layer, before the app)', notJson);
    expect(failures.slice(0, 10)).toEqual([]);
    await json(await sessions.designer.fetch('/api/me'), 200);
  });
});
