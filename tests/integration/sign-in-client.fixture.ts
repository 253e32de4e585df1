import http from 'node:http';
import { testEnv } from '../helpers/env';

// Sign-in over plain node:http so that a test can choose its source address on loopback
// (127.0.0.0/8): the server throttles per client address, and each test uses its own.

export interface RawResponse {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: string;
}

export function rawRequest(path: string, opts: { method?: string; from?: string; cookie?: string; headers?: Record<string, string>; body?: string } = {}): Promise<RawResponse> {
  const base = new URL(testEnv().appUrl);
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: base.hostname,
        port: base.port,
        path,
        method: opts.method ?? 'GET',
        localAddress: opts.from,
        headers: { origin: base.origin, ...(opts.cookie ? { cookie: opts.cookie } : {}), ...opts.headers },
        agent: false,
      },
      (res) => {
        let body = '';
        res.setEncoding('utf8');
        res.on('data', (c) => (body += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
      },
    );
    req.on('error', reject);
    req.end(opts.body);
  });
}

const cookiesOf = (res: RawResponse, jar: Map<string, string>) => {
  for (const c of res.headers['set-cookie'] ?? []) {
    const [pair] = c.split(';');
    const eq = pair.indexOf('=');
    jar.set(pair.slice(0, eq), pair.slice(eq + 1));
  }
  return [...jar].filter(([, v]) => v !== '').map(([k, v]) => `${k}=${v}`).join('; ');
};

export interface SignInAttempt {
  /** null on success, else Auth.js's code: 'credentials' or 'locked'. */
  code: string | null;
  /** The cookie header of the signed-in session (on success). */
  cookie: string;
  /** Time the server took to answer the credentials post. */
  elapsedMs: number;
}

/** One sign-in through Auth.js's real endpoints, from the given loopback address. */
export async function signInFrom(from: string, email: string, password: string): Promise<SignInAttempt> {
  const jar = new Map<string, string>();
  const csrf = await rawRequest('/api/auth/csrf', { from });
  const { csrfToken } = JSON.parse(csrf.body) as { csrfToken: string };
  const started = performance.now();
  const res = await rawRequest('/api/auth/callback/credentials', {
    method: 'POST',
    from,
    cookie: cookiesOf(csrf, jar),
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-auth-return-redirect': '1' },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${testEnv().appUrl}/` }).toString(),
  });
  const elapsedMs = performance.now() - started;
  const url = new URL((JSON.parse(res.body) as { url: string }).url);
  const cookie = cookiesOf(res, jar);
  return { code: url.searchParams.has('error') ? (url.searchParams.get('code') ?? url.searchParams.get('error')) : null, cookie, elapsedMs };
}
