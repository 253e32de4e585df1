import { afterAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { users } from '../../src/lib/db/schema';
import { hashPassword } from '../../src/lib/auth/passwords';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';
import { HttpSession, signedIn } from '../helpers/http-session';

const demo = {
  designer: 'designer@sheathwise.example',
  checker: 'checker@sheathwise.example',
  approver: 'approver@sheathwise.example',
  auditor: 'auditor@sheathwise.example',
  admin: 'admin@sheathwise.example',
};

describe('sign-in', () => {
  it('accepts the right password and shows the user on /api/me', async () => {
    const s = await signedIn(demo.designer, DEMO_PASSWORD);
    const me = await (await s.fetch('/api/me')).json();
    expect(me.email).toBe(demo.designer);
    expect(me.roles).toEqual(['designer']);
  });

  it('refuses a wrong password with the credentials code and no session', async () => {
    const s = new HttpSession();
    const url = await s.signIn(demo.approver, 'not-the-password');
    expect(url.pathname).toBe('/signin');
    expect(url.searchParams.get('code')).toBe('credentials');
    expect((await s.fetch('/api/me')).status).toBe(401);
  });

  describe('throttling per account', () => {
    const { db, pool } = createDatabase(testEnv().databaseUrl, 2);
    const email = `lockout-${Date.now()}@sheathwise.example`;
    afterAll(async () => {
      await db.delete(users).where(eq(users.email, email));
      await pool.end();
    });

    it('locks the account after the configured number of failures, even for the right password', async () => {
      await db.insert(users).values({ email, name: 'Lockout Probe', passwordHash: await hashPassword('right-one') });
      // scripts/test.sh sets SIGN_IN_MAX_FAILURES=3.
      for (let i = 0; i < 3; i++) {
        const url = await new HttpSession().signIn(email, 'wrong');
        expect(url.searchParams.get('code')).toBe('credentials');
      }
      const url = await new HttpSession().signIn(email, 'right-one');
      expect(url.searchParams.get('code')).toBe('locked');
      // Another account is not affected.
      await expect(signedIn(demo.checker, DEMO_PASSWORD)).resolves.toBeInstanceOf(HttpSession);
    });
  });
});

describe('authorisation', () => {
  it('answers 401 JSON to API calls without a session', async () => {
    const res = await new HttpSession().fetch('/api/projects');
    expect(res.status).toBe(401);
    expect(res.headers.get('content-type')).toContain('application/json');
    expect((await res.json()).error).toBe('NotSignedIn');
  });

  it('redirects pages to sign-in without a session', async () => {
    const res = await new HttpSession().fetch('/projects');
    expect(res.status).toBe(302);
    expect(res.headers.get('location')).toContain('/signin?next=%2Fprojects');
  });

  for (const role of ['designer', 'checker', 'approver', 'auditor'] as const) {
    it(`lets the ${role} list projects and refuses the admin endpoint with 403`, async () => {
      const s = await signedIn(demo[role], DEMO_PASSWORD);
      const projects = await s.fetch('/api/projects');
      expect(projects.status).toBe(200);
      expect((await projects.json()).projects).toHaveLength(1);
      const admin = await s.fetch('/api/admin/users');
      expect(admin.status).toBe(403);
      expect((await admin.json()).error).toBe('Forbidden');
    });
  }

  it('lets the admin list users', async () => {
    const s = await signedIn(demo.admin, DEMO_PASSWORD);
    const res = await s.fetch('/api/admin/users');
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.users.map((u: { email: string }) => u.email)).toContain(demo.designer);
    expect(JSON.stringify(body)).not.toContain('password');
    // Each person with their roles per project, so the administrator sees who may do what.
    const designer = body.users.find((u: { email: string }) => u.email === demo.designer);
    expect(designer.roles).toContainEqual({ role: 'designer', projectCode: expect.any(String) });
    expect(designer.roles.every((r: { role: string }) => ['designer', 'checker', 'approver', 'auditor'].includes(r.role))).toBe(true);
  });

  it('reports database and mail reachable on /api/health', async () => {
    const res = await new HttpSession().fetch('/api/health');
    expect(await res.json()).toMatchObject({ ok: true, database: { ok: true }, mail: { ok: true } });
  });
});
