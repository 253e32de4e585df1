import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { appUrl, browserAs, hydrated } from '../helpers/browser-session';
import { DEMO, demoIds, fixtureInputs, json, send } from '../helpers/workflow-api';
import { signedIn } from '../helpers/http-session';
import { DEMO_PASSWORD } from '../helpers/env';

// The project's studies table in the browser: pages by position (the server's `next`), forward and
// back, in the order chosen, starting again from the first page when the sort changes.

const COUNT = 12;
let session: Awaited<ReturnType<typeof browserAs>>;
let projectId: string;
let prefix: string;
const codes: string[] = [];

beforeAll(async () => {
  const designer = await signedIn(DEMO.designer, DEMO_PASSWORD);
  const ids = await demoIds(designer);
  projectId = ids.projectId;
  prefix = `TP${process.pid % 1000}${Date.now() % 100000}X`;
  for (let n = 0; n < COUNT; n++) {
    const code = `${prefix}${String(n).padStart(2, '0')}`;
    await json(await send(designer, 'POST', `/api/projects/${projectId}/studies`, { code, title: `Table paging ${code}`, kind: 'bonding', limitSetId: ids.limitSetId, inputs: fixtureInputs('kestrel-single-point-ecc') }), 201);
    codes.push(code);
  }
  session = await browserAs(DEMO.designer);
}, 120_000);
afterAll(async () => {
  await session?.close();
  expect(session?.errors ?? []).toEqual([]);
});

describe('the studies table', () => {
  it('pages forward and back in the chosen order, starts again at page 1 when the sort changes, and never goes unsorted', { timeout: 90_000 }, async () => {
    const { page } = session;
    page.setDefaultTimeout(20_000);
    await page.goto(`${appUrl}/projects/${projectId}`);
    await hydrated(page);
    const shown = () => page.getByTestId('studies-table').locator('tbody tr td:first-child').allTextContents();
    await page.getByLabel('Find by code or title').fill(prefix);
    await expect.poll(() => page.getByText(`Page 1 of 2 (${COUNT} studies)`).count()).toBe(1);
    expect(await shown()).toEqual(codes.slice(0, 10));

    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByText(`Page 2 of 2 (${COUNT} studies)`).waitFor();
    await expect.poll(shown).toEqual(codes.slice(10));
    expect(await page.getByRole('button', { name: 'Next' }).isDisabled()).toBe(true);

    await page.getByRole('button', { name: 'Previous' }).click();
    await page.getByText(`Page 1 of 2 (${COUNT} studies)`).waitFor();
    await expect.poll(shown).toEqual(codes.slice(0, 10));

    // Code, descending: the last two made come first, and the table is back on its first page.
    await page.getByRole('button', { name: 'Next' }).click();
    await page.getByText('Page 2 of 2').waitFor();
    await page.getByRole('button', { name: /^Code/ }).click();
    await page.getByText(`Page 1 of 2 (${COUNT} studies)`).waitFor();
    await expect.poll(shown).toEqual([...codes].reverse().slice(0, 10));
    // Clicked again, the order turns round; it never goes unsorted, and the header says which way.
    await page.getByRole('button', { name: /^Code/ }).click();
    await expect.poll(shown).toEqual(codes.slice(0, 10));
    expect(await page.getByRole('button', { name: /^Code/ }).textContent()).toContain('▲');
  });
});
