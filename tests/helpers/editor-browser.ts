import { afterAll, afterEach, beforeAll, expect } from 'vitest';
import type { Page } from 'playwright-core';
import { browserAs, hydrated, screenshot, appUrl } from './browser-session';
import { DEMO, demoIds, json, send } from './workflow-api';
import { signedIn, type HttpSession } from './http-session';
import { DEMO_PASSWORD } from './env';
import { defaultBondingInputs, defaultExposureInputs } from '../../src/lib/studies/default-inputs';

/**
 * What the editor's browser tests share: the designer over HTTP and in Chromium, studies that
 * start from the inputs a new study gets, the revision page opened with its editor ready, and a
 * screenshot and the error list left behind when a test fails. Call at the top of a test file.
 */
export function editorInBrowser(codePrefix: string, titleWord: string) {
  const sessions: Array<{ page: Page; close: () => Promise<void>; errors: string[] }> = [];
  let designer: HttpSession;
  let ids: { projectId: string; limitSetId: string };
  let n = 0;

  beforeAll(async () => {
    designer = await signedIn(DEMO.designer, DEMO_PASSWORD);
    ids = await demoIds(designer);
  });
  // A failed step leaves a picture and the error list behind, so the cause is visible without a rerun.
  afterEach(async (ctx) => {
    const page = sessions[0]?.page;
    if (!page || ctx.task.result?.state !== 'fail') return;
    await screenshot(page, `${codePrefix.toLowerCase()}-failed-${ctx.task.name.slice(0, 30).replace(/\W+/g, '-')}`);
    const list = page.getByTestId('error-list');
    if (await list.count()) console.log('error list:', await list.textContent());
  });
  afterAll(async () => {
    for (const s of sessions) await s.close();
    expect(sessions.flatMap((s) => s.errors)).toEqual([]);
  });

  return {
    sessions,
    /** A new study as the designer, with the inputs a new study gets; the id of its revision 1. */
    async newStudy(kind: 'bonding' | 'exposure' = 'bonding'): Promise<string> {
      const code = `${codePrefix}${process.pid % 1000}-${Date.now() % 100000}-${n++}`;
      const title = `${titleWord} test ${code}`;
      const inputs = kind === 'bonding' ? defaultBondingInputs(title) : defaultExposureInputs(title);
      const body = await json(await send(designer, 'POST', `/api/projects/${ids.projectId}/studies`, { code, title, kind, limitSetId: ids.limitSetId, inputs }), 201);
      return body.revision.id as string;
    },
    /** The revision page with its editor ready, in `page`, else in the first browser session (started on first use). */
    async open(revisionId: string, page?: Page): Promise<Page> {
      if (!page && !sessions.length) sessions.push(await browserAs(DEMO.designer));
      const p = page ?? sessions[0].page;
      p.setDefaultTimeout(20_000);
      await p.goto(`${appUrl}/revisions/${revisionId}`);
      await hydrated(p);
      await p.locator('form[aria-label="Study editor"][data-ready="true"]').waitFor();
      return p;
    },
    /** The revision as stored. */
    stored: async (revisionId: string) => (await json(await designer.fetch(`/api/revisions/${revisionId}`), 200)).revision,
    http: () => designer,
  };
}
