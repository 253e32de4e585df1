import { describe, expect, it } from 'vitest';
import { testEnv } from '../helpers/env';
import { waitForMail } from '../helpers/maildev-client';
import { demoSessions, drive, json, readyDraft, send } from '../helpers/workflow-api';
import { HttpSession } from '../helpers/http-session';

const { mailWebUrl } = testEnv();

describe('workflow e-mail through the running app', () => {
  it('tells the checkers on submit, the designer on return, the approvers on pass', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer);
    const title = (await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200)).study.title as string;
    const about = (to: string, what: string) => (m: Awaited<ReturnType<typeof waitForMail>>) =>
      m.some((x) => x.to.some((t) => t.address === to) && x.subject.includes(what) && x.text.includes(revisionId));

    await drive(sessions, revisionId, [['designer', 'submit']]);
    await waitForMail(mailWebUrl, about('checker@sheathwise.example', 'ready for your check'));
    await drive(sessions, revisionId, [['checker', 'startCheck'], ['checker', 'return']]);
    await waitForMail(mailWebUrl, about('designer@sheathwise.example', 'returned to you'));
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass']]);
    const mail = await waitForMail(mailWebUrl, about('approver@sheathwise.example', 'waiting for approval'));
    expect(mail.find((m) => m.subject.includes(title))?.text).toContain('do not replace');
  });

  it('invites a user by e-mail with a single-use link that sets a password', async () => {
    const sessions = await demoSessions();
    const email = `invitee-${Date.now()}@sheathwise.example`;
    await json(await send(sessions.admin, 'POST', '/api/admin/invitations', { email, name: 'Fen Invitee' }), 201);
    const mail = await waitForMail(mailWebUrl, (m) => m.some((x) => x.to.some((t) => t.address === email)));
    const text = mail.find((x) => x.to.some((t) => t.address === email))!.text;
    const token = /\/invitation\/([A-Za-z0-9_-]+)/.exec(text)![1];

    const short = await send(new HttpSession(), 'POST', '/api/invitations/accept', { token, password: 'short' });
    expect(short.status).toBe(422);
    await json(await send(new HttpSession(), 'POST', '/api/invitations/accept', { token, password: 'a-long-new-password' }), 201);
    const again = await json(await send(new HttpSession(), 'POST', '/api/invitations/accept', { token, password: 'a-long-new-password' }), 422);
    expect(again.fields[0].message).toContain('used or has expired');
    const url = await new HttpSession().signIn(email, 'a-long-new-password');
    expect(url.searchParams.has('error')).toBe(false);
  });
});
