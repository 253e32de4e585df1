import { describe, expect, it } from 'vitest';
import { performance } from 'node:perf_hooks';
import { readFileSync } from 'node:fs';
import { calculateStudy, evaluateCompliance } from '../../../src/lib/calc';
import { limitSetSchema } from '../../../src/lib/schemas/limit-set.schema';
import { checklistRows } from '../../../src/lib/studies/checklist-rows';
import { renderRecord } from '../../../src/lib/records/record-document';
import type { RecordData } from '../../../src/lib/records/record-data';
import { xmlSafe } from '../../../src/lib/records/xml-safe-text';
import { formatNumber, formatQuantity } from '../../../src/lib/format';
import { crossBondedRoute } from '../../../bench/reference-routes';
import { hasCell, readDocx } from '../../helpers/docx-text';
import { committedValidationFile } from '../../../src/lib/records/record-validation';
import { bondingStudySchema } from '../../../src/lib/schemas/bonding-study.schema';

const limits = limitSetSchema.parse(JSON.parse(readFileSync('tests/fixtures/limit-sets/demo-owner.json', 'utf8')));

function recordData(study: ReturnType<typeof crossBondedRoute>, draft: boolean): RecordData {
  const results = calculateStudy(study);
  const checklist = checklistRows('r', evaluateCompliance(study, results, limits), [], []).map((row, i) => ({ ...row, id: `c${i}` }));
  return {
    draft,
    project: { code: 'BENCH', name: 'Reference route (invented)' },
    study: { code: 'L-90', title: 'Large reference route', kind: 'bonding' },
    revision: { number: 1, state: draft ? 'draft' : 'issued', createdAt: new Date('2026-01-05'), issuedAt: draft ? null : new Date('2026-02-01'), engineVersion: results.engineVersion, inputsHash: 'f'.repeat(64) } as RecordData['revision'],
    documentNumber: 'BENCH-L-90-R01',
    designerName: 'Test Designer (invented)',
    limitSet: { name: limits.name, version: 1, limits: limits.limits },
    inputs: study,
    results,
    checklist,
    remarks: [],
    checkValues: [],
    signOffs: [],
    history: [{ number: 1, state: draft ? 'draft' : 'issued', createdAt: new Date('2026-01-05'), issuedAt: draft ? null : new Date('2026-02-01'), designer: 'Test Designer (invented)', checker: '', approver: '' }],
    workflowEvents: [],
    files: [],
    commissioning: [],
    validation: { engineVersion: results.engineVersion, report: committedValidationFile(results.engineVersion), append: false, appUrl: 'http://127.0.0.1:4321' },
    changes: null,
  };
}

