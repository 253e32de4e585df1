import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, browserAs, hydrated, screenshot } from '../helpers/browser-session';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoSessions, json, send } from '../helpers/workflow-api';
import { daysFromToday, issuedStudy, newAsset, ownStandard, tag } from '../integration/register.fixture';

// In Debian's Chromium: the designer changes a circuit's details in the register (a refused
// field shows beside it), unlinks its covering study, and removes it from the register.

let sessions: Record<DemoRole, HttpSession>;
let page: Page;
let close: () => Promise<void>;
let errors: string[] = [];
const code = `EE${tag()}`;
let study: Awaited<ReturnType<typeof issuedStudy>>;

const row = () => page.locator(`tr[data-asset="${code}"]`);

beforeAll(async () => {
  sessions = await demoSessions();
  study = await issuedStudy(sessions);
  const std = await ownStandard(sessions.admin);
  const circuit = await newAsset(sessions.designer, study.projectId, { kind: 'circuit', code, name: 'Browser circuit (invented)', ownerStandard: std.ownerStandard, inServiceOn: daysFromToday(400) });
  await json(await send(sessions.designer, 'POST', `/api/assets/${circuit.id}/studies`, { studyId: study.studyId, studyCircuitId: 'C1' }), 201);
  ({ page, close, errors } = await browserAs('designer@sheathwise.example'));
}, 120_000);

afterAll(async () => {
  await close?.();
  expect(errors).toEqual([]);
});

describe('changing and removing an asset in the browser', { timeout: 90_000 }, () => {
  it('refuses a new asset whose code another holds in another case, the error beside the code and naming that asset', async () => {
    await page.goto(`${appUrl}/projects/${study.projectId}/register`);
    await hydrated(page);
    await page.getByRole('button', { name: 'New asset' }).click();
    const form = page.locator('form').filter({ has: page.getByRole('button', { name: 'Add the asset' }) });
    const codeBox = form.getByRole('textbox', { name: 'Code', exact: true });
    await codeBox.fill(code.toLowerCase());
    await form.getByRole('textbox', { name: 'Name', exact: true }).fill('Same code, other case (invented)');
    await form.getByRole('textbox', { name: 'Owner standard', exact: true }).fill('Invented');
    await form.getByRole('button', { name: 'Add the asset' }).click();
    await expect.poll(() => codeBox.getAttribute('aria-invalid')).toBe('true');
    const note = form.locator(`[id="${await codeBox.getAttribute('aria-describedby')}"]`);
    expect(await note.textContent()).toBe(`Code ${code.toLowerCase()} is already used in this project as ${code} (Browser circuit (invented)): codes are the same whatever their case.`);
  });

  it('changes the name, with a refused field shown beside it, then unlinks the study and removes the asset', async () => {
    await page.goto(`${appUrl}/projects/${study.projectId}/register`);
    await hydrated(page);
    await page.getByLabel('Find by asset code or name').fill(code);
    await row().click();
    const panel = page.getByTestId('asset-panel');
    await panel.waitFor();
    await expect.poll(() => row().locator('[data-status]').textContent()).toBe('covered');

    await panel.getByRole('button', { name: 'Change details' }).click();
    const form = panel.getByRole('form', { name: 'Change the asset' });
    await form.getByLabel('In service on (UTC date)').fill('2023-02-29');
    await form.getByRole('button', { name: 'Save the changes' }).click();
    await expect.poll(() => form.textContent()).toContain('In service on: give a real date');
    // The error is beside the field, not in its name: the field keeps its label as its name and is described by the error.
    const date = form.getByRole('textbox', { name: 'In service on (UTC date)', exact: true });
    expect(await date.getAttribute('aria-invalid')).toBe('true');
    const describedBy = (await date.getAttribute('aria-describedby'))!;
    expect(await form.locator(`[id="${describedBy}"]`).textContent()).toContain('In service on: give a real date');
    expect(await form.getByRole('textbox', { name: 'Name', exact: true }).getAttribute('aria-invalid')).toBe('false');
    await form.getByLabel('In service on (UTC date)').fill(daysFromToday(400));
    await form.getByLabel('Name').fill('Browser circuit, renamed (invented)');
    await form.getByRole('button', { name: 'Save the changes' }).click();
    await expect.poll(() => row().textContent()).toContain('Browser circuit, renamed (invented)');
    await expect.poll(() => panel.getByRole('heading', { level: 2 }).textContent()).toContain('renamed');
    await screenshot(page, 'register-asset-changed');

    await panel.getByRole('button', { name: 'Unlink' }).click();
    await panel.getByRole('button', { name: `Unlink ${study.code}` }).click();
    await expect.poll(() => row().locator('[data-status]').textContent()).toBe('no issued study');
    await expect.poll(() => panel.textContent()).toContain('No study is linked yet.');

    await panel.getByRole('button', { name: 'Remove from the register' }).click();
    await panel.getByRole('button', { name: `Remove ${code}` }).click();
    await expect.poll(() => row().count()).toBe(0);
    await expect.poll(() => page.getByTestId('asset-panel').count()).toBe(0);
  });
});
