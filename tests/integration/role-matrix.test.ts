import { beforeAll, describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, currentVersion, demoIds, demoSessions, drive, fixtureInputs, json, readyDraft, send, uploadForm } from '../helpers/workflow-api';

import { makeOutsider } from './outsider.fixture';

// Every endpoint, called by every demo role and by an outsider (every project role, but only in
// another project): the roles allowed succeed, the others get 403. Requests that change state
// are built per role so that an allowed call has something valid to act on. Whatever the
// outsider is allowed must not mention the demo project. The last test fails when an endpoint
// exists that this matrix does not list.

type Role = DemoRole | 'outsider';
const ROLES: Role[] = ['designer', 'checker', 'approver', 'auditor', 'admin', 'outsider'];
const READERS: Role[] = ['designer', 'checker', 'approver', 'auditor'];
const PARTICIPANTS: Role[] = ['designer', 'checker', 'approver'];
// The audit trail: auditors and administrators, each within their scope (audit-scope.test.ts).
const AUDIT_READERS: Role[] = ['auditor', 'admin', 'outsider'];

interface Fixture {
  /** Register assets that each allowed role removes, or unlinks from the issued study, once. */
  removable: Record<string, string>;
  unlinkable: Record<string, string>;
  projectId: string;
  limitSetId: string;
  issuedStudyId: string;
  draft: string;
  draftToWithdraw: string;
  inCheck: string;
  inCheckToReturn: string;
  checkedFailing: string;
  checkedToReturn: string;
  failingItemKey: string;
  remarkId: string;
  inCheckToAgree: string;
  agreeCount: number;
  checkValueId: string;
  checkValueToDelete: string;
  userId: string;
  fileId: string;
  measurementsId: string;
  circuitAssetId: string;
  siteAssetId: string;
  obligationTypeId: string;
  evidenceRecordId: string;
  exploreDraft: string;
  explorationId: string;
}

type Call = (f: Fixture, role: Role) => { method: string; path: string; body?: unknown };

