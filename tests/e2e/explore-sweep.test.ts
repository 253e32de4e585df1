import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, browserAs, hydrated, screenshot } from '../helpers/browser-session';
import { DEMO, demoSessions, readyDraft } from '../helpers/workflow-api';

// Issue 14: the designer runs a sensitivity sweep in the Explore tab, sees the progress bar
// with the count done and the chart with the limit line, and saves it with the revision; then
// the same with two inputs, drawn as a family of curves with the grid tabulated.

describe('design exploration in Chromium', () => {
  let page: Page;
  let close: () => Promise<void>;
  let errors: string[];
  let revisionId: string;

  beforeAll(async () => {
    const sessions = await demoSessions();
    ({ revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'B'));
    ({ page, close, errors } = await browserAs(DEMO.designer));
  });
  afterAll(async () => close?.());

  /** The Explore tab's sweep form, opened afresh on the revision. */
  async function sweepForm() {
    await page.goto(`${appUrl}/revisions/${revisionId}`);
    await hydrated(page);
    await page.getByRole('tab', { name: 'Explore' }).click();
    return page.getByRole('form', { name: 'Sweep settings' });
  }

  /** The form with the largest load current swept from 200 A to 4000 A in `points` points. */
  async function loadCurrentSweep(points: string) {
    const form = await sweepForm();
    await form.getByLabel('Input', { exact: true }).selectOption({ label: 'Largest load current (A)' });
    await form.getByLabel('From', { exact: true }).fill('200');
    await form.getByLabel('To', { exact: true }).fill('4000');
    await form.getByLabel('Points', { exact: true }).fill(points);
    return form;
  }

  it('runs a sweep with a progress bar, draws the chart and saves it', async () => {
    const form = await loadCurrentSweep('200');
    await form.getByRole('button', { name: 'Run the sweep' }).click();
    const progress = page.getByTestId('sweep-progress');
    await progress.waitFor();
    expect(await progress.getAttribute('max')).toBe('200');
    await expect(page.getByTestId('sweep-count').textContent()).resolves.toMatch(/^\d+ of 200 points$/);
    await page.getByTestId('sweep-chart').waitFor({ timeout: 60_000 });
    await page.getByTestId('sweep-chart').locator('.recharts-line').first().waitFor();
    // The progress came pushed by the server (its event stream was opened), not only by polling.
    const streamed = await page.evaluate(() => performance.getEntriesByType('resource').some((e) => /\/explorations\/[0-9a-f-]+\/events$/.test(e.name)));
    expect(streamed).toBe(true);
    // The limit line of the standing voltage (demo owner limit, 65 V) is drawn on the chart.
    await page.getByTestId('sweep-chart').getByText(/^limit 65 V/).waitFor();
    await expect(page.getByTestId('sweep-verdict').textContent()).resolves.toMatch(/first fails at|passes at every grid point/);
    await screenshot(page, 'explore-sweep');
    await page.getByRole('button', { name: 'Save the sweep with the revision' }).click();
    await page.getByTestId('sweep-saved').waitFor();
    const list = await page.evaluate(async (id) => (await fetch(`/api/revisions/${id}/explorations`)).json(), revisionId);
    expect(list.explorations.filter((e: { kind: string; savedAt: string | null }) => e.kind === 'sweep' && e.savedAt)).toHaveLength(1);
    expect(errors).toEqual([]);
  });

  it('sweeps two inputs: one curve per value of the second, the grid table with failing points, saved with both axes', async () => {
    // With the event stream refused, the page follows the run by polling its row instead.
    let refusedStreams = 0;
    await page.route('**/explorations/*/events', (route) => (refusedStreams++, route.abort()));
    const form = await loadCurrentSweep('10');
    await form.getByLabel('Vary a second input (one curve per value)').check();
    // The first input is not offered again as the second.
    await expect(form.getByLabel('Second input', { exact: true }).locator('option', { hasText: 'Largest load current (A)' }).count()).resolves.toBe(0);
    await form.getByLabel('Second input', { exact: true }).selectOption({ label: 'Soil resistivity (Ω·m)' });
    await form.getByLabel('Second from', { exact: true }).fill('20');
    await form.getByLabel('Second to', { exact: true }).fill('2000');
    await form.getByLabel('Second points', { exact: true }).fill('3');
    await form.getByText('30 grid points.').waitFor();
    await form.getByRole('button', { name: 'Run the sweep' }).click();
    const progress = page.getByTestId('sweep-progress');
    await progress.waitFor();
    expect(await progress.getAttribute('max')).toBe('30');
    const chart = page.getByTestId('sweep-chart');
    await chart.waitFor({ timeout: 60_000 });
    // Three curves, named in the legend by the soil resistivity they were calculated at.
    await expect.poll(() => chart.locator('.recharts-line').count()).toBe(3);
    for (const v of ['20', '1010', '2000']) await chart.getByText(`Soil resistivity, Ω·m = ${v}`, { exact: true }).waitFor();
    await chart.getByText(/^limit 65 V/).waitFor();
    const grid = page.getByTestId('sweep-grid');
    await expect(grid.locator('tbody tr').count()).resolves.toBe(3);
    await expect(grid.locator('tbody tr').first().locator('td').count()).resolves.toBe(10);
    // The verdict names both inputs at the first failing point.
    await expect(page.getByTestId('sweep-verdict').textContent()).resolves.toMatch(/first fails at .+ \(Largest normal-load current.*\) with .+ \(Soil resistivity, Ω·m\)|passes at every grid point/);
    expect(refusedStreams).toBeGreaterThan(0);
    await screenshot(page, 'explore-sweep-two-inputs');
    await page.getByRole('button', { name: 'Save the sweep with the revision' }).click();
    await page.getByTestId('sweep-saved').waitFor();
    const list = await page.evaluate(async (id) => (await fetch(`/api/revisions/${id}/explorations`)).json(), revisionId);
    const twoInput = list.explorations.filter((e: { kind: string; savedAt: string | null; params: { axes: unknown[] } }) => e.kind === 'sweep' && e.savedAt && e.params.axes.length === 2);
    expect(twoInput).toHaveLength(1);
    expect(errors).toEqual([]);
  });

  it('counts the grid as it is typed, warns over the server limit, and shows a refused field beside it in words', async () => {
    const started: string[] = [];
    page.on('request', (r) => (r.method() === 'POST' && /\/explorations$/.test(r.url()) ? started.push(r.url()) : undefined));
    const form = await sweepForm();
    const run = form.getByRole('button', { name: 'Run the sweep' });
    const count = form.getByTestId('sweep-grid-count');
    await form.getByRole('textbox', { name: 'Points', exact: true }).fill('200');
    await form.getByLabel('Vary a second input (one curve per value)').check();
    await form.getByRole('textbox', { name: 'Second points', exact: true }).fill('6');
    // 200 × 6 is over the server's 1,000 points (SWEEP_LIMITS.maxPoints): said before anything is sent.
    await expect.poll(() => count.textContent()).toBe('1,200 grid points: over the limit of 1,000; use fewer points.');
    expect(await run.isDisabled()).toBe(true);
    await form.getByRole('textbox', { name: 'Second points', exact: true }).fill('5');
    await expect.poll(() => count.textContent()).toBe('1,000 grid points.');
    expect(await run.isDisabled()).toBe(false);

    // A range that ends below its start: refused beside the field, in words, and not sent.
    await form.getByRole('textbox', { name: 'Points', exact: true }).fill('4');
    await form.getByRole('textbox', { name: 'Second from', exact: true }).fill('20');
    await form.getByRole('textbox', { name: 'Second to', exact: true }).fill('10');
    await run.click();
    const secondTo = form.getByRole('textbox', { name: 'Second to', exact: true });
    await expect.poll(() => secondTo.getAttribute('aria-invalid')).toBe('true');
    const note = form.locator(`[id="${await secondTo.getAttribute('aria-describedby')}"]`);
    expect(await note.textContent()).toBe('Second input — to value: The range must end at or above its start.');
    expect(await form.getByRole('textbox', { name: 'Second from', exact: true }).getAttribute('aria-invalid')).toBe('false');
    expect(await page.locator('body').textContent()).not.toContain('axes.1');
    expect(started).toEqual([]);
    await screenshot(page, 'explore-sweep-field-error');

    // The tornado and placement forms do the same: beside the field, in words, nothing sent.
    const pct = page.getByRole('textbox', { name: '± range, % of each input', exact: true });
    await pct.fill('150');
    await page.getByRole('button', { name: 'Rank the inputs' }).click();
    await expect.poll(() => pct.getAttribute('aria-invalid')).toBe('true');
    expect(await page.locator(`[id="${await pct.getAttribute('aria-describedby')}"]`).textContent()).toBe('± range: The ± range must stay below 100 %.');
    const placement = page.getByRole('form', { name: 'Placement settings' });
    const windowsBox = placement.getByRole('textbox', { name: 'Windows', exact: true });
    await windowsBox.fill('400-600; -50-900');
    await placement.getByRole('button', { name: 'Suggest joint positions' }).click();
    await expect.poll(() => windowsBox.getAttribute('aria-invalid')).toBe('true');
    expect(await placement.locator(`[id="${await windowsBox.getAttribute('aria-describedby')}"]`).textContent()).toContain('Window 2 — ');
    expect(await page.locator('body').textContent()).not.toMatch(/inputs\.\d|windows\.\d/);
    expect(started).toEqual([]);

    // Put right, the error goes and the sweep runs.
    await form.getByRole('textbox', { name: 'Second to', exact: true }).fill('30');
    await run.click();
    await page.getByTestId('sweep-progress').or(page.getByTestId('sweep-chart')).first().waitFor();
    expect(await secondTo.getAttribute('aria-invalid')).toBe('false');
    expect(started).toHaveLength(1);
    expect(errors).toEqual([]);
  });
});
