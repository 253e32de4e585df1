import { afterAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { hasCell, readDocx } from '../helpers/docx-text';
import { demoSessions, drive, json, readyDraft, send, step, uploadForm, currentVersion } from '../helpers/workflow-api';
import type { HttpSession } from '../helpers/http-session';
import { downloadRecord } from '../helpers/record-download';

// The record an auditor reads (issue 11 §4) and the comparison of revisions (§3), through the
// HTTP API, with the text taken from the DOCX itself.


const DEFAULT_PATTERN = '{project}-{study}-R{revision:2}';

describe('the issued record and the comparison of revisions', () => {
  let admin: HttpSession | undefined;
  let projectId = '';
  afterAll(async () => {
    if (admin && projectId) await send(admin, 'PUT', `/api/admin/projects/${projectId}/document-number`, { pattern: DEFAULT_PATTERN });
  });

  it('refuses a document-number pattern that cannot number records apart, naming the field', async () => {
    const sessions = await demoSessions();
    const { projects } = await json(await sessions.admin.fetch('/api/projects'), 200);
    const bad = await json(await send(sessions.admin, 'PUT', `/api/admin/projects/${projects[0].id}/document-number`, { pattern: '{project}-CALC' }), 422);
    expect(bad.fields[0].field).toBe('pattern');
    expect(bad.fields[0].message).toContain('{study} and {revision}');
    const unknown = await json(await send(sessions.admin, 'PUT', `/api/admin/projects/${projects[0].id}/document-number`, { pattern: '{study}-{revision}-{date}' }), 422);
    expect(unknown.fields[0].message).toContain('placeholders');
    await json(await send(sessions.designer, 'PUT', `/api/admin/projects/${projects[0].id}/document-number`, { pattern: DEFAULT_PATTERN }), 403);
  });

  it('numbers the record, names its limit sources, lists its history with reasons, its files, and what changed since the revision before', async () => {
    const sessions = await demoSessions();
    admin = sessions.admin;
    const { projectId: pid, studyId, revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'DN');
    projectId = pid;
    const set = await json(await send(sessions.admin, 'PUT', `/api/admin/projects/${projectId}/document-number`, { pattern: 'SW-{project}-{study}-CAL-{revision:3}' }), 200);
    expect(set.pattern).toBe('SW-{project}-{study}-CAL-{revision:3}');

    const note = 'Route survey notes\n';
    const file = await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/files`, uploadForm('other', 'survey-notes.csv', note)), 201);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);
    await json(await step(sessions.checker, revisionId, 'return', { reason: 'Link-box resistance is from the wrong survey.' }), 200);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);

    const detail = await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}`), 200);
    const number = `SW-${detail.project.code}-${detail.study.code}-CAL-001`;
    const { bytes, headers } = await downloadRecord(sessions.auditor, revisionId);
    expect(headers.get('content-disposition')).toContain(`${number}.docx`);
    const audit = await json(await sessions.auditor.fetch(`/api/audit?revisionId=${revisionId}&type=record.issued`), 200);
    expect(audit.events[0].detail.documentNumber).toBe(number);

    const doc = readDocx(bytes);
    expect(doc.headerText).toContain(number);
    expect(hasCell(doc.bodyText, number)).toBe(true);
    // Limit sources: the limit set by name and version, and each limit's own source, in the checklist and the limits table.
    const { limitSets } = await json(await sessions.auditor.fetch('/api/limit-sets'), 200);
    const limitSet = limitSets.find((l: { id: string }) => l.id === detail.study.limitSetId) ?? limitSets[0];
    expect(doc.bodyText).toContain(`Limit set ${limitSet.name}, version ${limitSet.latest.version}`);
    for (const l of Object.values(limitSet.latest.limits) as Array<{ source: string }>) expect(hasCell(doc.bodyText, l.source)).toBe(true);
    const computed = detail.checklist.filter((i: { kind: string; source: string }) => i.kind === 'computed' && i.source.startsWith(limitSet.name));
    expect(computed.length).toBeGreaterThan(0);
    expect(detail.checklist.some((i: { source: string }) => i.source.includes(detail.study.title))).toBe(false);
    // Revision history with the reason of the return.
    expect(doc.bodyText).toContain('Revision history');
    expect(hasCell(doc.bodyText, 'Link-box resistance is from the wrong survey.')).toBe(true);
    expect(hasCell(doc.bodyText, 'Bram Lindqvist returned revision 1 to the designer.')).toBe(true);
    // Attached files with their SHA-256.
    expect(hasCell(doc.bodyText, 'survey-notes.csv')).toBe(true);
    expect(hasCell(doc.bodyText, createHash('sha256').update(note).digest('hex'))).toBe(true);
    expect(file.sha256).toBe(createHash('sha256').update(note).digest('hex'));
    // Assumptions generated from the study; a plot for every case, faults included.
    expect(doc.bodyText).toContain(`homogeneous layer of ${detail.revision.inputs.soilResistivityOhmM} Ω·m`);
    expect(doc.documentXml.match(/<pic:pic\b/g)).toHaveLength(detail.revision.inputs.cases.length);

    // Revision 2: one section longer. The comparison says so in words, and its record lists it.
    const second = await json(await send(sessions.designer, 'POST', `/api/studies/${studyId}/revisions`), 201);
    const inputs = structuredClone(detail.revision.inputs);
    const section = inputs.sections[1];
    const before = section.lengthM;
    section.lengthM = before + 22;
    await json(await send(sessions.designer, 'PUT', `/api/revisions/${second.id}/inputs`, { inputs, version: await currentVersion(sessions.designer, second.id) }), 200);
    await json(await send(sessions.designer, 'POST', `/api/revisions/${second.id}/calculate`), 200);
    const expected = `section ${section.id} length ${before} m → ${before + 22} m`;

    const cmp = await json(await sessions.checker.fetch(`/api/revisions/${second.id}/compare?against=last-issued`), 200);
    expect(cmp.from.number).toBe(1);
    expect(cmp.to.number).toBe(2);
    expect(cmp.inputChanges).toEqual([expected]);
    expect(cmp.resultsCompared).toBe(true);
    expect(cmp.worstChanges.find((w: { quantity: string }) => w.quantity === 'standing-voltage-normal').text).toMatch(/^Standing voltage, normal load /);
    const byId = await json(await sessions.auditor.fetch(`/api/revisions/${second.id}/compare?against=${revisionId}`), 200);
    expect(byId.inputChanges).toEqual([expected]);
    await json(await sessions.auditor.fetch(`/api/revisions/${second.id}/compare?against=latest`), 422);

    const draft = readDocx((await downloadRecord(sessions.designer, second.id)).bytes);
    expect(draft.bodyText).toContain('Changes since revision 1');
    expect(draft.bodyText).toContain(expected);
    expect(draft.headerText).toContain(`SW-${detail.project.code}-${detail.study.code}-CAL-002`);
  });

  it('refuses to compare revisions of different studies', async () => {
    const sessions = await demoSessions();
    const a = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'CA');
    const b = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'CB');
    const res = await json(await sessions.checker.fetch(`/api/revisions/${a.revisionId}/compare?against=${b.revisionId}`), 422);
    expect(res.fields[0].field).toBe('against');
  });
});
