import { decode } from '@auth/core/jwt';

// The session cookie, decoded here instead of through Auth.js's session route: that route builds a
// second request, derives the key (HKDF) and decrypts, then encrypts a renewed cookie that
// auth-astro throws away — on every request. The claims of a token never change, so a decoded
// token is remembered (bounded, until it expires); whether the session is still open is asked
// of the database on every request all the same (sessions.ts).

export interface SessionClaims {
  uid: string;
  sid: string;
}

// Auth.js names the cookie by scheme, and splits one over 4 kB into name.0, name.1, ...
const COOKIE_NAMES = ['__Secure-authjs.session-token', 'authjs.session-token'];
const REMEMBERED = 2000;
const remembered = new Map<string, SessionClaims & { expiresAtS: number }>();

/** The token and the cookie name it came under (the name is the key-derivation salt). */
function sessionCookie(read: (name: string) => string | undefined): { token: string; name: string } | null {
  for (const name of COOKIE_NAMES) {
    const whole = read(name);
    if (whole) return { token: whole, name };
    const chunks: string[] = [];
    for (let i = 0; i < 10; i++) {
      const chunk = read(`${name}.${i}`);
      if (!chunk) break;
      chunks.push(chunk);
    }
    if (chunks.length) return { token: chunks.join(''), name };
  }
  return null;
}

/** The session's claims, or null without a valid, unexpired token. */
export async function sessionClaims(read: (name: string) => string | undefined, secret: string): Promise<SessionClaims | null> {
  const cookie = sessionCookie(read);
  if (!cookie) return null;
  const nowS = Date.now() / 1000;
  const known = remembered.get(cookie.token);
  if (known && known.expiresAtS > nowS) return { uid: known.uid, sid: known.sid };
  let payload: Record<string, unknown> | null;
  try {
    payload = await decode({ token: cookie.token, secret, salt: cookie.name });
  } catch {
    return null; // tampered, from another secret, or expired
  }
  if (!payload || typeof payload.uid !== 'string' || typeof payload.sid !== 'string' || typeof payload.exp !== 'number') return null;
  if (remembered.size >= REMEMBERED) remembered.delete(remembered.keys().next().value!);
  remembered.set(cookie.token, { uid: payload.uid, sid: payload.sid, expiresAtS: payload.exp });
  return { uid: payload.uid, sid: payload.sid };
}
