import { describe, expect, it } from 'vitest';
import type { Dialog } from 'playwright-core';
import { hydrated, screenshot, appUrl } from '../helpers/browser-session';
import { json, send } from '../helpers/workflow-api';
import { editorInBrowser } from '../helpers/editor-browser';

// The study editor in Debian's Chromium: a whole two-circuit cross-bonded study with an internal
// fault entered through the form and calculated; the unsaved-edits guard and the draft kept
// over a reload; a pasted decimal comma; a split that keeps SVL and ECC references; an edit
// conflict merged field by field. Every study here starts from the inputs a new study gets.

const { sessions, newStudy, open, stored, http } = editorInBrowser('ED', 'Editor');

describe('the study editor', () => {
  it('takes a two-circuit cross-bonded study with an internal fault entirely through the form, and calculates it', { timeout: 180_000 }, async () => {
    const revisionId = await newStudy();
    const page = await open(revisionId);
    await page.getByLabel('Cable type from the catalogue').selectOption('XL132-630');
    await page.getByRole('button', { name: 'Add to the study' }).click();
    await page.getByLabel('Cable type of C1').selectOption('XL132-630');
    await page.getByRole('button', { name: 'Add circuit' }).click();
    await page.getByLabel('Cable type of C2').selectOption('XL132-630');
    await page.getByLabel('Name of circuit C2').fill('Second circuit');
    await page.getByLabel('Offset of C2 in L1 (m)').fill('0,8');
    await page.getByLabel('Current in C2, case LOAD (A)').fill('700');
    await page.getByLabel('Current in C2, case F3 (A)').fill('20000');
    // An SVL at each cross-bonding joint, and an internal fault at the first of them.
    for (const j of [1, 2]) {
      await page.getByRole('button', { name: 'Add SVL' }).click();
      await page.getByLabel(`Joint of SVL ${j}`).selectOption(String(j));
    }
    await page.getByRole('button', { name: 'Add case' }).click();
    await page.getByLabel('Name of case K3').fill('Internal fault at J1');
    await page.getByLabel('Kind of case K3').selectOption('internal-fault');
    await page.getByLabel('Faulted circuit, case K3').selectOption('C2');
    await page.getByLabel('Faulted phase, case K3').selectOption('b');
    await page.getByLabel('Fault joint, case K3').selectOption('1');
    await page.getByLabel('Infeed from the start, case K3 (A)').fill('15000');
    await page.getByLabel('Infeed from the end, case K3 (A)').fill('5000');
    await page.getByLabel('Duration of case K3 (s)').fill('0,5');
    await page.getByLabel('SVLs conduct in case K3').check();
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await page.getByRole('button', { name: 'Calculate' }).click();
    await page.getByTestId('calculated').waitFor();
    await screenshot(page, 'editor-two-circuits');

    const r = await stored(revisionId);
    expect(r.inputs.circuits.map((c: { id: string; cableTypeId: string }) => `${c.id}:${c.cableTypeId}`)).toEqual(['C1:XL132-630', 'C2:XL132-630']);
    expect(r.inputs.layouts[0].circuits[1]).toMatchObject({ circuitId: 'C2', centreXM: 0.8 });
    expect(r.inputs.cases[2]).toMatchObject({ kind: 'internal-fault', durationS: 0.5, svlsConducting: true, internalFault: { circuitId: 'C2', phase: 'b', jointIndex: 1, fromStart: { currentA: 15000 }, fromEnd: { currentA: 5000 } } });
    expect(r.inputs.svls.map((s: { jointIndex: number }) => s.jointIndex)).toEqual([1, 2]);
    expect(r.results.cases.map((c: { caseId: string }) => c.caseId)).toEqual(['LOAD', 'F3', 'K3']);
    expect(r.resultsInputsHash).toBe(r.inputsHash);
  });

  it('names a bad field in words beside it and in the list, and scrolls to it', { timeout: 120_000 }, async () => {
    const revisionId = await newStudy();
    const page = await open(revisionId, sessions[0].page);
    await page.getByLabel('Length of section S2').fill('0');
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await page.getByTestId('error-list').getByText('Length of section S2').waitFor();
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Length of section S2');
    expect(await page.locator('[data-error-for="sections.1.lengthM"]').textContent()).toMatch(/greater than zero/);
    await page.getByLabel('Length of section S2').fill('470');
    await page.getByLabel('Length of section S2').blur();
    await expect.poll(() => page.locator('[data-error-for="sections.1.lengthM"]').count()).toBe(0);
    expect((await stored(revisionId)).version).toBe(1);
  });

  it('asks before leaving a tab or the page with unsaved edits, and offers them back after a reload', { timeout: 120_000 }, async () => {
    const revisionId = await newStudy();
    const page = await open(revisionId, sessions[0].page);
    await page.getByLabel('Soil resistivity (Ω·m)').fill('250');
    await page.getByLabel('Soil resistivity (Ω·m)').blur();
    await page.getByTestId('unsaved').waitFor();

    const dialogs: string[] = [];
    const dismiss = async (d: Dialog) => { dialogs.push(d.type()); await d.dismiss(); };
    page.on('dialog', dismiss);
    await page.getByRole('tab', { name: 'Results' }).click();
    await expect.poll(() => dialogs).toEqual(['confirm']);
    expect(await page.getByLabel('Soil resistivity (Ω·m)').inputValue()).toBe('250');
    page.off('dialog', dismiss);

    // Reload: the browser asks (accepted here), and the edits are offered back.
    const accept = async (d: Dialog) => { dialogs.push(d.type()); await d.accept(); };
    page.on('dialog', accept);
    await page.reload();
    await hydrated(page);
    page.off('dialog', accept);
    expect(dialogs).toContain('beforeunload');
    await page.getByTestId('draft-offer').waitFor();
    expect(await page.getByLabel('Soil resistivity (Ω·m)').inputValue()).toBe('100');
    await page.getByRole('button', { name: 'Restore my unsaved edits' }).click();
    expect(await page.getByLabel('Soil resistivity (Ω·m)').inputValue()).toBe('250');
    await page.getByTestId('unsaved').waitFor();
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await expect.poll(async () => (await stored(revisionId)).inputs.soilResistivityOhmM).toBe(250);
    // Saved: nothing is offered any more.
    await page.reload();
    await hydrated(page);
    await page.locator('form[aria-label="Study editor"][data-ready="true"]').waitFor();
    expect(await page.getByTestId('draft-offer').count()).toBe(0);
  });

  it('reads a pasted decimal comma as 480.5, and refuses one it cannot tell from two columns', { timeout: 120_000 }, async () => {
    const revisionId = await newStudy();
    const page = await open(revisionId, sessions[0].page);
    await page.getByLabel('Pasted sections').fill('S1,480,5\nS2,500\nS3,520');
    await page.getByRole('button', { name: 'Preview pasted rows' }).click();
    const preview = page.getByTestId('paste-preview');
    await preview.getByText(/Line 1 has 3 cells where the table has 2/).waitFor();
    expect(await preview.getByRole('button', { name: /Replace the sections/ }).isDisabled()).toBe(true);
    expect(await page.getByLabel('Length of section S1').inputValue()).toBe('500');

    await page.getByLabel('Pasted sections').fill('S1\t480,5\tL1\t0\nS2\t500\tL1\t0\nS3\t520\tL1\t0');
    await page.getByRole('button', { name: 'Preview pasted rows' }).click();
    expect(await preview.getByTestId('paste-length').allTextContents()).toEqual(['480.5', '500', '520']);
    await preview.getByRole('button', { name: 'Replace the sections with these 3' }).click();
    expect(await page.getByLabel('Length of section S1').inputValue()).toBe('480.5');
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await expect.poll(async () => (await stored(revisionId)).inputs.sections.map((s: { lengthM: number }) => s.lengthM)).toEqual([480.5, 500, 520]);
  });

  it('splits a section and keeps the SVL and ECC on the same joints and sections', { timeout: 120_000 }, async () => {
    const revisionId = await newStudy();
    const page = await open(revisionId, sessions[0].page);
    await page.getByRole('button', { name: 'Add ECC' }).click();
    await page.getByRole('button', { name: 'Add SVL' }).click();
    await page.getByLabel('Joint of SVL 1').selectOption('2'); // between S2 and S3
    await page.getByLabel('Electrode at J1').selectOption('own');
    await page.getByLabel('Earth resistance at J1 (Ω)').fill('2,5');
    await page.getByRole('button', { name: 'Split S1' }).click();
    const notes = page.getByTestId('edit-notes');
    await notes.getByText(/Bonding group 1 now has 4 minor sections/).waitFor();
    expect(await page.getByLabel('Joint of SVL 1').evaluate((s: HTMLSelectElement) => s.selectedOptions[0].textContent)).toMatch(/J3 .*\(S2\|S3\)/);
    expect(await page.getByLabel('Electrode at J2').inputValue()).toBe('own');
    expect(await page.getByLabel('ECC E1 from section').inputValue()).toBe('S1a');
    // The first half becomes a single-point section of its own; the other three stay cross-bonded.
    await page.getByLabel('Sections of group 1').fill('S1a');
    await page.getByLabel('Sections of group 1').blur();
    await page.getByLabel('Arrangement of group 1').selectOption('single-point');
    await page.getByRole('button', { name: 'Add group' }).click();
    expect(await page.getByLabel('Sections of group 2').inputValue()).toBe('S1b, S2, S3');
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await expect.poll(async () => (await stored(revisionId)).version).toBe(2);
    const r = await stored(revisionId);
    expect(r.inputs.sections.map((s: { id: string }) => s.id)).toEqual(['S1a', 'S1b', 'S2', 'S3']);
    expect(r.inputs.svls[0].jointIndex).toBe(3);
    expect(r.inputs.earthing.overrides).toEqual([{ jointIndex: 2, resistanceOhm: 2.5 }]);
    expect(r.inputs.eccs[0]).toMatchObject({ fromSectionId: 'S1a', toSectionId: 'S3' });
  });

  it('shows an edit conflict beside the person’s own edits and saves the fields merged', { timeout: 120_000 }, async () => {
    const revisionId = await newStudy();
    const page = await open(revisionId, sessions[0].page);
    await page.getByLabel('Soil resistivity (Ω·m)').fill('300');
    await page.getByLabel('Length of section S2').fill('450');
    // Meanwhile someone saves a new title and another S2 length.
    const theirs = { ...(await stored(revisionId)).inputs, title: 'Their title' };
    theirs.sections[1].lengthM = 455;
    await json(await send(http(), 'PUT', `/api/revisions/${revisionId}/inputs`, { version: 1, inputs: theirs }), 200);
    await page.getByRole('button', { name: 'Save inputs' }).click();
    const view = page.getByTestId('conflict-view');
    await view.waitFor();
    await screenshot(page, 'editor-conflict');
    expect((await view.getByTestId('conflict-field').evaluateAll((rows) => rows.map((r) => r.getAttribute('data-path')))).sort()).toEqual(['sections.1.lengthM', 'soilResistivityOhmM', 'title']);
    await view.getByLabel('Length of section S2: take theirs').check();
    await view.getByRole('button', { name: 'Use the merged values' }).click();
    await page.locator('form[aria-label="Study editor"][data-ready="true"]').waitFor();
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await expect.poll(async () => (await stored(revisionId)).version).toBe(3);
    const r = await stored(revisionId);
    expect([r.inputs.title, r.inputs.soilResistivityOhmM, r.inputs.sections[1].lengthM]).toEqual(['Their title', 300, 455]);
  });

  it('copies a study from its page and opens the copy', { timeout: 120_000 }, async () => {
    const revisionId = await newStudy();
    const studyId = (await stored(revisionId)).studyId;
    const page = sessions[0].page;
    await page.goto(`${appUrl}/studies/${studyId}`);
    await hydrated(page);
    const copyCode = `CP${process.pid % 1000}-${Date.now() % 100000}`;
    await page.getByLabel('Code of the copy').fill(copyCode);
    await page.getByLabel('Title of the copy').fill('A copy made from the page');
    await page.getByRole('button', { name: 'Copy and open the copy' }).click();
    await page.waitForURL((url) => url.pathname.startsWith('/revisions/') && !url.pathname.includes(revisionId));
    await hydrated(page);
    await page.getByRole('heading', { name: new RegExp(copyCode) }).waitFor();
    expect(await page.getByLabel('Title', { exact: true }).inputValue()).toBe('A copy made from the page');
  });
});
