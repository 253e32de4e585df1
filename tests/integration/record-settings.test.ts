import { afterAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { demoSessions, json, readyDraft, send } from '../helpers/workflow-api';
import type { HttpSession } from '../helpers/http-session';
import { downloadRecord } from '../helpers/record-download';
import { hasCell, readDocx } from '../helpers/docx-text';
import { ENGINE_VERSION } from '../../src/lib/calc/constants';

// The administrator's record setting (issue 17): a record states its engine's validation summary
// and links to the table, or appends the whole table.

const committed = JSON.parse(readFileSync(`docs/validation/engine-${ENGINE_VERSION}.json`, 'utf8')) as { ids: string[]; total: number; within: number };
const summary = `Validation of engine ${ENGINE_VERSION}: ${committed.within} of ${committed.total} reference values within tolerance`;

describe('engine validation in records', () => {
  let admin: HttpSession | undefined;
  afterAll(async () => {
    if (admin) await json(await send(admin, 'PUT', '/api/admin/record-settings', { appendValidation: false }), 200);
  });

  it('refuses a setting that is not true or false, naming the field, and anyone but an administrator', async () => {
    const sessions = await demoSessions();
    const bad = await json(await send(sessions.admin, 'PUT', '/api/admin/record-settings', { appendValidation: 'yes' }), 422);
    expect(bad.fields[0].field).toBe('appendValidation');
    await json(await send(sessions.admin, 'PUT', '/api/admin/record-settings', { appendValidation: true, extra: 1 }), 422);
    await json(await send(sessions.approver, 'PUT', '/api/admin/record-settings', { appendValidation: true }), 403);
    expect((await json(await sessions.admin.fetch('/api/admin/record-settings'), 200)).appendValidation).toBe(false);
  });

  it('links to the validation table by default, appends it once the administrator says so, and records the change in the audit trail', async () => {
    const sessions = await demoSessions();
    admin = sessions.admin;
    const { revisionId } = await readyDraft(sessions.designer, 'fernhollow-cross-bonded', 'RV');

    const linked = readDocx((await downloadRecord(sessions.designer, revisionId)).bytes).bodyText;
    expect(linked).toContain(`${summary}, in the run of`);
    expect(linked).toMatch(/is at http:\/\/127\.0\.0\.1:\d+\/methods#validation\./);
    expect(hasCell(linked, committed.ids[0])).toBe(false);

    expect((await json(await send(sessions.admin, 'PUT', '/api/admin/record-settings', { appendValidation: true }), 200)).appendValidation).toBe(true);
    const appended = readDocx((await downloadRecord(sessions.designer, revisionId)).bytes).bodyText;
    expect(appended).toContain('The table of every reference value follows');
    for (const id of committed.ids) expect(hasCell(appended, id), id).toBe(true);

    const audit = await json(await sessions.admin.fetch('/api/audit?type=record-settings.set&pageSize=5'), 200);
    expect(audit.events[0].detail.appendValidation).toEqual({ from: false, to: true });
    expect(audit.events[0].sentence).toBe("Elin Marsh changed how records show the engine's validation: the summary with a link → the full table appended");
  });
});
