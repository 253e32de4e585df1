import { testEnv } from './env';

/** A cookie-keeping client for the running app, signed in through Auth.js's real endpoints. */
export class HttpSession {
  private cookies = new Map<string, string>();

  constructor(readonly base = testEnv().appUrl) {}

  cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  /** The same signed-in person talking to another server process (same secret, same database). */
  at(base: string): HttpSession {
    const other = new HttpSession(base);
    for (const [k, v] of this.cookies) other.cookies.set(k, v);
    return other;
  }

  async fetch(path: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    headers.set('cookie', this.cookieHeader());
    headers.set('origin', this.base);
    const res = await fetch(this.base + path, { ...init, headers, redirect: 'manual' });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const eq = pair.indexOf('=');
      this.cookies.set(pair.slice(0, eq), pair.slice(eq + 1));
    }
    return res;
  }

  /** Returns the URL Auth.js sends the browser to: the callback on success, /signin?error=… on failure. */
  async signIn(email: string, password: string): Promise<URL> {
    const { csrfToken } = (await (await this.fetch('/api/auth/csrf')).json()) as { csrfToken: string };
    const res = await this.fetch('/api/auth/callback/credentials', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-auth-return-redirect': '1' },
      body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${this.base}/` }),
    });
    const { url } = (await res.json()) as { url: string };
    return new URL(url);
  }
}

export async function signedIn(email: string, password: string): Promise<HttpSession> {
  const session = new HttpSession();
  const url = await session.signIn(email, password);
  if (url.searchParams.has('error')) throw new Error(`sign-in failed for ${email}: ${url}`);
  return session;
}
