import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq, sql } from 'drizzle-orm';
import { createDatabase } from '../../src/lib/db/client';
import { memberships, revisions, signOffs, users } from '../../src/lib/db/schema';
import { hashPassword } from '../../src/lib/auth/passwords';
import { canonicalJson, sha256Hex } from '../../src/lib/canonical-json';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';
import { type HttpSession, signedIn } from '../helpers/http-session';
import { type DemoRole, demoIds, demoSessions, drive, fixtureInputs, json, readyDraft, send, step } from '../helpers/workflow-api';
import { rawRequest, signInFrom } from './sign-in-client.fixture';

// Issue 11 §2: submit, pass and issue ask for the password again, throttled like sign-in; the
// sign-off row keeps the statement and the hashes it signed, and a later change voids it.
// scripts/test.sh: SIGN_IN_MAX_FAILURES=3, SIGN_IN_LOCK_SECONDS=60. Wrong passwords come from
// their own loopback addresses (127.0.0.6x) and a person made for this file, so no lock they
// cause reaches the demo people or 127.0.0.1.
const PER_ACCOUNT = 3;

let sessions: Record<DemoRole, HttpSession>;
const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
const tag = `${process.pid}-${Date.now() % 1_000_000}`;

/** A designer of the demo project made for this file, signed in. */
async function makeDesigner(name: string) {
  const email = `${name}-${tag}@sheathwise.example`;
  const password = `${name}-password-${tag}`;
  const [user] = await db.insert(users).values({ email, name: `Signer ${name}`, passwordHash: await hashPassword(password) }).returning();
  const { projectId } = await demoIds(sessions.designer);
  await db.insert(memberships).values({ projectId, userId: user.id, role: 'designer' });
  return { email, password, session: await signedIn(email, password) };
}

/** A step sent from a chosen loopback address with a signed-in person's cookie. */
async function stepFrom(from: string, session: HttpSession, revisionId: string, body: Record<string, unknown>) {
  const version = (await json(await session.fetch(`/api/revisions/${revisionId}`), 200)).revision.version;
  const res = await rawRequest(`/api/revisions/${revisionId}/steps`, { method: 'POST', from, cookie: session.cookieHeader(), headers: { 'content-type': 'application/json' }, body: JSON.stringify({ version, ...body }) });
  return { status: res.status, body: JSON.parse(res.body) };
}

const signOffsOf = async (s: HttpSession, revisionId: string) => (await json(await s.fetch(`/api/revisions/${revisionId}/steps`), 200)).signOffs;

beforeAll(async () => {
  sessions = await demoSessions();
});
afterAll(() => pool.end());

describe('re-authentication on the steps that sign', () => {
  it('refuses submit, pass and issue without the password or with a wrong one, and signs nothing', async () => {
    const signer = await makeDesigner('reauth');
    const { revisionId } = await readyDraft(signer.session, 'fernhollow-cross-bonded', 'S');

    const missing = await json(await send(signer.session, 'POST', `/api/revisions/${revisionId}/steps`, { step: 'submit', version: (await json(await signer.session.fetch(`/api/revisions/${revisionId}`), 200)).revision.version }), 422);
    expect(missing.fields).toEqual([{ field: 'password', message: 'Enter your password to sign this step.' }]);
    const wrong = await stepFrom('127.0.0.61', signer.session, revisionId, { step: 'submit', password: 'not-the-password' });
    expect(wrong.status).toBe(403);
    expect(wrong.body).toMatchObject({ error: 'Forbidden', message: 'That is not your password: nothing was signed.' });
    // Someone else's password is not yours either.
    const borrowed = await stepFrom('127.0.0.61', signer.session, revisionId, { step: 'submit', password: DEMO_PASSWORD });
    expect(borrowed.status).toBe(403);
    expect(await db.select().from(signOffs).where(eq(signOffs.revisionId, revisionId))).toHaveLength(0);
    const [row] = await db.select({ state: revisions.state }).from(revisions).where(eq(revisions.id, revisionId));
    expect(row.state).toBe('draft');

    // The right password (which clears the account's failures, as a sign-in does) signs.
    const ok = await stepFrom('127.0.0.61', signer.session, revisionId, { step: 'submit', password: signer.password, statement: 'Prepared and self-checked.' });
    expect(ok.status).toBe(200);

    await json(await step(sessions.checker, revisionId, 'startCheck'), 200);
    for (const [who, name] of [['checker', 'pass'], ['approver', 'issue']] as const) {
      if (name === 'issue') await json(await step(sessions.checker, revisionId, 'pass'), 200);
      const res = await json(await step(sessions[who], revisionId, name, { password: undefined }), 422);
      expect(res.fields[0].field).toBe('password');
    }
    // A step the person may not take at all is refused as such before any password is asked.
    const notYours = await json(await step(sessions.designer, revisionId, 'issue', { password: undefined }), 403);
    expect(notYours.message).toBe('Issuing needs the approver role in this project.');
  });

  it('wrong passwords lock signing like sign-in: then even the right password is refused, and sign-in is locked too', async () => {
    const signer = await makeDesigner('lock');
    const { revisionId } = await readyDraft(signer.session, 'fernhollow-cross-bonded', 'S');
    for (let i = 0; i < PER_ACCOUNT; i++) {
      const wrong = await stepFrom('127.0.0.62', signer.session, revisionId, { step: 'submit', password: `wrong-${i}` });
      expect(wrong.status, `attempt ${i + 1}`).toBe(403);
      expect(wrong.body.message).toBe('That is not your password: nothing was signed.');
    }
    const locked = await stepFrom('127.0.0.63', signer.session, revisionId, { step: 'submit', password: signer.password });
    expect(locked.status).toBe(403);
    expect(locked.body.message).toMatch(/^Too many wrong passwords: signing and signing in are locked/);
    expect((await signInFrom('127.0.0.64', signer.email, signer.password)).code).toBe('locked');
    const [row] = await db.select({ state: revisions.state }).from(revisions).where(eq(revisions.id, revisionId));
    expect(row.state).toBe('draft');
  });
});

