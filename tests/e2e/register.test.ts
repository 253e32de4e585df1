import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, browserAs, hydrated, screenshot } from '../helpers/browser-session';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { waitForMail } from '../helpers/maildev-client';
import { type DemoRole, demoSessions, json, send } from '../helpers/workflow-api';
import { daysFromToday, issuedStudy, newAsset, ownStandard, tag } from '../integration/register.fixture';

// In Debian's Chromium: the approver publishes a higher earth-fault level for a substation; the
// register turns the substation to "needs review"; the designer opens the covering study, starts
// a revision with the new value and confirms it; the reminder of the substation's inspection,
// due in five days, is in the mail catcher.

let sessions: Record<DemoRole, HttpSession>;
const opened: Array<{ page: Page; close: () => Promise<void>; errors: string[] }> = [];
const code = `EB${tag()}`;
let study: Awaited<ReturnType<typeof issuedStudy>>;

async function as(email: string) {
  const s = await browserAs(email);
  opened.push(s);
  return s.page;
}

async function openAsset(page: Page) {
  await page.goto(`${appUrl}/projects/${study.projectId}/register`);
  await hydrated(page);
  await page.getByLabel('Find by asset code or name').fill(code);
  await page.locator(`tr[data-asset="${code}"]`).click();
  await page.getByTestId('asset-panel').waitFor();
}

beforeAll(async () => {
  sessions = await demoSessions();
  study = await issuedStudy(sessions);
  const std = await ownStandard(sessions.admin);
  const site = await newAsset(sessions.designer, study.projectId, { kind: 'site', siteKind: 'substation', code, name: 'Browser substation (invented)', ownerStandard: std.ownerStandard, inServiceOn: daysFromToday(5) });
  await json(await send(sessions.designer, 'POST', `/api/assets/${site.id}/studies`, { studyId: study.studyId, siteEnd: 'end' }), 201);
}, 120_000);

afterAll(async () => {
  for (const s of opened) await s.close();
  expect(opened.flatMap((s) => s.errors)).toEqual([]);
});

describe('the register in the browser', { timeout: 90_000 }, () => {
  it('publishing a higher fault level turns the substation to "needs review"', async () => {
    const page = await as('approver@sheathwise.example');
    await openAsset(page);
    await expect.poll(() => page.locator(`tr[data-asset="${code}"] [data-status]`).textContent()).toBe('due within 30 days');
    const earthFault = page.getByLabel('Earth-fault level (kA)', { exact: true });
    await earthFault.fill('25 kA');
    await page.getByLabel('Source of the figures').fill('Network operator letter (invented)');
    await page.getByLabel('Source date (YYYY-MM-DD)').fill('2026-11-01');
    await page.getByRole('button', { name: 'Publish the version' }).click();
    // A figure that cannot be read is refused beside its field; sent on, it would read as "not given".
    await expect.poll(() => earthFault.getAttribute('aria-invalid')).toBe('true');
    expect(await page.locator(`[id="${await earthFault.getAttribute('aria-describedby')}"]`).textContent()).toBe('“25 kA” is not a number.');
    expect(await page.getByRole('alert').filter({ hasText: 'Nothing was published' }).count()).toBe(1);
    // A decimal comma reads as written.
    await earthFault.fill('25,5');
    await page.getByRole('button', { name: 'Publish the version' }).click();
    const published = page.getByRole('status').filter({ hasText: 'Version 1 published' });
    await expect.poll(() => published.textContent()).toContain(`${study.code} rev 1`);
    expect(await published.textContent()).toContain('25.5 kA');
    await expect.poll(() => page.locator(`tr[data-asset="${code}"] [data-status]`).textContent()).toBe('needs review');
    await screenshot(page, 'register-needs-review');
  });

  it('the designer opens the study and starts a revision with the new value', async () => {
    const page = await as('designer@sheathwise.example');
    await openAsset(page);
    await page.getByTestId('asset-panel').getByRole('link', { name: study.code }).click();
    await page.waitForURL(`${appUrl}/studies/${study.studyId}`);
    await hydrated(page);
    const banner = page.getByTestId('needs-review');
    await expect.poll(() => banner.textContent()).toContain('the site\'s earth-fault level is now 25.5 kA');
    await page.getByRole('button', { name: 'Start a revision with the new values' }).click();
    await page.getByLabel('Confirm cases.3.earthFault.currentA').check();
    await screenshot(page, 'register-review-revision');
    await page.getByRole('button', { name: 'Write the confirmed values' }).click();
    await page.waitForURL(/\/revisions\//);
    const revisionId = new URL(page.url()).pathname.split('/').pop()!;
    const detail = await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200);
    expect(detail.revision.number).toBe(2);
    expect(detail.revision.inputs.cases[3].earthFault.currentA).toBe(25500);
  });

  it('the reminder of the inspection due in five days is in the catcher, with the review notices', async () => {
    await json(await send(sessions.admin, 'POST', '/api/register/reminders'), 200);
    const mail = await waitForMail(testEnv().mailWebUrl, (m) => m.some((x) => x.subject.includes(`Link-box inspection at ${code} is due on ${daysFromToday(5)}`)));
    expect(mail.some((x) => x.subject.includes(`${study.code} rev 1 needs review`) && x.to[0].address === 'designer@sheathwise.example')).toBe(true);
  });
});
