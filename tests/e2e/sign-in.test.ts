import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import path from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { launchBrowser } from '../helpers/browser';
import { DEMO_PASSWORD, testEnv } from '../helpers/env';

const { appUrl, artifacts } = testEnv();

describe('sign in and out in Chromium', () => {
  let context: BrowserContext;
  let close: () => Promise<void>;
  let page: Page;

  beforeAll(async () => {
    ({ context, close } = await launchBrowser());
    page = await context.newPage();
  });
  afterAll(async () => close?.());

  it('shows field errors for an empty form and a message for a wrong password', async () => {
    await page.goto(`${appUrl}/`);
    await page.waitForURL(/\/signin/);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.getByText('Enter your e-mail address.').isVisible()).resolves.toBe(true);
    await page.getByLabel('E-mail').fill('designer@sheathwise.example');
    await page.getByLabel('Password').fill('wrong-password');
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('alert').waitFor();
    expect(await page.getByRole('alert').textContent()).toContain('do not match an account');
  });

  it('signs in through the form and shows the home page with the queue, in Noto Sans', async () => {
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.waitForURL(`${appUrl}/`);
    await expect(page.getByTestId('whoami').textContent()).resolves.toContain('Ada Okonkwo');
    await page.getByTestId('queue-designer').waitFor();
    await page.evaluate(() => document.fonts.ready);
    // check() alone is true when no face is declared at all, so look for a loaded face.
    const fontLoaded = await page.evaluate(() =>
      [...document.fonts].some((f) => f.family.replace(/"/g, '') === 'Noto Sans' && f.status === 'loaded'),
    );
    const family = await page.evaluate(() => getComputedStyle(document.body).fontFamily);
    expect(family).toContain('Noto Sans');
    expect(fontLoaded).toBe(true);
    await page.screenshot({ path: path.join(artifacts, 'home.png') });
  });

  it('keeps the button off until the page runs, so the browser never sends the password itself', async () => {
    // Before hydration a click would fall through to the browser's own GET, with the password in
    // the address, and no sign-in. Without JavaScript the page stays as the server sent it.
    const plain = await launchBrowser({ javaScriptEnabled: false });
    try {
      const early = await plain.context.newPage();
      await early.goto(`${appUrl}/signin`);
      await expect(early.getByRole('button', { name: 'Sign in' }).isDisabled()).resolves.toBe(true);
      await expect(early.locator('form[aria-label="Sign in"]').getAttribute('method')).resolves.toBe('post');
      // The invitation form carries a password and the link's token: the same holds.
      await early.goto(`${appUrl}/invitation/any-token`);
      await expect(early.getByRole('button', { name: 'Set my password' }).isDisabled()).resolves.toBe(true);
      await expect(early.locator('form').getAttribute('method')).resolves.toBe('post');
    } finally {
      await plain.close();
    }
  });

  it('signs out and lands on the sign-in page, with the home page closed again', async () => {
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/signin/);
    await page.goto(`${appUrl}/`);
    await page.waitForURL(/\/signin/);
    expect(new URL(page.url()).pathname).toBe('/signin');
  });
});
