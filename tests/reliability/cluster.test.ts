import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents, issuedRecords, signInThrottles } from '../../src/lib/db/schema';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';
import { HttpSession } from '../helpers/http-session';
import { caughtMail, waitForMail } from '../helpers/maildev-client';
import { DEMO, type DemoRole, closeOpenThreads, drive, json, readyDraft } from '../helpers/workflow-api';

// scripts/cluster.mjs: two server processes behind the local reverse proxy, on the suite's
// database, object store and mail catcher. Sign-in goes through the proxy, requests land on
// both processes, and each job runs once.
const appPort = Number(new URL(testEnv().appUrl).port);
const proxyPort = appPort + 23;
const proxyBase = `http://127.0.0.1:${proxyPort}`;
const firstProcessPort = proxyPort + 1;
let cluster: ChildProcess | undefined;
const { db, pool } = createDatabase(testEnv().databaseUrl, 1);

beforeAll(async () => {
  cluster = spawn(process.execPath, ['scripts/cluster.mjs'], {
    env: { ...process.env, HOST: '127.0.0.1', PORT: String(proxyPort), SHEATHWISE_PROCESSES: '2', SHEATHWISE_FIRST_PROCESS_PORT: String(firstProcessPort) },
    stdio: 'ignore',
  });
  for (let i = 0; i < 300; i++) {
    if ((await fetch(`${proxyBase}/api/health`).catch(() => null))?.status === 200) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error('the cluster did not start');
}, 90_000);
afterAll(async () => {
  cluster?.kill('SIGTERM');
  await pool.end();
});

/** A failed sign-in over node:http from a chosen loopback address, with an X-Forwarded-For the client made up. */
function wrongPasswordFrom(port: number, from: string, forged: string, email: string): Promise<number> {
  const origin = `http://127.0.0.1:${port}`;
  const request = (path: string, method: string, headers: Record<string, string>, body?: string) =>
    new Promise<{ status: number; cookies: string[]; body: string }>((resolve, reject) => {
      const req = http.request({ host: '127.0.0.1', port, path, method, localAddress: from, agent: false, headers: { origin, 'x-forwarded-for': forged, ...headers } }, (res) => {
        let text = '';
        res.setEncoding('utf8');
        res.on('data', (c) => (text += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, cookies: (res.headers['set-cookie'] ?? []).map((c) => c.split(';')[0]), body: text }));
      });
      req.on('error', reject);
      req.end(body);
    });
  return (async () => {
    const csrf = await request('/api/auth/csrf', 'GET', {});
    const { csrfToken } = JSON.parse(csrf.body) as { csrfToken: string };
    const form = new URLSearchParams({ csrfToken, email, password: 'not-the-password', callbackUrl: `${origin}/` }).toString();
    return (await request('/api/auth/callback/credentials', 'POST', { cookie: csrf.cookies.join('; '), 'content-type': 'application/x-www-form-urlencoded', 'x-auth-return-redirect': '1' }, form)).status;
  })();
}

const addressFailures = async (key: string) => (await db.select().from(signInThrottles).where(and(eq(signInThrottles.kind, 'address'), eq(signInThrottles.key, key))))[0]?.failures ?? 0;

describe('N processes behind the local reverse proxy', () => {
  it('signs in through the proxy, spreads requests over both processes, and runs each job once', { timeout: 120_000 }, async () => {
    const sessions = {} as Record<DemoRole, HttpSession>;
    for (const [role, email] of Object.entries(DEMO) as Array<[DemoRole, string]>) {
      const s = new HttpSession(proxyBase);
      const landed = await s.signIn(email, DEMO_PASSWORD);
      expect(landed.searchParams.has('error'), String(landed)).toBe(false);
      sessions[role] = s;
    }
    const served = new Set<string>();
    for (let i = 0; i < 6; i++) {
      const res = await sessions.designer.fetch('/api/me');
      expect(res.status).toBe(200);
      served.add(res.headers.get('x-sheathwise-process') ?? '');
    }
    expect([...served].sort()).toEqual(['1', '2']);

    const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'C');
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
    await closeOpenThreads(sessions.checker, revisionId);
    await drive(sessions, revisionId, [['checker', 'pass'], ['approver', 'issue']]);
    let sha: string | null = null;
    for (let i = 0; i < 100 && !sha; i++) {
      const res = await sessions.auditor.fetch(`/api/revisions/${revisionId}/record`);
      if (res.status === 200) sha = res.headers.get('x-record-sha256');
      else await new Promise((r) => setTimeout(r, 300));
    }
    expect(sha).toMatch(/^[0-9a-f]{64}$/);

    await waitForMail(testEnv().mailWebUrl, (m) => m.some((x) => x.text.includes(revisionId) && x.subject.includes('issued')));
    await new Promise((r) => setTimeout(r, 2000)); // room for a duplicate to show up
    const mine = (await caughtMail(testEnv().mailWebUrl)).filter((m) => m.text.includes(revisionId));
    const keys = mine.map((m) => `${m.to.map((t) => t.address).join(',')}|${m.subject}|${m.text.length}`);
    expect(keys.length).toBeGreaterThan(0);
    expect(new Set(keys).size).toBe(keys.length);
    expect(await db.select().from(issuedRecords).where(eq(issuedRecords.revisionId, revisionId))).toHaveLength(1);
    expect(await db.select().from(auditEvents).where(and(eq(auditEvents.revisionId, revisionId), eq(auditEvents.type, 'record.issued')))).toHaveLength(1);
    expect(await json(await sessions.auditor.fetch('/api/audit/verify?mode=incremental'), 200)).toMatchObject({ ok: true });
  });

  it('counts failed sign-ins against the address the proxy saw, never one the client claims', async () => {
    // Source addresses of their own: other suites count wrong passwords from 127.0.0.1–64 in the same database.
    const email = `nobody-${Date.now()}@sheathwise.example`;
    // Through the proxy from 127.0.0.171, claiming to be 203.0.113.61.
    expect(await wrongPasswordFrom(proxyPort, '127.0.0.171', '203.0.113.61', email)).toBeLessThan(500);
    expect(await addressFailures('127.0.0.171')).toBe(1);
    expect(await addressFailures('203.0.113.61')).toBe(0);
    // Straight to a process from 127.0.0.172, claiming 203.0.113.62: without the proxy's secret the header is ignored.
    expect(await wrongPasswordFrom(firstProcessPort, '127.0.0.172', '203.0.113.62', email)).toBeLessThan(500);
    expect(await addressFailures('127.0.0.172')).toBe(1);
    expect(await addressFailures('203.0.113.62')).toBe(0);
  });
});
