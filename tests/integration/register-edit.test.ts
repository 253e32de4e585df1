import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoSessions, json, send } from '../helpers/workflow-api';
import { issuedStudy, newAsset, ownStandard, registerRows, tag } from './register.fixture';

// Editing, unlinking and removing register assets through the endpoints: field errors that name
// the field and change nothing, the roles of creation (designer, approver), an audit event per
// change, and the register following at once.

let sessions: Record<DemoRole, HttpSession>;
let study: Awaited<ReturnType<typeof issuedStudy>>;
let std: Awaited<ReturnType<typeof ownStandard>>;
const db = new pg.Pool({ connectionString: testEnv().databaseUrl, max: 2 });
const t = tag();
const code = (x: string) => `ED${t}-${x}`;
let circuit: { id: string };
let site: { id: string };

const audits = async (assetId: string) => (await db.query(`select type, detail from audit_events where detail->>'assetId' = $1 order by id`, [assetId])).rows as Array<{ type: string; detail: Record<string, unknown> }>;
const detail = async (assetId: string) => json(await sessions.designer.fetch(`/api/assets/${assetId}`), 200);

beforeAll(async () => {
  sessions = await demoSessions();
  [study, std] = await Promise.all([issuedStudy(sessions), ownStandard(sessions.admin)]);
  circuit = await newAsset(sessions.designer, study.projectId, { kind: 'circuit', code: code('C'), name: 'Edit circuit (invented)', ownerStandard: std.ownerStandard, inServiceOn: '2024-03-01' });
  site = await newAsset(sessions.designer, study.projectId, { kind: 'site', siteKind: 'substation', code: code('S'), name: 'Edit substation (invented)', ownerStandard: std.ownerStandard, inServiceOn: '2024-03-01' });
  for (const [a, extra] of [[circuit, { studyCircuitId: 'C1' }], [site, { siteEnd: 'end' }]] as const) await json(await send(sessions.designer, 'POST', `/api/assets/${a.id}/studies`, { studyId: study.studyId, ...extra }), 201);
}, 180_000);

afterAll(async () => {
  await db.end();
});

describe('editing an asset', () => {
  it('refuses bad fields by name and changes nothing', async () => {
    const bad = await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}`, { kind: 'site', name: '  ', inServiceOn: '2023-02-29', route: 'x'.repeat(501) }), 422);
    expect(bad.fields.map((f: { field: string }) => f.field).sort()).toEqual(['inServiceOn', 'kind', 'name', 'route']);
    expect((await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}`, {}), 422)).fields[0].field).toBe('name');
    expect((await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}`, { siteKind: 'fence' }), 422)).fields[0].field).toBe('siteKind');
    const taken = await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}`, { code: code('S'), name: 'Half-saved? (invented)' }), 422);
    expect(taken.fields).toEqual([{ field: 'code', message: expect.stringContaining(code('S')) }]);
    expect((await detail(circuit.id)).asset).toMatchObject({ code: code('C'), name: 'Edit circuit (invented)', route: '', inServiceOn: '2024-03-01' });
    expect((await audits(circuit.id)).map((a) => a.type)).not.toContain('asset.edited');
  });

  it('refuses an unknown key by its name, changing nothing; an empty change still asks for a field', async () => {
    const unknown = await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}`, { nmae: 'Typo (invented)' }), 422);
    expect(unknown.fields).toEqual([{ field: 'nmae', message: expect.stringContaining('Unknown field "nmae"') }]);
    const mixed = await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}`, { name: 'Half-saved? (invented)', voltageKv: 132 }), 422);
    expect(mixed.fields.map((f: { field: string }) => f.field)).toEqual(['voltageKv']);
    expect((await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}`, {}), 422)).fields).toEqual([{ field: 'name', message: 'Change at least one field.' }]);
    expect((await detail(circuit.id)).asset.name).toBe('Edit circuit (invented)');
    // Creating refuses an unknown key the same way, and creates nothing.
    const extra = code('X');
    const body = { kind: 'circuit', code: extra, name: 'Extra key (invented)', ownerStandard: std.ownerStandard };
    const refused = await json(await send(sessions.designer, 'POST', `/api/projects/${study.projectId}/assets`, { ...body, colour: 'red' }), 422);
    expect(refused.fields).toEqual([{ field: 'colour', message: expect.stringContaining('Unknown field "colour"') }]);
    expect((await json(await send(sessions.designer, 'POST', `/api/projects/${study.projectId}/assets`, body), 201)).id).toBeTruthy();
  });

  it('is for designers and approvers of the project', async () => {
    for (const role of ['checker', 'auditor'] as const) expect((await send(sessions[role], 'PATCH', `/api/assets/${circuit.id}`, { name: 'By the wrong person' })).status).toBe(403);
    expect((await detail(circuit.id)).asset.name).toBe('Edit circuit (invented)');
  });

  it('changes the details, moves the due dates, audits the change, and the register follows', async () => {
    const edited = await json(await send(sessions.approver, 'PATCH', `/api/assets/${site.id}`, { name: 'Kestrel Bay substation, renamed (invented)', siteKind: 'link-box-group', inServiceOn: '2025-03-01' }), 200);
    expect(edited).toMatchObject({ name: 'Kestrel Bay substation, renamed (invented)', siteKind: 'link-box-group', inServiceOn: '2025-03-01', kind: 'site' });
    // The inspection (first due at entry into service, then yearly) now falls due on the new date.
    const standing = (await detail(site.id)).obligations.find((o: { type: { id: string } }) => o.type.id === std.inspectionId);
    expect(standing.nextDueOn).toBe('2025-03-01');
    const [row] = await registerRows(sessions.designer, `search=${code('S')}`);
    expect(row).toMatchObject({ name: 'Kestrel Bay substation, renamed (invented)', nextDueOn: '2025-03-01' });
    const event = (await audits(site.id)).find((a) => a.type === 'asset.edited')!;
    expect(event.detail.changes).toEqual(expect.arrayContaining([expect.objectContaining({ path: 'name' }), expect.objectContaining({ path: 'inServiceOn' })]));
  });

  it('a new owner standard drops the obligations of the old one', async () => {
    const other = await ownStandard(sessions.admin);
    await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}`, { ownerStandard: other.ownerStandard }), 200);
    const owed = (await detail(circuit.id)).obligations.map((o: { type: { id: string } }) => o.type.id);
    expect(owed).toEqual([other.oversheathId]);
  });
});

