import { beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoSessions, json, readyDraft, send, uploadForm } from '../helpers/workflow-api';

describe('files attached to a revision, in the S3-compatible store', () => {
  let sessions: Record<DemoRole, HttpSession>;
  let revisionId: string;
  beforeAll(async () => {
    sessions = await demoSessions();
    ({ revisionId } = await readyDraft(sessions.designer));
  });
  const upload = (kind: string, name: string, content: string | Uint8Array) => send(sessions.designer, 'POST', `/api/revisions/${revisionId}/files`, uploadForm(kind, name, content));

  it('stores a data sheet and returns the same bytes on download', async () => {
    const pdf = '%PDF-1.4\n1 0 obj <<>> endobj\n%%EOF\n';
    const stored = await json(await upload('data-sheet', 'svl-data.pdf', pdf), 201);
    expect(stored.contentType).toBe('application/pdf');
    const res = await sessions.auditor.fetch(`/api/files/${stored.id}`);
    const bytes = new Uint8Array(await res.arrayBuffer());
    expect(new TextDecoder().decode(bytes)).toBe(pdf);
    expect(res.headers.get('x-file-sha256')).toBe(createHash('sha256').update(pdf).digest('hex'));
    const list = await json(await sessions.checker.fetch(`/api/revisions/${revisionId}/files`), 200);
    expect(list.files.map((f: { fileName: string }) => f.fileName)).toContain('svl-data.pdf');
  });

  it('judges the type by content, not by name', async () => {
    const executable = new Uint8Array([0x4d, 0x5a, 0x90, 0x00, 0x03, 0x00, 0x00, 0x00, 0x04, 0x00]);
    const refused = await json(await upload('data-sheet', 'looks-fine.pdf', executable), 422);
    expect(refused.fields[0]).toEqual({ field: 'file', message: expect.stringContaining('whatever its name says') });
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);
    expect((await json(await upload('drawing', 'drawing.pdf', png), 201)).contentType).toBe('image/png');
  });

  it('refuses an empty or oversized file with the limit in the message', async () => {
    expect((await json(await upload('other', 'empty.csv', ''), 422)).fields[0].message).toBe('The file is empty.');
    const big = new Uint8Array(10 * 1024 * 1024 + 1).fill(0x41);
    expect((await json(await upload('other', 'big.csv', big), 413)).fields[0].message).toContain('limit is 10 MiB');
  });

  it('compares commissioning measurements with the calculation scaled to the load at the time', async () => {
    const bad = await json(await upload('measurements', 'readings.csv', 'joint,cable,volts\n1,C1-a,3\n'), 422);
    expect(bad.fields[0].message).toContain('lacks measured_v, load_a');
    const badRow = await json(await upload('measurements', 'readings.csv', 'joint,cable,measured_v,load_a\n1,C1-a,-3,400\n'), 422);
    expect(badRow.fields[0].message).toContain('Line 2');

    const csv = 'joint,cable,measured_v,load_a\n1,C1-a,9.5,425\n2,C1-b,10.1,425\n';
    const stored = await json(await upload('measurements', 'commissioning.csv', csv), 201);
    const comparison = await json(await sessions.checker.fetch(`/api/files/${stored.id}/comparison`), 200);
    const detail = await json(await sessions.checker.fetch(`/api/revisions/${revisionId}`), 200);
    const normal = detail.revision.results.cases.find((c: { kind: string }) => c.kind === 'normal');
    const caseCurrent = detail.revision.inputs.cases.find((c: { id: string }) => c.id === normal.caseId).currents[0].currentA;
    const at = (joint: number, cable: string) =>
      Math.max(...normal.points.find((p: { jointIndex: number }) => p.jointIndex === joint).sheathEnds.filter((e: { cable: string }) => e.cable === cable).map((e: { voltageV: number }) => e.voltageV));
    // Standing voltages scale linearly with the load current (the network is linear).
    expect(comparison.rows[0].calculatedV).toBeCloseTo((at(1, 'C1-a') * 425) / caseCurrent, 9);
    expect(comparison.rows[1].calculatedV).toBeCloseTo((at(2, 'C1-b') * 425) / caseCurrent, 9);
    expect(comparison.rows[0].deviationPct).toBeCloseTo(((9.5 - comparison.rows[0].calculatedV) / comparison.rows[0].calculatedV) * 100, 9);
  });

  it('an auditor cannot upload', async () => {
    const res = await send(sessions.auditor, 'POST', `/api/revisions/${revisionId}/files`, uploadForm('other', 'a.csv', 'x\n'));
    expect(res.status).toBe(403);
  });
});
