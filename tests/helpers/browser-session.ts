import path from 'node:path';
import type { Page } from 'playwright-core';
import { launchBrowser } from './browser';
import { DEMO_PASSWORD, testEnv } from './env';

const { appUrl, artifacts } = testEnv();

/** A browser signed in as one person, through the real sign-in form. */
export async function browserAs(email: string, password = DEMO_PASSWORD) {
  const { context, close } = await launchBrowser();
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(e.message));
  await page.goto(`${appUrl}/signin`);
  await hydrated(page);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(`${appUrl}/`);
  await hydrated(page);
  return { page, close, errors };
}

/** Waits until every island on the page has hydrated (Astro removes the ssr attribute), so input reaches React. */
export async function hydrated(page: Page) {
  await page.waitForLoadState('load');
  await page.waitForFunction(() => [...document.querySelectorAll('astro-island')].every((i) => !i.hasAttribute('ssr')));
}

export async function screenshot(page: Page, name: string) {
  await page.screenshot({ path: path.join(artifacts, `${name}.png`), fullPage: true });
}

export { appUrl };