describe('asset codes whatever their case', () => {
  it('refuses on create and on edit a code another asset holds in another case, naming that asset; an asset may change its own case', async () => {
    const upper = await newAsset(sessions.designer, study.projectId, { kind: 'site', siteKind: 'link-box-group', code: code('LBX-01'), name: 'Link boxes upper (invented)', ownerStandard: std.ownerStandard });
    const lower = code('LBX-01').toLowerCase();
    const refused = await json(await send(sessions.designer, 'POST', `/api/projects/${study.projectId}/assets`, { kind: 'site', siteKind: 'link-box-group', code: lower, name: 'Link boxes lower (invented)', ownerStandard: std.ownerStandard }), 422);
    expect(refused.fields).toEqual([{ field: 'code', message: `Code ${lower} is already used in this project as ${code('LBX-01')} (Link boxes upper (invented)): codes are the same whatever their case.` }]);
    expect(await registerRows(sessions.designer, `search=${code('LBX-01')}`)).toHaveLength(1);

    const other = await newAsset(sessions.designer, study.projectId, { kind: 'site', siteKind: 'link-box-group', code: code('LBX-02'), name: 'Link boxes two (invented)', ownerStandard: std.ownerStandard });
    const edit = await json(await send(sessions.designer, 'PATCH', `/api/assets/${other.id}`, { code: lower }), 422);
    expect(edit.fields).toEqual([{ field: 'code', message: expect.stringContaining(`as ${code('LBX-01')} (Link boxes upper (invented))`) }]);
    expect((await detail(other.id)).asset.code).toBe(code('LBX-02'));
    // The same code exactly: named too, by the asset's name.
    expect((await json(await send(sessions.designer, 'PATCH', `/api/assets/${other.id}`, { code: code('LBX-01') }), 422)).fields[0].message).toBe(`Code ${code('LBX-01')} is already used in this project by Link boxes upper (invented).`);

    expect((await json(await send(sessions.designer, 'PATCH', `/api/assets/${upper.id}`, { code: lower }), 200)).code).toBe(lower);
  });
});

