import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { formatQuantity } from '../../src/lib/format';
import { hasCell, readDocx } from '../helpers/docx-text';
import { demoSessions, drive, json, readyDraft } from '../helpers/workflow-api';
import { downloadRecord } from '../helpers/record-download';


describe('calculation records', () => {
  it('a draft record can be downloaded at any stage and says it is a draft', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer);
    const { bytes, headers } = await downloadRecord(sessions.checker, revisionId);
    expect(headers.get('content-type')).toContain('wordprocessingml');
    expect(headers.get('x-record-draft')).toBe('true');
    expect(headers.get('content-disposition')).toContain('-DRAFT.docx');
    expect(readDocx(bytes).headerText).toContain('DRAFT');
  });

  it('the issued record is rendered once, kept byte for byte, and its hash is in the audit trail', async () => {
    const sessions = await demoSessions();
    const { revisionId } = await readyDraft(sessions.designer);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    const first = await downloadRecord(sessions.auditor, revisionId);
    const second = await downloadRecord(sessions.designer, revisionId);
    expect(Buffer.from(second.bytes).equals(Buffer.from(first.bytes))).toBe(true);
    const sha = createHash('sha256').update(first.bytes).digest('hex');
    expect(first.headers.get('x-record-sha256')).toBe(sha);
    const audit = await json(await sessions.auditor.fetch(`/api/audit?revisionId=${revisionId}&type=record.issued`), 200);
    expect(audit.events).toHaveLength(1);
    expect(audit.events[0].detail.sha256).toBe(sha);

    const detail = await json(await sessions.auditor.fetch(`/api/revisions/${revisionId}`), 200);
    const doc = readDocx(first.bytes);
    expect(doc.headerText).toContain('Issued record');
    // Title block.
    expect(hasCell(doc.bodyText, `${detail.study.code} ${detail.study.title} (sheath bonding study)`)).toBe(true);
    expect(hasCell(doc.bodyText, detail.revision.inputsHash)).toBe(true);
    expect(hasCell(doc.bodyText, 'issued')).toBe(true);
    // A results value equal to the core's, as the record prints it.
    const worst = detail.revision.results.worst.find((w: { quantity: string }) => w.quantity === 'standing-voltage-normal');
    expect(hasCell(doc.bodyText, formatQuantity(worst.value, 'V'))).toBe(true);
    // Checklist verdicts and sign-off names.
    const verdicts = detail.checklist.filter((i: { kind: string }) => i.kind === 'computed').length;
    expect(doc.bodyText.split('\u0001').filter((t) => t === 'PASS')).toHaveLength(verdicts);
    for (const name of ['Ada Okonkwo', 'Bram Lindqvist', 'Carys Penhallow']) expect(hasCell(doc.bodyText, name)).toBe(true);
    expect(doc.bodyText).toContain('do not replace');
  });
});
