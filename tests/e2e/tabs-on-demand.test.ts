import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, browserAs, hydrated, screenshot } from '../helpers/browser-session';
import { DEMO, readyDraft } from '../helpers/workflow-api';
import { signedIn } from '../helpers/http-session';
import { DEMO_PASSWORD } from '../helpers/env';

// Issue 12 in the browser: the revision page fetches a tab's code when the tab opens (the
// charts with Results, the editor with Inputs), and a tab whose code cannot be fetched says so
// instead of blanking the workspace.

/** Scripts the page fetched from /_astro, by file name. */
function scriptLog(page: Page): string[] {
  const fetched: string[] = [];
  page.on('request', (req) => {
    const m = /\/_astro\/([\w.-]+\.js)$/.exec(new URL(req.url()).pathname);
    if (m) fetched.push(m[1]);
  });
  return fetched;
}

const fetchedChunk = (fetched: string[], name: string) => fetched.some((f) => f.startsWith(`${name}.`));

describe('revision tabs load their code on demand', { timeout: 60_000 }, () => {
  let session: Awaited<ReturnType<typeof browserAs>>;
  let revisionUrl: string;

  beforeAll(async () => {
    const { revisionId } = await readyDraft(await signedIn(DEMO.designer, DEMO_PASSWORD), 'fernhollow-cross-bonded', 'L');
    revisionUrl = `${appUrl}/revisions/${revisionId}`;
    session = await browserAs(DEMO.designer);
  });
  afterAll(async () => {
    await session?.close();
    expect(session?.errors ?? []).toEqual([]);
  });

  it('opens on the editor without the charts, and fetches the charts with the Results tab', async () => {
    const { page } = session;
    const fetched = scriptLog(page);
    await page.goto(revisionUrl);
    await hydrated(page);
    await page.getByTestId('cross-section-sketch').waitFor();
    expect(fetchedChunk(fetched, 'BondingEditor'), fetched.join(', ')).toBe(true);
    expect(fetchedChunk(fetched, 'ResultsTab'), fetched.join(', ')).toBe(false);
    expect(fetchedChunk(fetched, 'RouteProfileChart'), fetched.join(', ')).toBe(false);

    await page.getByRole('tab', { name: 'Results' }).click();
    await page.getByTestId('route-profile').locator('svg').first().waitFor();
    expect(fetchedChunk(fetched, 'ResultsTab'), fetched.join(', ')).toBe(true);
    expect(fetchedChunk(fetched, 'RouteProfileChart'), fetched.join(', ')).toBe(true);
  });

  it('a tab whose code cannot be fetched says so, and the other tabs still work', async () => {
    const { page } = session;
    await page.route(/\/_astro\/HistoryTab\.[\w-]+\.js$/, (route) => route.abort('connectionrefused'));
    await page.goto(revisionUrl);
    await hydrated(page);
    await page.getByRole('tab', { name: 'History' }).click();
    const note = page.getByRole('tabpanel').getByRole('alert');
    await note.waitFor();
    expect(await note.textContent()).toContain('This part of the page could not be shown');
    await expect(note.getByRole('button', { name: 'Reload the page' }).isVisible()).resolves.toBe(true);
    await screenshot(page, 'tab-code-unavailable');

    await page.getByRole('tab', { name: 'Checklist' }).click();
    await page.getByTestId('checklist').waitFor();
    await page.unroute(/\/_astro\/HistoryTab\.[\w-]+\.js$/);
  });
});