const matrix: Array<{ route: string; allowed: Role[]; status: number; call: Call }> = [
  { route: 'GET /api/me', allowed: ROLES, status: 200, call: () => ({ method: 'GET', path: '/api/me' }) },
  { route: 'GET /api/projects', allowed: ROLES, status: 200, call: () => ({ method: 'GET', path: '/api/projects' }) },
  { route: 'GET /api/limit-sets', allowed: ROLES, status: 200, call: () => ({ method: 'GET', path: '/api/limit-sets' }) },
  { route: 'GET /api/admin/users', allowed: ['admin'], status: 200, call: () => ({ method: 'GET', path: '/api/admin/users' }) },
  { route: 'GET /api/projects/[projectId]/studies', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/projects/${f.projectId}/studies?sort=updated&direction=desc` }) },
  {
    route: 'POST /api/projects/[projectId]/studies',
    allowed: ['designer'],
    status: 201,
    call: (f, role) => ({ method: 'POST', path: `/api/projects/${f.projectId}/studies`, body: { code: `M-${role}-${Date.now() % 100000}`, title: 'Matrix study', kind: 'bonding', limitSetId: f.limitSetId, inputs: fixtureInputs('fernhollow-cross-bonded') } }),
  },
  { route: 'GET /api/studies/[studyId]', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/studies/${f.issuedStudyId}` }) },
  { route: 'POST /api/studies/[studyId]/revisions', allowed: ['designer'], status: 201, call: (f) => ({ method: 'POST', path: `/api/studies/${f.issuedStudyId}/revisions` }) },
  { route: 'POST /api/studies/[studyId]/copy', allowed: ['designer'], status: 201, call: (f, role) => ({ method: 'POST', path: `/api/studies/${f.issuedStudyId}/copy`, body: { projectId: f.projectId, code: `MC-${role}-${Date.now() % 100000}`, title: 'Matrix copy' } }) },
  { route: 'GET /api/revisions/[revisionId]', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.inCheck}` }) },
  { route: 'PUT /api/revisions/[revisionId]/inputs', allowed: ['designer'], status: 200, call: (f) => ({ method: 'PUT', path: `/api/revisions/${f.draft}/inputs`, body: { version: -1, inputs: fixtureInputs('fernhollow-cross-bonded') } }) },
  { route: 'POST /api/revisions/[revisionId]/calculate', allowed: ['designer'], status: 200, call: (f) => ({ method: 'POST', path: `/api/revisions/${f.draft}/calculate` }) },
  {
    route: 'POST /api/revisions/[revisionId]/steps',
    allowed: PARTICIPANTS,
    status: 200,
    call: (f, role) =>
      role === 'designer' ? { method: 'POST', path: `/api/revisions/${f.draftToWithdraw}/steps`, body: { step: 'withdraw', version: -1, reason: 'Matrix: the designer withdraws.' } }
        : role === 'approver' ? { method: 'POST', path: `/api/revisions/${f.checkedToReturn}/steps`, body: { step: 'return', version: -1, reason: 'Standing voltage over the limit.' } }
          : { method: 'POST', path: `/api/revisions/${f.inCheckToReturn}/steps`, body: { step: 'return', version: -1, reason: 'Matrix: checker returns.' } },
  },
  {
    route: 'PUT /api/revisions/[revisionId]/checklist/[itemKey]',
    allowed: PARTICIPANTS,
    status: 200,
    call: (f, role) =>
      role === 'designer' ? { method: 'PUT', path: `/api/revisions/${f.draft}/checklist/manual%3Alink-boxes`, body: { answer: 'no', reason: 'Labels to follow.' } }
        : role === 'checker' ? { method: 'PUT', path: `/api/revisions/${f.inCheck}/checklist/manual%3Alink-boxes`, body: { verdict: 'agree' } }
          : { method: 'PUT', path: `/api/revisions/${f.checkedFailing}/checklist/${encodeURIComponent(f.failingItemKey)}`, body: { justification: 'Link boxes here are in locked kiosks; accepted by the owner.' } },
  },
  { route: 'GET /api/revisions/[revisionId]/record', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.inCheck}/record` }) },
  // Rendering again applies only to a failed issued record: the approver is let through and told so.
  { route: 'POST /api/revisions/[revisionId]/record', allowed: ['approver'], status: 422, call: (f) => ({ method: 'POST', path: `/api/revisions/${f.inCheck}/record` }) },
  { route: 'GET /api/revisions/[revisionId]/remarks', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.inCheck}/remarks` }) },
  { route: 'POST /api/revisions/[revisionId]/remarks', allowed: PARTICIPANTS, status: 201, call: (f, role) => ({ method: 'POST', path: `/api/revisions/${f.inCheck}/remarks`, body: { body: `A remark from the ${role}.` } }) },
  { route: 'GET /api/revisions/[revisionId]/steps', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.inCheck}/steps` }) },
  { route: 'POST /api/revisions/[revisionId]/checklist', allowed: ['checker'], status: 200, call: (f) => ({ method: 'POST', path: `/api/revisions/${f.inCheckToAgree}/checklist`, body: { verdict: 'agree', count: f.agreeCount } }) },
  // A thread is closed by whoever raised it or the revision's checker (here both the checker);
  // the designer and the approver are refused by the service with 403.
  { route: 'PATCH /api/remarks/[remarkId]', allowed: ['checker'], status: 200, call: (f) => ({ method: 'PATCH', path: `/api/remarks/${f.remarkId}`, body: { resolved: true } }) },
  { route: 'PUT /api/revisions/[revisionId]/check-values/[checkValueId]', allowed: ['checker'], status: 200, call: (f) => ({ method: 'PUT', path: `/api/revisions/${f.inCheck}/check-values/${f.checkValueId}`, body: { checkerValue: 21.5, explanation: 'Matrix: corrected.' } }) },
  { route: 'DELETE /api/revisions/[revisionId]/check-values/[checkValueId]', allowed: ['checker'], status: 200, call: (f) => ({ method: 'DELETE', path: `/api/revisions/${f.inCheck}/check-values/${f.checkValueToDelete}` }) },
  { route: 'POST /api/revisions/[revisionId]/check-values', allowed: ['checker'], status: 201, call: (f) => ({ method: 'POST', path: `/api/revisions/${f.inCheck}/check-values`, body: { itemKey: 'standing-voltage-normal:LOAD', checkerValue: 22.0 } }) },
  { route: 'GET /api/revisions/[revisionId]/files', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.inCheck}/files` }) },
  { route: 'POST /api/revisions/[revisionId]/files', allowed: PARTICIPANTS, status: 201, call: (f, role) => ({ method: 'POST', path: `/api/revisions/${f.inCheck}/files`, body: uploadForm('other', `${role}.csv`, 'note\nfrom the matrix\n') }) },
  { route: 'GET /api/files/[fileId]', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/files/${f.fileId}` }) },
  { route: 'GET /api/files/[fileId]/comparison', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/files/${f.measurementsId}/comparison` }) },
  { route: 'GET /api/cable-types', allowed: ROLES, status: 200, call: () => ({ method: 'GET', path: '/api/cable-types' }) },
  {
    route: 'POST /api/admin/cable-types',
    allowed: ['admin'],
    status: 201,
    call: () => ({ method: 'POST', path: '/api/admin/cable-types', body: { id: `M${Date.now() % 1000000}`, name: 'Matrix cable', conductorResistanceOhmPerKm: 0.05, conductorGmrMm: 10, sheathMeanDiameterMm: 80, sheathResistanceOhmPerKm: 0.1, oversheathThicknessMm: 4, overallDiameterMm: 90, oversheathWithstandKv: 20 } }),
  },
  { route: 'GET /api/audit', allowed: AUDIT_READERS, status: 200, call: () => ({ method: 'GET', path: '/api/audit?pageSize=5' }) },
  { route: 'GET /api/audit/facets', allowed: AUDIT_READERS, status: 200, call: () => ({ method: 'GET', path: '/api/audit/facets' }) },
  { route: 'GET /api/me/queue', allowed: ROLES, status: 200, call: () => ({ method: 'GET', path: '/api/me/queue' }) },
  { route: 'GET /api/revisions/[revisionId]/history', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.inCheck}/history` }) },
  { route: 'GET /api/revisions/[revisionId]/profile', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.inCheck}/profile?caseId=LOAD` }) },
  { route: 'GET /api/revisions/[revisionId]/compare', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.inCheck}/compare?against=previous` }) },
  { route: 'GET /api/admin/projects/[projectId]/document-number', allowed: ['admin'], status: 200, call: (f) => ({ method: 'GET', path: `/api/admin/projects/${f.projectId}/document-number` }) },
  { route: 'GET /api/admin/record-settings', allowed: ['admin'], status: 200, call: () => ({ method: 'GET', path: '/api/admin/record-settings' }) },
  // The default (link, not append) again, so records rendered by other tests do not depend on the order of tests.
  { route: 'PUT /api/admin/record-settings', allowed: ['admin'], status: 200, call: () => ({ method: 'PUT', path: '/api/admin/record-settings', body: { appendValidation: false } }) },
  // The default pattern again, so other tests' file names do not depend on the order of tests.
  { route: 'PUT /api/admin/projects/[projectId]/document-number', allowed: ['admin'], status: 200, call: (f) => ({ method: 'PUT', path: `/api/admin/projects/${f.projectId}/document-number`, body: { pattern: '{project}-{study}-R{revision:2}' } }) },
  { route: 'GET /api/admin/projects/[projectId]/members', allowed: ['admin'], status: 200, call: (f) => ({ method: 'GET', path: `/api/admin/projects/${f.projectId}/members` }) },
  { route: 'GET /api/audit/verify', allowed: AUDIT_READERS, status: 200, call: () => ({ method: 'GET', path: '/api/audit/verify' }) },
  { route: 'GET /api/audit/export', allowed: AUDIT_READERS, status: 200, call: () => ({ method: 'GET', path: '/api/audit/export?type=revision.issue' }) },
  { route: 'POST /api/admin/invitations', allowed: ['admin'], status: 201, call: (_f, role) => ({ method: 'POST', path: '/api/admin/invitations', body: { email: `matrix-${role}-${Date.now()}@sheathwise.example`, name: 'Matrix Invitee' } }) },
  { route: 'POST /api/admin/projects/[projectId]/members', allowed: ['admin'], status: 201, call: (f) => ({ method: 'POST', path: `/api/admin/projects/${f.projectId}/members`, body: { userId: f.userId, role: 'auditor' } }) },
  { route: 'DELETE /api/admin/projects/[projectId]/members', allowed: ['admin'], status: 200, call: (f) => ({ method: 'DELETE', path: `/api/admin/projects/${f.projectId}/members`, body: { userId: f.userId, role: 'auditor' } }) },
  {
    route: 'POST /api/admin/limit-sets/[limitSetId]/versions',
    allowed: ['admin'],
    status: 201,
    call: (f) => ({ method: 'POST', path: `/api/admin/limit-sets/${f.limitSetId}/versions`, body: { limits: JSON.parse(readFileSync('tests/fixtures/limit-sets/demo-owner.json', 'utf8')).limits, manualItems: [{ key: 'link-boxes', text: 'Link boxes are lockable and labelled.', basis: 'common practice' }], checkTolerancePct: 2 } }),
  },
  { route: 'GET /api/projects/[projectId]/assets', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/projects/${f.projectId}/assets` }) },
  { route: 'POST /api/projects/[projectId]/assets', allowed: ['designer', 'approver'], status: 201, call: (f, role) => ({ method: 'POST', path: `/api/projects/${f.projectId}/assets`, body: { kind: 'circuit', code: `MX-${role}-${Date.now() % 1000000}`, name: 'Matrix circuit (invented)', ownerStandard: 'Matrix standard (invented)' } }) },
  { route: 'GET /api/projects/[projectId]/register', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/projects/${f.projectId}/register?sort=status` }) },
  { route: 'GET /api/projects/[projectId]/register/export', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/projects/${f.projectId}/register/export` }) },
  // Across the person's own projects: an outsider sees theirs only.
  { route: 'GET /api/register', allowed: ROLES, status: 200, call: () => ({ method: 'GET', path: '/api/register?pageSize=5' }) },
  { route: 'GET /api/register/export', allowed: ROLES, status: 200, call: () => ({ method: 'GET', path: '/api/register/export' }) },
  { route: 'GET /api/register/history', allowed: ROLES, status: 200, call: () => ({ method: 'GET', path: '/api/register/history' }) },
  { route: 'POST /api/register/reminders', allowed: ['admin'], status: 200, call: () => ({ method: 'POST', path: '/api/register/reminders' }) },
  { route: 'GET /api/assets/[assetId]', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/assets/${f.circuitAssetId}` }) },
  { route: 'PATCH /api/assets/[assetId]', allowed: ['designer', 'approver'], status: 200, call: (f) => ({ method: 'PATCH', path: `/api/assets/${f.circuitAssetId}`, body: { name: 'Matrix circuit, renamed (invented)' } }) },
  { route: 'DELETE /api/assets/[assetId]', allowed: ['designer', 'approver'], status: 200, call: (f, role) => ({ method: 'DELETE', path: `/api/assets/${f.removable[role] ?? f.removable.designer}` }) },
  { route: 'PATCH /api/assets/[assetId]/studies/[studyId]', allowed: ['designer', 'approver'], status: 200, call: (f) => ({ method: 'PATCH', path: `/api/assets/${f.siteAssetId}/studies/${f.issuedStudyId}`, body: { siteEnd: 'start' } }) },
  { route: 'DELETE /api/assets/[assetId]/studies/[studyId]', allowed: ['designer', 'approver'], status: 200, call: (f, role) => ({ method: 'DELETE', path: `/api/assets/${f.unlinkable[role] ?? f.unlinkable.designer}/studies/${f.issuedStudyId}` }) },
  { route: 'POST /api/assets/[assetId]/studies', allowed: ['designer', 'approver'], status: 201, call: (f) => ({ method: 'POST', path: `/api/assets/${f.circuitAssetId}/studies`, body: { studyId: f.issuedStudyId, studyCircuitId: 'C1' } }) },
  {
    route: 'POST /api/assets/[assetId]/records',
    allowed: PARTICIPANTS,
    status: 201,
    call: (f, role) => {
      const form = new FormData();
      for (const [k, v] of Object.entries({ obligationTypeId: f.obligationTypeId, doneOn: '2026-01-15', performedBy: `Matrix ${role}`, remarks: 'Matrix record.' })) form.set(k, v);
      return { method: 'POST', path: `/api/assets/${f.circuitAssetId}/records`, body: form };
    },
  },
  { route: 'GET /api/assets/[assetId]/records/[recordId]/evidence', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/assets/${f.circuitAssetId}/records/${f.evidenceRecordId}/evidence` }) },
  { route: 'POST /api/assets/[assetId]/system-data', allowed: ['approver'], status: 201, call: (f) => ({ method: 'POST', path: `/api/assets/${f.siteAssetId}/system-data`, body: { earthFaultKa: 1, source: 'Matrix (invented)', sourceDate: '2026-01-01' } }) },
  { route: 'GET /api/admin/obligation-types', allowed: ['admin'], status: 200, call: () => ({ method: 'GET', path: '/api/admin/obligation-types' }) },
  { route: 'POST /api/admin/obligation-types', allowed: ['admin'], status: 201, call: (_f, role) => ({ method: 'POST', path: '/api/admin/obligation-types', body: { ownerStandard: 'Matrix standard (invented)', name: `Matrix check ${role} ${Date.now()}`, appliesTo: 'site', firstDueMonths: 0, intervalMonths: 12, basis: 'Invented for the matrix' } }) },
  { route: 'GET /api/studies/[studyId]/reviews', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/studies/${f.issuedStudyId}/reviews` }) },
  // No published system data puts the matrix's issued study under review: the designer is let through and told so.
  { route: 'POST /api/studies/[studyId]/reviews', allowed: ['designer'], status: 422, call: (f) => ({ method: 'POST', path: `/api/studies/${f.issuedStudyId}/reviews` }) },
  { route: 'POST /api/studies/[studyId]/reviews/apply', allowed: ['designer'], status: 422, call: (f) => ({ method: 'POST', path: `/api/studies/${f.issuedStudyId}/reviews/apply`, body: { revisionId: f.draft, version: 1, accept: ['earthing.routeEndOhm'] } }) },
  { route: 'GET /api/revisions/[revisionId]/explorations', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.exploreDraft}/explorations` }) },
  { route: 'POST /api/revisions/[revisionId]/explorations', allowed: ['designer'], status: 202, call: (f) => ({ method: 'POST', path: `/api/revisions/${f.exploreDraft}/explorations`, body: { kind: 'placement', drumLengthM: 900 } }) },
  { route: 'GET /api/revisions/[revisionId]/explorations/[explorationId]', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.exploreDraft}/explorations/${f.explorationId}` }) },
  // A finished run's stream says `end` at once and closes.
  { route: 'GET /api/revisions/[revisionId]/explorations/[explorationId]/events', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.exploreDraft}/explorations/${f.explorationId}/events` }) },
  // A finished exploration: the designer passes the role check and is told there is nothing to cancel.
  { route: 'POST /api/revisions/[revisionId]/explorations/[explorationId]/cancel', allowed: ['designer'], status: 422, call: (f) => ({ method: 'POST', path: `/api/revisions/${f.exploreDraft}/explorations/${f.explorationId}/cancel` }) },
  { route: 'POST /api/revisions/[revisionId]/explorations/[explorationId]/save', allowed: ['designer'], status: 200, call: (f) => ({ method: 'POST', path: `/api/revisions/${f.exploreDraft}/explorations/${f.explorationId}/save` }) },
  // An appraisal is no placement: the designer passes the role check and is told what to choose.
  { route: 'POST /api/revisions/[revisionId]/explorations/[explorationId]/accept', allowed: ['designer'], status: 422, call: (f) => ({ method: 'POST', path: `/api/revisions/${f.exploreDraft}/explorations/${f.explorationId}/accept` }) },
  { route: 'GET /api/revisions/[revisionId]/bonding-choice', allowed: READERS, status: 200, call: (f) => ({ method: 'GET', path: `/api/revisions/${f.exploreDraft}/bonding-choice` }) },
  { route: 'PUT /api/revisions/[revisionId]/bonding-choice', allowed: ['designer'], status: 200, call: (f) => ({ method: 'PUT', path: `/api/revisions/${f.exploreDraft}/bonding-choice`, body: { explorationId: f.explorationId, optionKey: 'current', reason: 'Matrix choice.' } }) },
];

// Public by design: no session needed. Checked by their own tests.
const PUBLIC = ['GET /api/health', 'POST /api/invitations/accept'];

describe('role × endpoint matrix', () => {
  let sessions: Record<Role, HttpSession>;
  let f: Fixture;

  beforeAll(async () => {
    sessions = { ...(await demoSessions()), outsider: (await makeOutsider()).session };
    const { projectId, limitSetId } = await demoIds(sessions.designer);
    const issued = await readyDraft(sessions.designer);
    await drive(sessions, issued.revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
    const draft = (await readyDraft(sessions.designer)).revisionId;
    const draftToWithdraw = (await readyDraft(sessions.designer)).revisionId;
    const inCheck = (await readyDraft(sessions.designer)).revisionId;
    await drive(sessions, inCheck, [['designer', 'submit'], ['checker', 'startCheck']]);
    const inCheckToReturn = (await readyDraft(sessions.designer)).revisionId;
    await drive(sessions, inCheckToReturn, [['designer', 'submit'], ['checker', 'startCheck']]);
    const checkedFailing = (await readyDraft(sessions.designer, 'kestrel-single-point-ecc')).revisionId;
    await drive(sessions, checkedFailing, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass']]);
    const checkedToReturn = (await readyDraft(sessions.designer)).revisionId;
    await drive(sessions, checkedToReturn, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass']]);
    const failing = (await json(await sessions.approver.fetch(`/api/revisions/${checkedFailing}`), 200)).checklist.find((i: { status: string }) => i.status === 'fail');
    const remark = await json(await send(sessions.checker, 'POST', `/api/revisions/${inCheck}/remarks`, { body: 'Please state the earthing resistance source.' }), 201);
    const inCheckToAgree = (await readyDraft(sessions.designer)).revisionId;
    await drive(sessions, inCheckToAgree, [['designer', 'submit'], ['checker', 'startCheck']]);
    const agreeCount = (await json(await sessions.checker.fetch(`/api/revisions/${inCheckToAgree}`), 200)).checklist.length;
    const checkValue = await json(await send(sessions.checker, 'POST', `/api/revisions/${inCheck}/check-values`, { itemKey: 'standing-voltage-normal:LOAD', checkerValue: 21 }), 201);
    const checkValueToDelete = await json(await send(sessions.checker, 'POST', `/api/revisions/${inCheck}/check-values`, { itemKey: 'standing-voltage-normal:LOAD', checkerValue: 20 }), 201);
    const me = await json(await sessions.designer.fetch('/api/me'), 200);
    const file = await json(await send(sessions.checker, 'POST', `/api/revisions/${inCheck}/files`, uploadForm('data-sheet', 'svl.pdf', '%PDF-1.4\n% matrix\n')), 201);
    const measurements = await json(await send(sessions.checker, 'POST', `/api/revisions/${inCheck}/files`, uploadForm('measurements', 'readings.csv', 'joint,cable,measured_v,load_a\n1,C1-a,12.0,500\n')), 201);
    const exploreDraft = (await readyDraft(sessions.designer)).revisionId;
    const appraisal = await json(await send(sessions.designer, 'POST', `/api/revisions/${exploreDraft}/explorations`, { kind: 'appraisal' }), 202);
    for (let i = 0; i < 600 && (await json(await sessions.designer.fetch(`/api/revisions/${exploreDraft}/explorations/${appraisal.id}`), 200)).status === 'running'; i++) await new Promise((r) => setTimeout(r, 100));
    await json(await send(sessions.designer, 'POST', `/api/revisions/${exploreDraft}/explorations/${appraisal.id}/save`), 200);
    const standard = `Matrix standard ${Date.now()} (invented)`;
    const obligationType = await json(await send(sessions.admin, 'POST', '/api/admin/obligation-types', { ownerStandard: standard, name: 'Matrix inspection', appliesTo: 'circuit', firstDueMonths: 0, intervalMonths: 12, basis: 'Invented for the matrix' }), 201);
    const circuit = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/assets`, { kind: 'circuit', code: `MXC-${Date.now() % 1000000}`, name: 'Matrix circuit (invented)', ownerStandard: standard, inServiceOn: '2025-01-01' }), 201);
    const site = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/assets`, { kind: 'site', siteKind: 'substation', code: `MXS-${Date.now() % 1000000}`, name: 'Matrix site (invented)', ownerStandard: standard }), 201);
    await json(await send(sessions.designer, 'POST', `/api/assets/${site.id}/studies`, { studyId: issued.studyId, siteEnd: 'end' }), 201);
    const removable: Record<string, string> = {};
    const unlinkable: Record<string, string> = {};
    for (const role of ['designer', 'approver']) {
      const make = async (what: string) => (await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/assets`, { kind: 'circuit', code: `MX${what}-${role}-${Date.now() % 1000000}`, name: 'Matrix circuit (invented)', ownerStandard: standard }), 201)).id as string;
      removable[role] = await make('R');
      unlinkable[role] = await make('U');
      await json(await send(sessions.designer, 'POST', `/api/assets/${unlinkable[role]}/studies`, { studyId: issued.studyId }), 201);
    }
    const evidenceForm = uploadForm('other', 'inspection.csv', 'item,state\nbox,locked\n');
    evidenceForm.delete('kind');
    for (const [k, v] of Object.entries({ obligationTypeId: obligationType.id, doneOn: '2025-06-01', performedBy: 'Matrix contractor (invented)' })) evidenceForm.set(k, v);
    const evidenceRecord = await json(await send(sessions.designer, 'POST', `/api/assets/${circuit.id}/records`, evidenceForm), 201);
    f = { removable, unlinkable, exploreDraft, explorationId: appraisal.id, circuitAssetId: circuit.id, siteAssetId: site.id, obligationTypeId: obligationType.id, evidenceRecordId: evidenceRecord.id, projectId, limitSetId, issuedStudyId: issued.studyId, draft, draftToWithdraw, inCheck, inCheckToReturn, checkedFailing, checkedToReturn, failingItemKey: failing.itemKey, remarkId: remark.id, inCheckToAgree, agreeCount, checkValueId: checkValue.id, checkValueToDelete: checkValueToDelete.id, userId: me.id, fileId: file.id, measurementsId: measurements.id };
  });

  for (const entry of matrix) {
    it(entry.route, async () => {
      // Refused roles first: a refusal must change nothing the allowed call relies on.
      const order = [...ROLES.filter((r) => !entry.allowed.includes(r)), ...ROLES.filter((r) => entry.allowed.includes(r))];
      for (const role of order) {
        const { method, path, body } = entry.call(f, role);
        const revisionId = /\/api\/revisions\/([^/]+)/.exec(path)?.[1];
        const withVersion = body && typeof body === 'object' && (body as { version?: number }).version === -1 && revisionId
          ? { ...body, version: await currentVersion(sessions.designer, revisionId) }
          : body;
        const res = await send(sessions[role], method, path, withVersion);
        if (entry.allowed.includes(role)) {
          expect(res.status, `${role}: ${await res.clone().text()}`).toBe(entry.status);
          if (role === 'outsider') expect(await res.text(), 'the outsider sees nothing of the demo project').not.toContain(f.projectId);
        }
        else {
          expect(res.status, `${role} should be refused`).toBe(403);
          expect((await res.json()).error).toBe('Forbidden');
        }
      }
    });
  }

  it('lists every endpoint under src/pages/api', () => {
    const routes: string[] = [];
    const walk = (dir: string) => {
      for (const name of readdirSync(dir)) {
        const file = path.join(dir, name);
        if (statSync(file).isDirectory()) walk(file);
        else if (file.endsWith('.ts')) {
          const route = '/' + path.relative('src/pages', file).replace(/\\/g, '/').replace(/\.ts$/, '').replace(/\/index$/, '');
          for (const [, method] of readFileSync(file, 'utf8').matchAll(/export const (GET|POST|PUT|PATCH|DELETE)\b/g)) routes.push(`${method} ${route}`);
        }
      }
    };
    walk('src/pages/api');
    const listed = new Set([...matrix.map((m) => m.route), ...PUBLIC]);
    expect(routes.filter((r) => !listed.has(r))).toEqual([]);
    expect(routes.length).toBeGreaterThanOrEqual(matrix.length);
  });
});
