import type { Page } from 'playwright-core';
import { expect } from 'vitest';

/** Asks a queue on the home page for one more page, and waits until its rows are on screen. */
export async function showMoreOf(page: Page, role: string): Promise<void> {
  const queue = page.getByTestId(`queue-${role}`);
  const before = await queue.getByRole('listitem').count();
  await queue.getByRole('button', { name: 'Show more' }).click();
  await expect.poll(() => queue.getByRole('listitem').count()).toBeGreaterThan(before);
}

/**
 * Opens a study's revision from a queue on the home page, paging on until it shows (longest waiting comes first).
 * The queue renders after its fetch: wait for the study's link or the way to the next page before deciding.
 */
export async function openFromQueue(page: Page, role: string, code: string): Promise<void> {
  const queue = page.getByTestId(`queue-${role}`);
  const link = queue.getByRole('link', { name: new RegExp(code) });
  const more = queue.getByRole('button', { name: 'Show more' });
  for (;;) {
    await link.or(more).first().waitFor();
    if (await link.count()) break;
    await showMoreOf(page, role);
  }
  await link.click();
}