describe('the sign-off row', () => {
  it('keeps the statement, the inputs hash and the results hash it signed, and is void once either changes', async () => {
    const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'S');
    await json(await step(sessions.designer, revisionId, 'submit', { statement: 'Prepared to the owner\'s brief.' }), 200);
    const [rev] = await db.select().from(revisions).where(eq(revisions.id, revisionId));
    const [first] = await signOffsOf(sessions.auditor, revisionId);
    expect(first).toMatchObject({ role: 'designer', statement: 'Prepared to the owner\'s brief.', inputsHash: rev.inputsHash, resultsHash: sha256Hex(canonicalJson(rev.results)), valid: true, voidReason: null });

    // Back to the designer, who changes a section length: the first signature no longer covers the revision.
    await drive(sessions, revisionId, [['checker', 'startCheck'], ['checker', 'return']]);
    const inputs = fixtureInputs('fernhollow-cross-bonded');
    inputs.sections[1].lengthM += 5;
    await json(await send(sessions.designer, 'PUT', `/api/revisions/${revisionId}/inputs`, { version: (await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200)).revision.version, inputs }), 200);
    const afterInputs = await signOffsOf(sessions.auditor, revisionId);
    expect(afterInputs[0]).toMatchObject({ valid: false, voidReason: 'Void: the inputs changed after this signature.' });
    await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200);
    const afterResults = await signOffsOf(sessions.auditor, revisionId);
    expect(afterResults[0]).toMatchObject({ valid: false, voidReason: 'Void: the inputs and the results changed after this signature.' });
    // Signing again covers the new inputs and results; the old signature stays on record, void.
    await json(await step(sessions.designer, revisionId, 'submit'), 200);
    expect((await signOffsOf(sessions.auditor, revisionId)).map((s: { valid: boolean }) => s.valid)).toEqual([false, true]);
  });

  it('an issued revision whose results are altered in the database shows every sign-off void', async () => {
    const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'S');
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    const signed = await signOffsOf(sessions.auditor, revisionId);
    expect(signed.map((s: { role: string; valid: boolean }) => [s.role, s.valid])).toEqual([['designer', true], ['checker', true], ['approver', true]]);
    // Tampering, as an auditor must be able to detect it: one figure of the stored results changes.
    await db.execute(sql`update revisions set results = jsonb_set(results, '{engineVersion}', '"tampered"') where id = ${revisionId}`);
    const after = await signOffsOf(sessions.auditor, revisionId);
    expect(after.map((s: { valid: boolean; voidReason: string }) => [s.valid, s.voidReason])).toEqual(Array(3).fill([false, 'Void: the results changed after this signature.']));
  });
});
