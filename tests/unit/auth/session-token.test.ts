import { describe, expect, it } from 'vitest';
import { encode } from '@auth/core/jwt';
import { sessionClaims } from '../../../src/lib/auth/session-token';

// The middleware decodes the Auth.js session cookie itself: it must accept exactly what Auth.js
// issued with our secret under the cookie's own name, and nothing else.

const SECRET = 'unit-test-secret-0123456789abcdef';
const NAME = 'authjs.session-token';
const UID = '11111111-1111-4111-8111-111111111111';
const SID = '22222222-2222-4222-8222-222222222222';
const jar = (cookies: Record<string, string>) => (name: string) => cookies[name];

describe('session cookie claims', () => {
  it('reads the user and session ids from a token Auth.js encoded, whole or in chunks', async () => {
    const token = await encode({ token: { uid: UID, sid: SID, name: 'D' }, secret: SECRET, salt: NAME, maxAge: 60 });
    expect(await sessionClaims(jar({ [NAME]: token }), SECRET)).toEqual({ uid: UID, sid: SID });
    const half = Math.floor(token.length / 2);
    expect(await sessionClaims(jar({ [`${NAME}.0`]: token.slice(0, half), [`${NAME}.1`]: token.slice(half) }), SECRET)).toEqual({ uid: UID, sid: SID });
    const secure = `__Secure-${NAME}`;
    const secureToken = await encode({ token: { uid: UID, sid: SID }, secret: SECRET, salt: secure, maxAge: 60 });
    expect(await sessionClaims(jar({ [secure]: secureToken }), SECRET)).toEqual({ uid: UID, sid: SID });
  });

  it('refuses no cookie, another secret, another cookie name, a tampered token, an expired one and one without a session id', async () => {
    expect(await sessionClaims(jar({}), SECRET)).toBeNull();
    const other = await encode({ token: { uid: UID, sid: SID }, secret: 'another-secret-0123456789abcdef', salt: NAME, maxAge: 60 });
    expect(await sessionClaims(jar({ [NAME]: other }), SECRET)).toBeNull();
    const wrongSalt = await encode({ token: { uid: UID, sid: SID }, secret: SECRET, salt: 'elsewhere', maxAge: 60 });
    expect(await sessionClaims(jar({ [NAME]: wrongSalt }), SECRET)).toBeNull();
    const good = await encode({ token: { uid: UID, sid: SID }, secret: SECRET, salt: NAME, maxAge: 60 });
    const tampered = good.slice(0, -6) + (good.endsWith('AAAAAA') ? 'BBBBBB' : 'AAAAAA');
    expect(await sessionClaims(jar({ [NAME]: tampered }), SECRET)).toBeNull();
    // Past its end, beyond Auth.js's 15 s of clock tolerance.
    const expired = await encode({ token: { uid: UID, sid: SID }, secret: SECRET, salt: NAME, maxAge: -60 });
    expect(await sessionClaims(jar({ [NAME]: expired }), SECRET)).toBeNull();
    const noSid = await encode({ token: { uid: UID }, secret: SECRET, salt: NAME, maxAge: 60 });
    expect(await sessionClaims(jar({ [NAME]: noSid }), SECRET)).toBeNull();
  });
});