describe('record rendering', () => {
  it('renders the large reference route, with its values, plot and verdicts', async () => {
    const study = crossBondedRoute({ circuits: 2, majorSections: 30, withEcc: true });
    const data = recordData(study, false);
    await renderRecord(data); // warm-up: templates and fonts load once per process
    const t0 = performance.now();
    const bytes = await renderRecord(data);
    const ms = performance.now() - t0;
    console.log(`record for the large reference route: ${ms.toFixed(0)} ms, ${(bytes.length / 1024).toFixed(0)} KiB`);
    // Printed, not asserted: on a busy 2-core machine the same render took 2 s to 16 s, so a bound here only flakes.

    const doc = readDocx(bytes);
    expect(doc.documentXml.match(/<pic:pic\b/g)).toHaveLength(study.cases.length); // the along-route plot of every case, faults included
    const worst = data.results!.kind === 'bonding' ? data.results!.worst.find((w) => w.quantity === 'standing-voltage-normal')! : null;
    expect(hasCell(doc.bodyText, formatQuantity(worst!.value, 'V'))).toBe(true);
    expect(hasCell(doc.bodyText, 'PASS')).toBe(true);
    expect(doc.headerText).toContain('Issued record');
  });

  it('marks a draft on every page through the page header', async () => {
    const doc = readDocx(await renderRecord(recordData(crossBondedRoute({ circuits: 1, majorSections: 1, withEcc: false }), true)));
    expect(doc.headerText).toContain('DRAFT: not issued');
    expect(doc.documentXml).toContain('w:headerReference');
    expect(doc.bodyText).toContain('not yet signed');
  });

  it('renders a record whose stored text holds characters XML cannot carry (U+0001, U+FFFF)', async () => {
    // Circuit ids label the plot's series (SVG) and the input tables (DOCX).
    const study = JSON.parse(JSON.stringify(crossBondedRoute({ circuits: 1, majorSections: 1, withEcc: false })).replaceAll('"C1"', '"C\\u00011\\uffff"'));
    const data = recordData(study, true);
    data.remarks = [{ body: 'bell \u0007 in a remark' } as RecordData['remarks'][number]];
    await expect(renderRecord(data)).rejects.toThrow();
    const doc = readDocx(await renderRecord(xmlSafe(data)));
    expect(doc.bodyText).toContain('C\uFFFD1\uFFFD');
    // Identical plots share one image part; each case still has its picture.
    expect(doc.documentXml.match(/<pic:pic\b/g)).toHaveLength(study.cases.length);
  });

  it('carries the document number (header, core properties), the limit sources and the generated assumptions', async () => {
    const study = crossBondedRoute({ circuits: 1, majorSections: 1, withEcc: false });
    const data = recordData(study, false);
    const bytes = await renderRecord(data);
    const doc = readDocx(bytes);
    expect(doc.headerText).toContain('BENCH-L-90-R01');
    const { strFromU8, unzipSync } = await import('fflate');
    const core = strFromU8(unzipSync(bytes)['docProps/core.xml']);
    expect(core).toContain('<dc:creator>Test Designer (invented)</dc:creator>');
    expect(core).toContain('<cp:lastModifiedBy>Sheathwise</cp:lastModifiedBy>');
    expect(core).toContain('BENCH-L-90-R01');
    // Every limit of the set printed with its own source.
    for (const l of Object.values(limits.limits)) expect(hasCell(doc.bodyText, l!.source)).toBe(true);
    expect(doc.bodyText).toContain(`Limit set ${limits.name}, version 1`);
    expect(doc.bodyText).toContain(`homogeneous layer of ${study.soilResistivityOhmM} Ω·m`);
    expect(doc.bodyText).toContain('voltage to remote earth');
    // The to-local-earth column and the hand-check figures.
    expect(hasCell(doc.bodyText, 'highest sheath V to local earth')).toBe(true);
    expect(hasCell(doc.bodyText, 'EMF (V/km per kA)')).toBe(true);
  });

  it('prints joint bay names, ECC transposition points and bonding leads given by length', async () => {
    const base = crossBondedRoute({ circuits: 1, majorSections: 2, withEcc: true });
    const study = bondingStudySchema.parse({
      ...base,
      bondingLeadMilliohm: undefined,
      jointNames: [{ jointIndex: 3, name: 'Mill Lane' }],
      eccs: [{ ...base.eccs[0], transposedAtJoints: [2, 3] }],
      bondingLeads: { crossSectionMm2: 185, material: 'copper' },
      bondingLeadLength: { lengthM: 12 },
      svls: [{ jointIndex: 1, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 }, { jointIndex: 4, connection: 'to-earth', continuousRatingV: 3000, tovRatingV: 6000 }],
    });
    const doc = readDocx(await renderRecord(recordData(study, true)));
    expect(hasCell(doc.bodyText, 'at joint 2, joint bay Mill Lane (joint 3)')).toBe(true);
    expect(hasCell(doc.bodyText, 'Mill Lane')).toBe(true); // the joint at the end of S3, and the names table
    expect(doc.bodyText).toContain('joint bay Mill Lane (joint 3) (');
    // 12 m of 185 mm² copper at 50 °C: ρ20/A·[1 + α20·30]·L (IEC 60287-1-1 Table 1, eq. 2).
    const rMilliohm = (1.7241e-8 / 185e-6) * (1 + 3.93e-3 * 30) * 12 * 1000;
    expect(doc.bodyText).toContain(`12 m per lead, resistance of 185 mm² copper (ρ20/A at 50 °C, IEC 60287-1-1 Table 1 and eq. 2), reactance 0 mΩ/m: ${formatNumber(rMilliohm)} + j0 mΩ`);
  });

  it('prints manual questions without empty columns and each answer once', async () => {
    const study = crossBondedRoute({ circuits: 1, majorSections: 1, withEcc: false });
    const data = recordData(study, false);
    data.checklist = [...data.checklist, { ...data.checklist[0], id: 'm1', kind: 'manual', itemKey: 'manual:drawings', title: 'Route drawings match the inputs?', answer: 'yes', answerReason: null, justification: null, status: 'yes', source: 'common practice', caseId: null, location: null, value: null, limitValue: null, marginPct: null }];
    const doc = readDocx(await renderRecord(data));
    const manualStart = doc.bodyText.indexOf('Questions answered by the designer');
    const manualText = doc.bodyText.slice(manualStart, doc.bodyText.indexOf('Check remarks', manualStart));
    expect(manualText.split('\u0001').slice(1, 4)).toEqual(['question', 'answer', 'basis']);
    expect(manualText.split('\u0001').filter((t) => t === 'yes')).toHaveLength(1);
  });

  it('states the method statement, its section for each check, and the validation of the engine: linked by default, appended when the administrator chose so', async () => {
    const study = crossBondedRoute({ circuits: 1, majorSections: 1, withEcc: false });
    const data = recordData(study, false);
    const report = data.validation.report!;
    expect(report.engineVersion).toBe(data.revision.engineVersion);
    const summary = `Validation of engine ${report.engineVersion}: ${report.within} of ${report.total} reference values within tolerance`;
    const linked = readDocx(await renderRecord(data)).bodyText;
    expect(linked).toContain(`Method: Sheathwise method statement, engine ${report.engineVersion.split('.')[0]}.x`);
    expect(linked).toContain(`${summary}, in the run of ${report.generatedAt}. The table of every reference value, with its source, the engine's value and the tolerance, is at http://127.0.0.1:4321/methods#validation.`);
    // The standing-voltage checks cite section 2.3 (what the voltage is measured against).
    expect(hasCell(linked, 'method section')).toBe(true);
    expect(hasCell(linked, '2.3')).toBe(true);
    expect(hasCell(linked, 'SV-1')).toBe(false);

    const appended = readDocx(await renderRecord({ ...data, validation: { ...data.validation, append: true } })).bodyText;
    expect(appended).toContain('The table of every reference value follows');
    for (const id of report.ids) expect(hasCell(appended, id)).toBe(true);

    const unknown = readDocx(await renderRecord({ ...data, validation: { ...data.validation, engineVersion: '1.4.0', report: committedValidationFile('1.4.0') } })).bodyText;
    expect(unknown).toContain('No validation report is held for engine 1.4.0.');
  });
});
