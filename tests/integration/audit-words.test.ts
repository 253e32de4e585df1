import { describe, expect, it } from 'vitest';
import { currentVersion, demoSessions, drive, fixtureInputs, json, readyDraft, send } from '../helpers/workflow-api';

// The audit trail for people: the CSV carries names, study codes and revision numbers beside the
// ids and the event as a sentence; the filter takes a study code and a revision number; an input
// change is stored with its sentences, so a whole added cable type never reads as JSON.

type CsvRow = Record<string, string>;

/**
 * RFC 4180 read back independently of the writer (which uses papaparse):
 * quoted cells may hold commas, doubled quotes and line breaks.
 */
function parseCsv(text: string): { fields: string[]; data: CsvRow[] } {
  const records: string[][] = [];
  let record: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"' && text[i + 1] === '"') (cell += '"'), i++;
      else if (ch === '"') quoted = false;
      else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') record.push(cell), (cell = '');
    else if (ch === '\r' && text[i + 1] === '\n') record.push(cell), records.push(record), (record = []), (cell = ''), i++;
    else cell += ch;
  }
  expect(quoted, 'an unterminated quoted cell').toBe(false);
  expect(cell === '' && record.length === 0, 'the file ends with CRLF').toBe(true);
  const [fields, ...rows] = records;
  for (const r of rows) expect(r).toHaveLength(fields.length);
  return { fields, data: rows.map((r) => Object.fromEntries(fields.map((f, i) => [f, r[i]]))) };
}

describe('audit trail in words', () => {
  it('exports names, codes, revision numbers and sentences, and filters by study code and revision number', async () => {
    const sessions = await demoSessions();
    const { revisionId, studyId } = await readyDraft(sessions.designer);
    const detail = await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200);
    const code: string = detail.study.code;
    const designerName: string = (await json(await sessions.designer.fetch('/api/me'), 200)).name;

    // An input change: a section lengthened and a whole cable type added.
    const inputs = fixtureInputs('fernhollow-cross-bonded');
    inputs.sections[1].lengthM = 520;
    inputs.cableTypes.push({ ...inputs.cableTypes[0], id: 'SPARE-1', name: 'Spare cable' });
    await json(await send(sessions.designer, 'PUT', `/api/revisions/${revisionId}/inputs`, { version: await currentVersion(sessions.designer, revisionId), inputs }), 200);
    // Saving the same inputs again records nothing: no new version, no empty history entry.
    const saved = await currentVersion(sessions.designer, revisionId);
    expect((await json(await send(sessions.designer, 'PUT', `/api/revisions/${revisionId}/inputs`, { version: saved, inputs }), 200)).version).toBe(saved);
    expect(await currentVersion(sessions.designer, revisionId)).toBe(saved);
    await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200);
    await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck']]);

    // Filtering by the study code (in another case) finds exactly this study's events.
    const byCode = await json(await sessions.auditor.fetch(`/api/audit?studyCode=${encodeURIComponent(code.toLowerCase())}&pageSize=100`), 200);
    const byId = await json(await sessions.auditor.fetch(`/api/audit?studyId=${studyId}&pageSize=100`), 200);
    expect(byCode.total).toBeGreaterThan(3);
    expect(byCode.total).toBe(byId.total);
    for (const e of byCode.events) expect(e.studyCode).toBe(code);
    // Study code with revision number: this revision's events; a revision number it never had: none.
    const byRevision = await json(await sessions.auditor.fetch(`/api/audit?studyCode=${code}&revisionNumber=1&pageSize=100`), 200);
    expect(byRevision.total).toBe((await json(await sessions.auditor.fetch(`/api/audit?revisionId=${revisionId}&pageSize=100`), 200)).total);
    expect(byRevision.total).toBeGreaterThan(0);
    expect((await json(await sessions.auditor.fetch(`/api/audit?studyCode=${code}&revisionNumber=2`), 200)).total).toBe(0);
    const bad = await sessions.auditor.fetch('/api/audit?revisionNumber=first');
    expect(bad.status).toBe(422);
    expect((await bad.json()).fields[0].field).toBe('revisionNumber');

    // The input change is stored with its sentences and told without JSON.
    expect(byRevision.events.filter((e: { type: string }) => e.type === 'revision.inputs-changed')).toHaveLength(1);
    const changed = byRevision.events.find((e: { type: string }) => e.type === 'revision.inputs-changed');
    expect(changed.detail.sentences).toEqual(expect.arrayContaining(['section M1b length 498 m → 520 m', expect.stringMatching(/^cable type SPARE-1 added/)]));

    const res = await sessions.auditor.fetch(`/api/audit/export?studyCode=${code}`);
    expect(res.status).toBe(200);
    const { data, fields } = parseCsv(await res.text());
    expect(fields).toEqual(['id', 'at', 'actor_id', 'actor_name', 'type', 'event', 'project_id', 'project_code', 'project_name', 'study_id', 'study_code', 'revision_id', 'revision_number', 'detail', 'prev_hash', 'hash']);
    expect(data).toHaveLength(byCode.total);
    for (const row of data) {
      expect(row.study_code).toBe(code);
      expect(row.project_code).not.toBe('');
      expect(row.event).not.toMatch(/revision\.|[{}]/);
    }
    const start = data.find((r) => r.type === 'revision.startCheck')!;
    expect(start.revision_number).toBe('1');
    expect(start.event).toMatch(new RegExp(`^.+ took revision 1 of ${code} for checking\\.$`));
    const inputsRow = data.find((r) => r.type === 'revision.inputs-changed')!;
    expect(inputsRow.actor_name).toBe(designerName);
    expect(inputsRow.event).toContain('section M1b length 498 m → 520 m');
    expect(inputsRow.event).toContain('cable type SPARE-1 added');
  });
});
