import { afterAll, describe, expect, it } from 'vitest';
import { and, eq, inArray, like } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { auditEvents, users } from '../../src/lib/db/schema';
import { hashPassword } from '../../src/lib/auth/passwords';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';
import { waitForMail } from '../helpers/maildev-client';
import { rawRequest, signInFrom } from './sign-in-client.fixture';

// scripts/test.sh sets SIGN_IN_MAX_FAILURES=3 and SIGN_IN_LOCK_SECONDS=60; the per-address
// limit is ten times the per-account one. Every test signs in from its own loopback address
// (127.0.0.x), so the address locks it causes stay with it.
const PER_ACCOUNT = 3;
const PER_ADDRESS = 30;

const tag = `${process.pid}-${Date.now() % 1_000_000}`;
const { db, pool } = createDatabase(testEnv().databaseUrl, 2);
const made: string[] = [];

async function makeUser(name: string, password: string): Promise<string> {
  const email = `${name}-${tag}@sheathwise.example`;
  await db.insert(users).values({ email, name: `Probe ${name}`, passwordHash: await hashPassword(password) });
  made.push(email);
  return email;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

afterAll(async () => {
  if (made.length) await db.delete(users).where(inArray(users.email, made));
  await pool.end();
});

describe('sign-in throttling', () => {
  it('locks an unknown e-mail after the same failures as a real account, with the same answers', async () => {
    const real = await makeUser('lock-real', 'the-right-one');
    const unknown = `nobody-${tag}@sheathwise.example`;
    const codes = { real: [] as Array<string | null>, unknown: [] as Array<string | null> };
    for (let i = 0; i < PER_ACCOUNT; i++) {
      codes.real.push((await signInFrom('127.0.0.11', real, 'wrong')).code);
      codes.unknown.push((await signInFrom('127.0.0.11', unknown, 'wrong')).code);
    }
    expect(codes.real).toEqual(['credentials', 'credentials', 'credentials']);
    expect(codes.unknown).toEqual(codes.real);
    // Locked: the right password is refused, and an unknown e-mail is refused in the same words.
    expect((await signInFrom('127.0.0.11', real, 'the-right-one')).code).toBe('locked');
    expect((await signInFrom('127.0.0.11', unknown, 'anything')).code).toBe('locked');
  });

  it('takes the same time whether the account exists or not', async () => {
    const known = await makeUser('timing', 'the-right-one');
    const times = { known: [] as number[], unknown: [] as number[] };
    // Interleaved, so a burst of load on the machine hits both kinds alike. The known account
    // locks after three rounds, which must not change the time either.
    for (let round = 0; round < 9; round++) {
      times.known.push((await signInFrom('127.0.0.12', known, `wrong-${round}`)).elapsedMs);
      times.unknown.push((await signInFrom('127.0.0.12', `ghost-${round}-${tag}@sheathwise.example`, `wrong-${round}`)).elapsedMs);
    }
    const [k, u] = [median(times.known), median(times.unknown)];
    console.log(`[sign-in timing] median ms: existing account ${k.toFixed(1)}, no account ${u.toFixed(1)}, ratio ${(u / k).toFixed(2)}`);
    // Without the dummy hash an unknown e-mail answers in a few ms against bcrypt's ~50+ ms.
    expect(u / k).toBeGreaterThan(0.6);
    expect(u / k).toBeLessThan(1 / 0.6);
  });

  it('throttles per client address across many e-mails, without touching other addresses', async () => {
    // Ten at a time: the count is one statement per failure, so concurrency cannot undercount.
    for (let batch = 0; batch < PER_ADDRESS / 10; batch++) {
      const codes = await Promise.all(Array.from({ length: 10 }, (_, i) => signInFrom('127.0.0.13', `spray-${batch}-${i}-${tag}@sheathwise.example`, 'guess')));
      expect(codes.every((c) => c.code === 'credentials')).toBe(true);
    }
    expect((await signInFrom('127.0.0.13', 'designer@sheathwise.example', DEMO_PASSWORD)).code).toBe('locked');
    expect((await signInFrom('127.0.0.14', 'designer@sheathwise.example', DEMO_PASSWORD)).code).toBeNull();
  });

  it('lets the owner clear an account lock with the e-mailed link, once', async () => {
    const email = await makeUser('unlock', 'the-right-one');
    for (let i = 0; i < PER_ACCOUNT; i++) expect((await signInFrom('127.0.0.15', email, 'wrong')).code).toBe('credentials');
    expect((await signInFrom('127.0.0.15', email, 'the-right-one')).code).toBe('locked');

    const mail = await waitForMail(testEnv().mailWebUrl, (all) => all.some((m) => m.to.some((t) => t.address === email)));
    const message = mail.find((m) => m.to.some((t) => t.address === email))!;
    expect(message.subject).toContain('locked');
    const link = new URL(/http\S+\/signin\/unlock\?token=\S+/.exec(message.text)![0]);
    const token = link.searchParams.get('token')!;

    // Opening the link (as a mail scanner would) changes nothing; the button does.
    const page = await rawRequest(link.pathname + link.search, { from: '127.0.0.15' });
    expect(page.status).toBe(200);
    expect(page.body).toContain('Unlock my account');
    expect((await signInFrom('127.0.0.15', email, 'the-right-one')).code).toBe('locked');

    const form = { method: 'POST', from: '127.0.0.15', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams({ token }).toString() };
    const unlocked = await rawRequest('/signin/unlock', form);
    expect(unlocked.status).toBe(200);
    expect(unlocked.body).toContain('Your account is unlocked');
    expect((await signInFrom('127.0.0.15', email, 'the-right-one')).code).toBeNull();

    const again = await rawRequest('/signin/unlock', form);
    expect(again.status).toBe(400);
    expect(again.body).toContain('has been used or has expired');

    const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, email));
    const trail = await db.select({ type: auditEvents.type }).from(auditEvents).where(and(like(auditEvents.type, 'user.%'), eq(auditEvents.actorId, user.id)));
    expect(trail.map((e) => e.type)).toEqual(['user.unlocked']);
  });
});
