import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase } from '../../src/lib/db/client';
import { QUEUE_PAGE } from '../../src/lib/studies/queue.service';
import { appUrl, browserAs, hydrated } from '../helpers/browser-session';
import { showMoreOf } from '../helpers/desk-browser';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';
import { signedIn } from '../helpers/http-session';
import { designerWaiting, fillDesignerQueue } from '../helpers/queue-drafts';
import { DEMO } from '../helpers/workflow-api';

// The home page with a long queue: a page of the longest waiting, how many there are, and more on request.

const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
let session: Awaited<ReturnType<typeof browserAs>>;

beforeAll(async () => {
  await fillDesignerQueue(await signedIn(DEMO.designer, DEMO_PASSWORD), db);
  session = await browserAs(DEMO.designer);
}, 120_000);
afterAll(async () => {
  await session?.close();
  await pool.end();
  expect(session?.errors ?? []).toEqual([]);
});

describe('the home page queue', () => {
  it('shows a page of the longest waiting with the total, and the next page when asked', { timeout: 60_000 }, async () => {
    const { page } = session;
    const total = await designerWaiting(db);
    await page.goto(`${appUrl}/`);
    await hydrated(page);
    const queue = page.getByTestId('queue-designer');
    await expect.poll(() => queue.getByRole('listitem').count()).toBe(QUEUE_PAGE);
    const fmt = (n: number) => n.toLocaleString('en-GB');
    expect(await page.locator('#queue-heading').textContent()).toContain(`(${fmt(total)})`);
    expect(await queue.getByTestId('queue-shown').textContent()).toContain(`${QUEUE_PAGE} of ${fmt(total)} shown`);
    await showMoreOf(page, 'designer');
    const shown = Math.min(total, 2 * QUEUE_PAGE);
    expect(await queue.getByRole('listitem').count()).toBe(shown);
    // Each shown once.
    const links = await queue.getByRole('link').evaluateAll((as) => as.map((a) => a.getAttribute('href')));
    expect(new Set(links).size).toBe(shown);
    if (shown < total) expect(await queue.getByTestId('queue-shown').textContent()).toContain(`${shown} of ${fmt(total)} shown`);
    else expect(await queue.getByTestId('queue-shown').count()).toBe(0);
  });
});