describe('study links', () => {
  it('edits a link with field errors for the wrong kind, and unlinks it', async () => {
    expect((await json(await send(sessions.designer, 'PATCH', `/api/assets/${circuit.id}/studies/${study.studyId}`, { siteEnd: 'start' }), 422)).fields[0].field).toBe('siteEnd');
    // A circuit the study does not have, changing the link or making it: refused, naming the study's circuits.
    for (const [method, path] of [['PATCH', `/api/assets/${circuit.id}/studies/${study.studyId}`], ['POST', `/api/assets/${circuit.id}/studies`]] as const) {
      const refused = await json(await send(sessions.designer, method, path, { studyId: method === 'POST' ? study.studyId : undefined, studyCircuitId: 'C9' }), 422);
      expect(refused.fields).toEqual([{ field: 'studyCircuitId', message: expect.stringMatching(/no circuit C9: its circuits are .*C1/) }]);
    }
    expect((await detail(circuit.id)).studies.map((l: { studyCircuitId: string }) => l.studyCircuitId)).toEqual(['C1']);
    expect((await json(await send(sessions.designer, 'PATCH', `/api/assets/${site.id}/studies/${study.studyId}`, { siteEnd: 'middle' }), 422)).fields[0].field).toBe('siteEnd');
    expect((await send(sessions.checker, 'PATCH', `/api/assets/${site.id}/studies/${study.studyId}`, { siteEnd: 'start' })).status).toBe(403);
    await json(await send(sessions.designer, 'PATCH', `/api/assets/${site.id}/studies/${study.studyId}`, { siteEnd: 'start' }), 200);
    expect((await detail(site.id)).studies[0]).toMatchObject({ studyId: study.studyId, siteEnd: 'start' });

    expect((await send(sessions.auditor, 'DELETE', `/api/assets/${circuit.id}/studies/${study.studyId}`)).status).toBe(403);
    await json(await send(sessions.designer, 'DELETE', `/api/assets/${circuit.id}/studies/${study.studyId}`), 200);
    expect((await detail(circuit.id)).studies).toEqual([]);
    expect((await send(sessions.designer, 'DELETE', `/api/assets/${circuit.id}/studies/${study.studyId}`)).status).toBe(404);
    const [row] = await registerRows(sessions.designer, `search=${code('C')}`);
    expect(row.status).toBe('no issued study');
    expect((await audits(circuit.id)).map((a) => a.type)).toContain('asset.study-unlinked');
    expect((await audits(site.id)).map((a) => a.type)).toContain('asset.study-link-changed');
  });
});

describe('removing an asset', () => {
  it('takes it off the register and the pickers, keeps its history, frees its code, and refuses later changes', async () => {
    expect((await send(sessions.checker, 'DELETE', `/api/assets/${site.id}`)).status).toBe(403);
    await json(await send(sessions.designer, 'DELETE', `/api/assets/${site.id}`), 200);
    expect(await registerRows(sessions.designer, `search=${code('S')}`)).toEqual([]);
    const { assets } = await json(await sessions.designer.fetch(`/api/projects/${study.projectId}/assets`), 200);
    expect(assets.map((a: { id: string }) => a.id)).not.toContain(site.id);
    // Its page still opens (the history stays), owing nothing and covered by nothing.
    const kept = await detail(site.id);
    expect(kept.asset.removedAt).not.toBeNull();
    expect(kept.obligations).toEqual([]);
    expect(kept.studies).toEqual([]);
    expect((await audits(site.id)).find((a) => a.type === 'asset.removed')!.detail).toMatchObject({ assetCode: code('S'), unlinkedStudies: [study.code] });

    expect((await send(sessions.designer, 'PATCH', `/api/assets/${site.id}`, { name: 'Back again' })).status).toBe(404);
    expect((await send(sessions.designer, 'DELETE', `/api/assets/${site.id}`)).status).toBe(404);
    expect((await send(sessions.designer, 'POST', `/api/assets/${site.id}/studies`, { studyId: study.studyId })).status).toBe(404);
    expect((await send(sessions.approver, 'POST', `/api/assets/${site.id}/system-data`, { earthFaultKa: 30, source: 'Letter (invented)', sourceDate: '2026-01-01' })).status).toBe(404);

    const again = await newAsset(sessions.designer, study.projectId, { kind: 'site', siteKind: 'fence', code: code('S'), name: 'A new asset with the freed code (invented)', ownerStandard: std.ownerStandard });
    expect(again.id).not.toBe(site.id);
  });
});
