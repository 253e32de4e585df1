import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot } from '../helpers/browser-session';
import { formatQuantity } from '../../src/lib/format';
import { cableConstructionSchema } from '../../src/lib/schemas/bonding-study.schema';
import { deriveCableParameters } from '../../src/lib/calc/cable/derive-cable';
import { STARTING_CONSTRUCTION } from '../../src/components/editor/CableConstructionFields';
import { editorInBrowser } from '../helpers/editor-browser';

// The forms in Debian's Chromium, for what the JSON alone used to hold: an exposure study
// entered through its own form (a bad field refused beside it, then saved, calculated and its
// results shown); and, in a bonding study, joint bay names, ECC transposition points at joints
// and bonding leads given by length, and the study's cable type entered as its construction,
// each saved, calculated and told back by name.

const { newStudy, open, stored } = editorInBrowser('SF', 'Form');
async function fill(page: Page, label: string, value: string) {
  await page.getByLabel(label, { exact: true }).fill(value);
  await page.getByLabel(label, { exact: true }).blur();
}
async function saveAndCalculate(page: Page) {
  await page.getByRole('button', { name: 'Save inputs' }).click();
  await page.getByTestId('unsaved').waitFor({ state: 'detached' });
  await page.getByRole('button', { name: 'Calculate' }).click();
  await page.getByTestId('calculated').waitFor();
}

