import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appUrl, browserAs, hydrated, screenshot } from '../helpers/browser-session';
import { signedIn, type HttpSession } from '../helpers/http-session';
import { DEMO, readyDraft } from '../helpers/workflow-api';
import { DEMO_PASSWORD } from '../helpers/env';
import { downloadRecord } from '../helpers/record-download';
import { hasCell, readDocx } from '../helpers/docx-text';
import { ENGINE_VERSION } from '../../src/lib/calc/constants';

// The method statement as a checker reaches it: from the checklist's source column, from the
// results tab, and from the address and section printed in the calculation record.

let revisionId = '';
let designer: HttpSession;
let session: Awaited<ReturnType<typeof browserAs>>;
let page: Page;

const summary = new RegExp(`^Validation of engine ${ENGINE_VERSION.replace(/\./g, '\\.')}: (\\d+) of \\1 reference values within tolerance$`);

/** The heading a fragment points at is on screen (scrolled to), not merely present. */
async function targetInView(p: Page, id: string) {
  const inView = () =>
    p.evaluate((target) => {
      const box = document.getElementById(target)?.getBoundingClientRect();
      return { found: !!box, top: box?.top ?? NaN, bottom: box?.bottom ?? NaN, height: window.innerHeight, scrollY: window.scrollY };
    }, id);
  await expect.poll(async () => {
    const v = await inView();
    return v.found && v.bottom > 0 && v.top < v.height ? 'in view' : JSON.stringify(v);
  }, { timeout: 10_000 }).toBe('in view');
}

describe('the method statement in the browser', { timeout: 60_000 }, () => {
  beforeAll(async () => {
    designer = await signedIn(DEMO.designer, DEMO_PASSWORD);
    ({ revisionId } = await readyDraft(designer, 'fernhollow-cross-bonded', 'M'));
    session = await browserAs(DEMO.designer);
    page = session.page;
  });
  afterAll(async () => {
    await session?.close();
    expect(session?.errors ?? []).toEqual([]);
  });

  it('opens the section that computes a checklist item from its source link, with the validation summary on the same page', async () => {
    await page.goto(`${appUrl}/revisions/${revisionId}`);
    await hydrated(page);
    await page.getByRole('tab', { name: 'Checklist' }).click();
    const row = page.getByTestId('checklist').locator('tr[data-testid^="item-standing-voltage-normal:"]').first();
    const link = row.getByTestId('method-link');
    await expect(link.textContent()).resolves.toBe('method, section 2.3');
    await expect(link.getAttribute('title')).resolves.toBe('Sheathwise method statement, engine 2.x, section 2.3');
    await link.click();
    await page.waitForURL(`${appUrl}/methods#section-2-3`);
    await targetInView(page, 'section-2-3');
    await expect(page.locator('#section-2-3').textContent()).resolves.toContain('2.3 What each voltage is measured against');
    expect((await page.getByTestId('validation-summary').textContent())?.trim()).toMatch(summary);
    await screenshot(page, 'method-statement');
    // A row of the validation table leads to the check value's definition.
    await page.getByTestId('validation-report').getByRole('link', { name: 'XB-7', exact: true }).first().click();
    await page.waitForURL(`${appUrl}/methods#check-XB-7`);
    await targetInView(page, 'check-XB-7');
  });

  it('links the results tab to the statement of the engine that computed them', async () => {
    await page.goto(`${appUrl}/revisions/${revisionId}`);
    await hydrated(page);
    await page.getByRole('tab', { name: 'Results' }).click();
    const link = page.getByTestId('method-statement-link');
    await expect(link.textContent()).resolves.toBe('method statement, engine 2.x');
    await link.click();
    await page.waitForURL(`${appUrl}/methods`);
    await page.getByTestId('method-statement').locator('h2#section-12').waitFor();
  });

  it("opens the statement from the record: the address and a checklist row's section printed in it", async () => {
    const { bytes } = await downloadRecord(designer, revisionId);
    const text = readDocx(bytes).bodyText;
    const url = /served at (\S+?)\)/.exec(text)?.[1];
    expect(url).toBe(`${appUrl}/methods`);
    expect(text).toMatch(/The table of every reference value, with its source, the engine's value and the tolerance, is at \S+\/methods#validation\./);
    expect(hasCell(text, 'method section')).toBe(true);
    expect(hasCell(text, '2.3')).toBe(true);
    await page.goto(`${url}#section-2-3`);
    await targetInView(page, 'section-2-3');
    await page.goto(`${url}#validation`);
    await targetInView(page, 'validation');
    expect((await page.getByTestId('validation-summary').textContent())?.trim()).toMatch(summary);
  });
});
