import { beforeAll, describe, expect, it } from 'vitest';
import { testEnv } from '../helpers/env';
import type { HttpSession } from '../helpers/http-session';
import { waitForMail } from '../helpers/maildev-client';
import { type DemoRole, demoSessions, fixtureInputs, json, send } from '../helpers/workflow-api';
import { issuedStudy, newAsset, registerRows, tag } from './register.fixture';

// Publishing site system data marks exactly the issued studies it makes non-conservative, with
// the reasons in words; drafts, studies of other sites and studies that remain conservative are
// left alone. The study is the invented demo route (20 kA earth fault, 31.5 kA three-phase,
// 1 s, grids 0.2 Ω at the start and 0.3 Ω at the end, 850 A on C1); the comparison rule is
// common practice (see src/lib/register/revalidation.ts).

let sessions: Record<DemoRole, HttpSession>;
let projectId: string;
const t = tag();
const ids: Record<string, string> = {};
const studies: Record<string, { projectId: string; studyId: string; revisionId: string; code: string }> = {};

beforeAll(async () => {
  sessions = await demoSessions();
  const strong = fixtureInputs('fernhollow-cross-bonded');
  strong.cases[3].earthFault.currentA = 40000;
  strong.cases[2].durationS = 0.5;
  strong.cases[3].durationS = 0.5;
  [studies.A, studies.B, studies.C, studies.D] = await Promise.all([
    issuedStudy(sessions),
    issuedStudy(sessions, strong),
    issuedStudy(sessions, fixtureInputs('fernhollow-cross-bonded'), false),
    issuedStudy(sessions),
  ]);
  projectId = studies.A.projectId;
  const std = `Revalidation standard ${t} (invented)`;
  for (const [key, body] of [
    ['S', { kind: 'site', siteKind: 'substation', code: `RV${t}-S`, name: 'Kestrel Bay substation (invented)', ownerStandard: std }],
    ['S2', { kind: 'site', siteKind: 'substation', code: `RV${t}-S2`, name: 'Another substation (invented)', ownerStandard: std }],
    ['K', { kind: 'circuit', code: `RV${t}-K`, name: 'Circuit 1 (invented)', route: 'Fernhollow to Kestrel Bay', ownerStandard: std }],
  ] as const) ids[key] = (await newAsset(sessions.designer, projectId, body)).id;
  const link = (asset: string, study: string, extra = {}) => send(sessions.designer, 'POST', `/api/assets/${ids[asset]}/studies`, { studyId: studies[study].studyId, ...extra });
  for (const res of await Promise.all([link('S', 'A', { siteEnd: 'end' }), link('S', 'B', { siteEnd: 'end' }), link('S', 'C', { siteEnd: 'end' }), link('S2', 'D'), link('K', 'A', { studyCircuitId: 'C1' })])) await json(res, 201);
}, 240_000);

const publish = async (data: Record<string, unknown>) =>
  json(await send(sessions.approver, 'POST', `/api/assets/${ids.S}/system-data`, { source: 'Network operator letter (invented)', sourceDate: '2026-11-01', ...data }), 201);

const flaggedCodes = (res: { flagged: Array<{ studyCode: string }> }) => res.flagged.map((f) => f.studyCode).sort();