describe('the study forms', () => {
  it('take an exposure study through its own form: a bad field refused beside it, then saved, calculated and shown', { timeout: 180_000 }, async () => {
    const revisionId = await newStudy('exposure');
    const page = await open(revisionId);
    await fill(page, 'Soil resistivity (Ω·m)', '250');
    await fill(page, 'Name of source 1', 'Feeder earth-return current');
    await fill(page, 'x of source 1 (m)', '0');
    await fill(page, 'Height of source 1 (m)', '12,5');
    await fill(page, 'Name of the metalwork', 'Farm fence (demo)');
    await fill(page, 'x of the metalwork (m)', '25');
    await fill(page, 'Height of the metalwork (m)', '1');
    await fill(page, 'Resistance of the metalwork (Ω/km)', '2,5');
    await page.getByLabel('Earthed at').selectOption('both-ends');
    await fill(page, 'Earth resistance at the end (Ω)', '20');
    await fill(page, 'Screening factor (1: none)', '0,8');
    await fill(page, 'Current in F, case FE (A)', '4000');
    await fill(page, 'Duration of case FE (s)', '0,3');
    await page.getByLabel('Body weight').selectOption('70');

    // A negative length is refused beside its field, in words, and nothing is saved.
    await fill(page, 'Length of parallelism (m)', '-400');
    const beside = page.locator('[data-error-for="object.parallelLengthM"]');
    await expect.poll(() => beside.textContent()).toBe('Length of parallelism must be greater than zero.');
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await page.getByTestId('error-list').getByText('Length of parallelism of the metalwork').waitFor();
    expect((await stored(revisionId)).version).toBe(1);
    await fill(page, 'Length of parallelism (m)', '800');
    await expect.poll(() => beside.count()).toBe(0);

    await saveAndCalculate(page);
    const r = await stored(revisionId);
    expect(r.inputs.object).toMatchObject({ name: 'Farm fence (demo)', xM: 25, yM: 1, parallelLengthM: 800, resistanceOhmPerKm: 2.5, earthing: 'both-ends', earthEndOhm: 20, screeningFactor: 0.8 });
    expect(r.inputs.sources[0]).toMatchObject({ xM: 0, yM: 12.5 });
    expect(r.inputs.cases[0]).toMatchObject({ durationS: 0.3, currents: [{ sourceId: 'F', currentA: 4000 }] });
    expect(r.inputs.touch.bodyWeightKg).toBe(70);
    expect(r.resultsInputsHash).toBe(r.inputsHash);

    // The EMF against the closed form: k·|Zm|·L·I, Zm = π²f·1e-7 + jω·2e-7·ln(De/D) Ω/m,
    // De = 658.5·√(ρ/f) (Carson, simplified: docs/methods.md §3.1 and §8).
    const f = 50;
    const d = Math.hypot(25 - 0, 1 - 12.5);
    const de = 658.5 * Math.sqrt(250 / f);
    const zm = Math.hypot(Math.PI ** 2 * f * 1e-7, 2 * Math.PI * f * 2e-7 * Math.log(de / d));
    const emfV = 0.8 * zm * 800 * 4000;
    expect(r.results.cases[0].emfV).toBeCloseTo(emfV, 6);

    await page.getByRole('tab', { name: 'Results' }).click();
    const table = page.getByTestId('exposure-results');
    await table.waitFor();
    expect(await table.textContent()).toContain('FE: Earth fault');
    expect(await table.textContent()).toContain(formatQuantity(r.results.cases[0].emfV, 'V'));
    await screenshot(page, 'exposure-form-results');
  });

  it('names joint bays, transposes an ECC at joints and gives the leads by length, saved, calculated and told by name', { timeout: 180_000 }, async () => {
    const revisionId = await newStudy('bonding');
    const page = await open(revisionId);
    await fill(page, 'Name of joint bay J1', 'Mill Lane');
    await fill(page, 'Name of joint bay J2', 'Mill Lane');
    // Two joints with one name: refused beside the second, in words.
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await expect.poll(() => page.locator('[data-error-for="jointNames.1.name"]').textContent()).toContain('given to two joints');
    await fill(page, 'Name of joint bay J2', 'Ford Bay');

    // An ECC along the whole route, crossed at both inner joints.
    await page.getByRole('button', { name: 'Add ECC' }).click();
    // Along one section first: no joint inside the run, so "at joints I choose" is not offered.
    const lastSection = await page.getByLabel('ECC E1 to section').inputValue();
    await page.getByLabel('ECC E1 to section').selectOption(await page.getByLabel('ECC E1 from section').inputValue());
    const jointsChoice = page.getByLabel('Transposition of ECC E1').locator('option[value="joints"]');
    await expect.poll(() => jointsChoice.isDisabled()).toBe(true);
    expect(await jointsChoice.textContent()).toBe('at joints I choose (no joint inside its run)');
    await page.getByLabel('ECC E1 to section').selectOption(lastSection);
    await expect.poll(() => jointsChoice.isDisabled()).toBe(false);
    await page.getByLabel('Transposition of ECC E1').selectOption('joints');
    // Nothing ticked yet: it says what that means.
    await expect.poll(() => page.getByTestId('ecc-0-no-crossing').textContent()).toBe('No joint ticked: the ECC is saved and calculated as not transposed.');
    await page.getByLabel('ECC E1 transposed at J1').check();
    await expect.poll(() => page.getByTestId('ecc-0-no-crossing').count()).toBe(0);
    await page.getByLabel('ECC E1 transposed at J2').check();

    // Leads by length, the resistance derived from the conductor.
    await page.getByLabel('Lead impedance given as').selectOption('length');
    await fill(page, 'Lead length (m)', '8');
    await page.getByRole('button', { name: 'Save inputs' }).click();
    await expect.poll(() => page.locator('[data-error-for="bondingLeadLength.resistanceMilliohmPerM"]').textContent()).toContain("leads' cross-section and material");
    await page.getByLabel("Check the leads' fault current").check();
    await page.getByTestId('lead-derivation').waitFor();
    // The conductor now gives the resistance: the error beside the field goes.
    await expect.poll(() => page.locator('[data-error-for="bondingLeadLength.resistanceMilliohmPerM"]').count()).toBe(0);
    expect(await page.getByTestId('lead-derivation').textContent()).toContain('IEC 60287-1-1');

    // The study's own cable type entered as its construction: a bad figure refused beside it.
    await page.getByLabel('Entry of cable type 1').selectOption('construction');
    await fill(page, 'Conductor cross-section of CT1 (mm²)', '5000');
    await expect.poll(() => page.locator('[data-error-for="cableTypes.0.construction.conductor.crossSectionMm2"]').textContent()).toContain('larger than any cable made');
    await fill(page, 'Conductor cross-section of CT1 (mm²)', '800');
    await page.getByTestId('cable-derivation').waitFor();
    expect(await page.getByTestId('cable-derivation').textContent()).toContain('IEC 60287-1-1');
    await screenshot(page, 'bonding-form-new-fields');

    await saveAndCalculate(page);
    const r = await stored(revisionId);
    expect(r.inputs.cableTypes[0]).toMatchObject({ entry: 'construction', construction: { conductor: { material: 'copper', crossSectionMm2: 800 } } });
    // Derived on saving, from the construction as edited (not the starting 1000 mm²).
    const derived = (construction: unknown) => deriveCableParameters(cableConstructionSchema.parse(construction)).conductorResistanceOhmPerKm;
    expect(r.inputs.cableTypes[0].conductorResistanceOhmPerKm).toBe(derived(r.inputs.cableTypes[0].construction));
    expect(r.inputs.cableTypes[0].conductorResistanceOhmPerKm).not.toBe(derived(STARTING_CONSTRUCTION));
    expect(r.inputs.jointNames).toEqual([{ jointIndex: 1, name: 'Mill Lane' }, { jointIndex: 2, name: 'Ford Bay' }]);
    expect(r.inputs.eccs[0]).toMatchObject({ id: 'E1', transposedAtMidpoint: false, transposedAtJoints: [1, 2] });
    expect(r.inputs.bondingLeadLength).toEqual({ lengthM: 8 });
    expect(r.inputs.bondingLeadMilliohm).toBeUndefined();
    expect(r.inputs.bondingLeads).toMatchObject({ crossSectionMm2: 240 });
    const labels = r.results.cases[0].points.map((p: { label: string }) => p.label);
    expect(labels.some((l: string) => l.startsWith('joint bay Mill Lane (joint 1)'))).toBe(true);

    // The route strip and the SVL choices use the names; the results name the bays.
    expect(await page.getByTestId('route-strip').textContent()).toContain('Ford Bay (J2)');
    await page.getByRole('tab', { name: 'Results' }).click();
    await page.getByText(/joint bay Ford Bay \(joint 2\)/).first().waitFor();
    await screenshot(page, 'bonding-form-named-joints');
  });
});
