import type { HttpSession } from '../helpers/http-session';
import { type DemoRole, demoIds, drive, fixtureInputs, json, prepareForSubmit, send } from '../helpers/workflow-api';

// Register data made through the running app's endpoints. Each test works under an owner
// standard and asset codes of its own, so runs and tests never see each other's obligations.

let seq = 0;
export const tag = () => `${process.pid % 1000}${Date.now() % 100000}${seq++}`;

export const todayUtc = () => new Date().toISOString().slice(0, 10);
export const daysFromToday = (days: number) => new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

/** An owner standard of the test's own (invented) with an oversheath test (minimum resistance) and a link-box inspection. */
export async function ownStandard(admin: HttpSession, opts: { firstDueMonths?: number; intervalMonths?: number } = {}) {
  const ownerStandard = `Test owner standard ${tag()} (invented)`;
  const oversheath = await json(
    await send(admin, 'POST', '/api/admin/obligation-types', {
      ownerStandard,
      name: 'Oversheath test',
      appliesTo: 'circuit',
      firstDueMonths: opts.firstDueMonths ?? 0,
      intervalMonths: opts.intervalMonths ?? 24,
      criterion: { quantity: 'oversheath insulation resistance', unit: 'MΩ', comparison: 'at-least', limit: 1 },
      remindDaysBefore: 30,
      basis: 'Invented for the tests',
    }),
    201,
  );
  const inspection = await json(
    await send(admin, 'POST', '/api/admin/obligation-types', { ownerStandard, name: 'Link-box inspection', appliesTo: 'site', firstDueMonths: 0, intervalMonths: 12, criterion: null, basis: 'Invented for the tests' }),
    201,
  );
  return { ownerStandard, oversheathId: oversheath.id as string, inspectionId: inspection.id as string };
}

export async function newAsset(s: HttpSession, projectId: string, body: Record<string, unknown>) {
  return json(await send(s, 'POST', `/api/projects/${projectId}/assets`, body), 201);
}

/** A study created from inputs, calculated, and driven to issued by the demo people. */
export async function issuedStudy(sessions: Record<DemoRole, HttpSession>, inputs = fixtureInputs('fernhollow-cross-bonded'), issue = true) {
  const { projectId, limitSetId } = await demoIds(sessions.designer);
  const created = await json(await send(sessions.designer, 'POST', `/api/projects/${projectId}/studies`, { code: `R${tag()}`, title: 'Register test study', kind: inputs.kind, limitSetId, inputs }), 201);
  const revisionId = created.revision.id as string;
  await json(await send(sessions.designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200);
  await prepareForSubmit(sessions.designer, revisionId);
  if (issue) await drive(sessions, revisionId, [['designer', 'submit'], ['checker', 'startCheck'], ['checker', 'pass'], ['approver', 'issue']]);
  return { projectId, studyId: created.study.id as string, revisionId, code: created.study.code as string };
}

/** The register rows of the assets whose code contains `search`, every page. */
export async function registerRows(s: HttpSession, query: string) {
  const rows: Array<Record<string, unknown>> = [];
  let after: string | null = null;
  do {
    const page: { rows: Array<Record<string, unknown>>; next: string | null } = await json(await s.fetch(`/api/register?${query}${after ? `&after=${after}` : ''}`), 200);
    rows.push(...page.rows);
    after = page.next;
  } while (after);
  return rows;
}