describe('re-validation on publishing site system data', () => {
  it.each<[string, Record<string, unknown>, string[], RegExp[]]>([
    ['earth-fault level 25 kA: only the issued study assuming 20 kA', { earthFaultKa: 25 }, ['A'], [/earth-fault current .* is 20 kA; the site's earth-fault level is now 25 kA/]],
    ['clearance 0.8 s, grid 0.25 Ω at the end: only the study assuming 0.5 s', { clearanceTimeS: 0.8, gridResistanceOhm: 0.25 }, ['B'], [/fault duration .* is 0\.5 s; faults at the site now take 0\.8 s/]],
    ['grid 0.4 Ω at the end: both issued studies of the site', { gridResistanceOhm: 0.4 }, ['A', 'B'], [/station grid at the route end is taken as 0\.3 Ω; the site's grid resistance is now 0\.4 Ω/]],
    ['lower figures everywhere: none', { earthFaultKa: 10, threePhaseFaultKa: 20, clearanceTimeS: 0.2, gridResistanceOhm: 0.1 }, [], []],
    ['maximum load 900 A on the circuit: the study covering that circuit', { maxLoads: 'K:900' }, ['A'], [/load of circuit C1 .* is 850 A; circuit RV.*-K may now carry 900 A/]],
  ])('%s', async (_name, data, expected, sentences) => {
    const body = { ...data, ...(data.maxLoads ? { maxLoads: [{ circuitAssetId: ids.K, maxLoadA: 900 }] } : {}) };
    const res = await publish(body);
    expect(flaggedCodes(res)).toEqual(expected.map((k) => studies[k].code).sort());
    for (const pattern of sentences) expect(res.flagged.flatMap((f: { reasons: string[] }) => f.reasons).some((r: string) => pattern.test(r)), String(pattern)).toBe(true);
  });

  it('shows the covered assets as needing review, e-mails designer and approver, and pre-fills a new revision', async () => {
    const rows = await registerRows(sessions.designer, `search=RV${t}`);
    const status = Object.fromEntries(rows.map((r) => [r.code, r.status]));
    expect(status[`RV${t}-S`]).toBe('needs review');
    expect(status[`RV${t}-K`]).toBe('needs review');
    expect(status[`RV${t}-S2`]).toBe('covered');

    await waitForMail(testEnv().mailWebUrl, (m) => ['designer', 'approver'].every((who) => m.some((x) => x.to.some((to) => to.address === `${who}@sheathwise.example`) && x.subject.includes(`${studies.A.code} rev 1 needs review`))));

    const state = await json(await sessions.designer.fetch(`/api/studies/${studies.A.studyId}/reviews`), 200);
    expect(state.reviews.length).toBeGreaterThanOrEqual(3);
    const paths = state.proposals.map((p: { path: string }) => p.path).sort();
    expect(paths).toEqual(['cases.0.currents.0.currentA', 'cases.3.earthFault.currentA', 'earthing.routeEndOhm']);

    // Only a designer starts it; the designer confirms two of the three values.
    expect((await send(sessions.approver, 'POST', `/api/studies/${studies.A.studyId}/reviews`)).status).toBe(403);
    const started = await json(await send(sessions.designer, 'POST', `/api/studies/${studies.A.studyId}/reviews`), 201);
    const revisionId = started.revision.id;
    // A later visit picks up the revision being edited instead of offering to start another.
    expect((await json(await sessions.designer.fetch(`/api/studies/${studies.A.studyId}/reviews`), 200)).editing.id).toBe(revisionId);
    expect(state.editing).toBeNull();
    const refused = await json(await send(sessions.designer, 'POST', `/api/studies/${studies.A.studyId}/reviews/apply`, { revisionId, version: started.revision.version, accept: ['cases.1.durationS'] }), 422);
    expect(refused.fields[0].field).toBe('accept.0');
    await json(await send(sessions.designer, 'POST', `/api/studies/${studies.A.studyId}/reviews/apply`, { revisionId, version: started.revision.version, accept: ['cases.3.earthFault.currentA', 'earthing.routeEndOhm'] }), 200);
    const inputs = (await json(await sessions.designer.fetch(`/api/revisions/${revisionId}`), 200)).revision.inputs;
    expect(inputs.cases[3].earthFault.currentA).toBe(25000);
    expect(inputs.earthing.routeEndOhm).toBe(0.4);
    expect(inputs.cases[0].currents[0].currentA).toBe(850);
  });

  it('refuses bad system data by field, and keeps nothing of it', async () => {
    const bad = await json(await send(sessions.approver, 'POST', `/api/assets/${ids.S}/system-data`, { earthFaultKa: -3, source: '', sourceDate: '2026-02-30' }), 422);
    expect(bad.fields.map((f: { field: string }) => f.field).sort()).toEqual(['earthFaultKa', 'source', 'sourceDate']);
    const before = (await json(await sessions.designer.fetch(`/api/assets/${ids.S}`), 200)).systemData.length;
    const circuit = await json(await send(sessions.approver, 'POST', `/api/assets/${ids.K}/system-data`, { earthFaultKa: 30, source: 'x', sourceDate: '2026-01-01' }), 422);
    expect(circuit.message).toMatch(/belongs to a site/);
    expect((await json(await sessions.designer.fetch(`/api/assets/${ids.S}`), 200)).systemData.length).toBe(before);
    expect((await send(sessions.designer, 'POST', `/api/assets/${ids.S}/system-data`, { earthFaultKa: 30, source: 'x', sourceDate: '2026-01-01' })).status).toBe(403);
  });
});
