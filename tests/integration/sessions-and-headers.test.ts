import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { launchBrowser } from '../helpers/browser';
import { hydrated } from '../helpers/browser-session';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';
import { rawRequest, signInFrom } from './sign-in-client.fixture';

const { appUrl } = testEnv();

describe('sign-out ends the session on the server', () => {
  it('refuses a copy of the cookie once its session has signed out, and leaves other sessions alone', async () => {
    const first = await signInFrom('127.0.0.21', 'designer@sheathwise.example', DEMO_PASSWORD);
    const second = await signInFrom('127.0.0.21', 'designer@sheathwise.example', DEMO_PASSWORD);
    expect([first.code, second.code]).toEqual([null, null]);
    expect((await rawRequest('/api/me', { cookie: first.cookie })).status).toBe(200);

    const { csrfToken } = JSON.parse((await rawRequest('/api/auth/csrf', { cookie: first.cookie })).body);
    const out = await rawRequest('/api/auth/signout', {
      method: 'POST',
      cookie: first.cookie,
      headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-auth-return-redirect': '1' },
      body: new URLSearchParams({ csrfToken, callbackUrl: `${appUrl}/signin` }).toString(),
    });
    expect(out.status).toBe(200);

    // The browser's cookie is cleared, but a copy taken before sign-out must not work either.
    const reused = await rawRequest('/api/me', { cookie: first.cookie });
    expect(reused.status).toBe(401);
    expect(JSON.parse(reused.body).error).toBe('NotSignedIn');
    expect((await rawRequest('/projects', { cookie: first.cookie })).status).toBe(302);
    expect((await rawRequest('/api/me', { cookie: second.cookie })).status).toBe(200);
  });
});

describe('security headers', () => {
  const probes: Array<[string, string, number]> = [
    ['HTML page', '/signin', 200],
    ['redirect to sign-in', '/projects', 302],
    ['API refusal', '/api/projects', 401],
    ['health', '/api/health', 200],
    ['Auth.js route', '/api/auth/csrf', 200],
    ['unknown page', '/signin/no-such-page', 404],
  ];
  for (const [what, path, status] of probes) {
    it(`sets them on a ${what} (${path})`, async () => {
      const res = await rawRequest(path);
      expect(res.status).toBe(status);
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['referrer-policy']).toBe('no-referrer');
      const csp = String(res.headers['content-security-policy']);
      expect(csp).toContain("frame-ancestors 'none'");
      expect(csp).toContain("object-src 'none'");
      expect(csp).not.toMatch(/script-src[^;]*'unsafe-inline'/);
    });
  }

  it('allows exactly the inline scripts of the page it is sent with', async () => {
    const res = await rawRequest('/signin');
    const scriptSrc = /script-src ([^;]*)/.exec(String(res.headers['content-security-policy']))![1].split(' ');
    const inline = [...res.body.matchAll(/<script(?![^>]*\bsrc=)[^>]*>([\s\S]*?)<\/script>/g)].map((m) => `'sha256-${createHash('sha256').update(m[1]).digest('base64')}'`);
    expect(inline.length).toBeGreaterThan(0);
    expect(scriptSrc.filter((s) => s.startsWith("'sha256-")).sort()).toEqual([...new Set(inline)].sort());
  });

  it('lets the islands work in Chromium with no policy violation: sign in, then verify the audit chain', async () => {
    const { context, close } = await launchBrowser();
    try {
      const page = await context.newPage();
      const violations: string[] = [];
      page.on('console', (m) => {
        if (/Content Security Policy|Refused to/i.test(m.text())) violations.push(m.text());
      });
      await page.addInitScript(() => {
        document.addEventListener('securitypolicyviolation', (e) => console.error(`Refused to load: CSP ${e.violatedDirective} ${e.blockedURI} from ${e.sourceFile}:${e.lineNumber} on ${location.pathname}`));
      });
      await page.goto(`${appUrl}/signin?next=%2Faudit`);
      await hydrated(page);
      await page.getByLabel('E-mail').fill('auditor@sheathwise.example');
      await page.getByLabel('Password').fill(DEMO_PASSWORD);
      await page.getByRole('button', { name: 'Sign in' }).click();
      await page.waitForURL(`${appUrl}/audit`);
      await hydrated(page);
      await page.getByTestId('audit-table').waitFor();
      await page.getByRole('button', { name: 'Verify the chain' }).click();
      await expect(page.getByTestId('chain-result').textContent()).resolves.toMatch(/Chain intact/);
      expect(violations).toEqual([]);
    } finally {
      await close();
    }
  });
});

describe('Auth.js routes', () => {
  it('answers 404 for an unknown /api/auth path instead of failing', async () => {
    for (const [method, path] of [
      ['GET', '/api/auth/no-such-action'],
      ['POST', '/api/auth/no-such-action'],
      ['GET', '/api/auth/webauthn-options'],
      ['GET', '/api/auth/signin/no-such-provider'],
      ['GET', '/api/auth/callback/no-such-provider'],
      ['GET', '/api/auth/session/extra'],
      ['GET', '/api/auth/csrf/credentials'],
    ]) {
      const res = await rawRequest(path, { method });
      expect(res.status, `${method} ${path}`).toBe(404);
      expect(JSON.parse(res.body).error).toBe('NotFound');
    }
  });

  it('still serves the routes sign-in uses', async () => {
    for (const path of ['/api/auth/csrf', '/api/auth/session', '/api/auth/providers']) expect((await rawRequest(path)).status, path).toBe(200);
    for (const path of ['/api/auth/signin', '/api/auth/signin/credentials', '/api/auth/callback/credentials', '/api/auth/error', '/api/auth/verify-request', '/api/auth/signout']) {
      expect((await rawRequest(path)).status, path).toBeLessThan(500);
    }
  });
});
