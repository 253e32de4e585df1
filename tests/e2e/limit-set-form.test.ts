import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, browserAs, hydrated, screenshot } from '../helpers/browser-session';

// The administrator publishes a limit set's next version through the form, field by field: a
// blank limit is refused beside its field and nothing is published until it is fixed.

describe('limit set version form in Chromium', () => {
  let page: Page;
  let close: () => Promise<void>;
  let errors: string[];

  beforeAll(async () => {
    ({ page, close, errors } = await browserAs('admin@sheathwise.example'));
  });
  afterAll(async () => close?.());

  it('refuses a blank limit beside its field, then publishes the corrected version', async () => {
    await page.goto(`${appUrl}/admin`);
    await hydrated(page);
    const heading = page.locator('#limit-sets').locator('..').locator('h3').first();
    const before = Number((await heading.textContent())!.match(/version (\d+)/)![1]);
    await page.getByRole('button', { name: 'Publish a new version…' }).first().click();
    const form = page.getByRole('form', { name: 'New limit set version' });
    const limit = form.getByLabel('Standing voltage to local earth, normal load limit', { exact: true });
    const value = await limit.inputValue();
    expect(Number(value)).toBeGreaterThan(0);

    await limit.fill('');
    await form.getByRole('button', { name: 'Publish this version' }).click();
    await expect(form.getByRole('alert').first().textContent()).resolves.toBe('Give this limit as a number.');
    expect(await heading.textContent()).toContain(`version ${before},`);

    // Same value back, its source restated: a new version that changes no check elsewhere.
    await limit.fill(value);
    const source = form.getByLabel('Standing voltage to local earth, normal load source', { exact: true });
    await source.fill(`${await source.inputValue()} (restated)`);
    await form.getByRole('button', { name: 'Publish this version' }).click();
    await form.waitFor({ state: 'detached' });
    await page.getByText(`version ${before + 1},`).waitFor();
    await expect(page.getByTestId('limits').first().textContent()).resolves.toContain('(restated)');
    await screenshot(page, 'limit-set-published');
    expect(errors).toEqual([]);
  });
});
