import { readFileSync } from 'node:fs';
import { expect } from 'vitest';
import { DEMO_PASSWORD } from './env';
import { type HttpSession, signedIn } from './http-session';

export const DEMO = {
  designer: 'designer@sheathwise.example',
  checker: 'checker@sheathwise.example',
  approver: 'approver@sheathwise.example',
  auditor: 'auditor@sheathwise.example',
  admin: 'admin@sheathwise.example',
} as const;
export type DemoRole = keyof typeof DEMO;

export async function demoSessions(): Promise<Record<DemoRole, HttpSession>> {
  const entries = await Promise.all(Object.entries(DEMO).map(async ([role, email]) => [role, await signedIn(email, DEMO_PASSWORD)] as const));
  return Object.fromEntries(entries) as Record<DemoRole, HttpSession>;
}

export const fixtureInputs = (name: string) => JSON.parse(readFileSync(`tests/fixtures/studies/${name}.json`, 'utf8'));

export async function json(res: Response, status?: number) {
  const body = await res.json();
  if (status !== undefined) expect(res.status, JSON.stringify(body)).toBe(status);
  return body;
}

/** A request with a JSON body, or a multipart body when given FormData. */
export const send = (s: HttpSession, method: string, path: string, body?: unknown) =>
  body instanceof FormData
    ? s.fetch(path, { method, body })
    : s.fetch(path, { method, headers: { 'content-type': 'application/json' }, body: body === undefined ? undefined : JSON.stringify(body) });

/** A multipart upload body. */
export function uploadForm(kind: string, fileName: string, content: string | Uint8Array): FormData {
  const form = new FormData();
  form.set('kind', kind);
  const bytes = typeof content === 'string' ? new TextEncoder().encode(content) : content;
  form.set('file', new Blob([new Uint8Array(bytes)]), fileName);
  return form;
}

/** The demo project and limit set ids. */
export async function demoIds(s: HttpSession) {
  const { projects } = await json(await s.fetch('/api/projects'), 200);
  const { limitSets } = await json(await s.fetch('/api/limit-sets'), 200);
  return { projectId: projects[0].id as string, limitSetId: limitSets[0].id as string };
}

let counter = 0;
const uniqueCode = (prefix: string) => `${prefix}${process.pid % 1000}-${Date.now() % 100000}-${counter++}`;

interface Item { kind: string; itemKey: string; status: string; answerGenerated: boolean }

/**
 * The designer answers every manual question the study has not answered itself ("yes"), and
 * justifies every failing computed item: what a revision needs before it can be submitted.
 */
export async function prepareForSubmit(designer: HttpSession, revisionId: string) {
  const detail = await json(await designer.fetch(`/api/revisions/${revisionId}`), 200);
  for (const item of detail.checklist.filter((i: Item) => i.kind === 'manual' && !i.answerGenerated)) {
    await json(await send(designer, 'PUT', `/api/revisions/${revisionId}/checklist/${encodeURIComponent(item.itemKey)}`, { answer: 'yes' }), 200);
  }
  for (const item of detail.checklist.filter((i: Item) => i.kind === 'computed' && i.status === 'fail')) {
    await json(await send(designer, 'PUT', `/api/revisions/${revisionId}/checklist/${encodeURIComponent(item.itemKey)}`, { justification: 'Accepted for this test: the failing margin is understood.' }), 200);
  }
}

/** A new study, calculated, with every manual item answered and every failure justified by the designer: ready to submit. */
export async function readyDraft(designer: HttpSession, fixture = 'fernhollow-cross-bonded', prefix = 'T') {
  const { projectId, limitSetId } = await demoIds(designer);
  const created = await json(
    await send(designer, 'POST', `/api/projects/${projectId}/studies`, { code: uniqueCode(prefix), title: `Test study from ${fixture}`, kind: fixtureInputs(fixture).kind, limitSetId, inputs: fixtureInputs(fixture) }),
    201,
  );
  const revisionId = created.revision.id as string;
  await json(await send(designer, 'POST', `/api/revisions/${revisionId}/calculate`), 200);
  await prepareForSubmit(designer, revisionId);
  return { projectId, studyId: created.study.id as string, revisionId };
}

export async function currentVersion(s: HttpSession, revisionId: string): Promise<number> {
  return (await json(await s.fetch(`/api/revisions/${revisionId}`), 200)).revision.version;
}

/** The steps that sign, for which the person's password is asked again. */
export const SIGNING_STEPS = new Set(['submit', 'pass', 'issue']);

/** A step at the current version; submit, pass and issue carry the demo password unless `extra` says otherwise. */
export async function step(s: HttpSession, revisionId: string, name: string, extra: Record<string, unknown> = {}) {
  const password = SIGNING_STEPS.has(name) ? { password: DEMO_PASSWORD } : {};
  return send(s, 'POST', `/api/revisions/${revisionId}/steps`, { step: name, version: await currentVersion(s, revisionId), ...password, ...extra });
}

/**
 * Drives a ready draft through the named steps, each expected to succeed. Before a pass the
 * checker closes the open remark threads (a return's reason is one), as a checker satisfied
 * with the answers would; tests of the gates themselves use `step`.
 */
export async function drive(sessions: Record<DemoRole, HttpSession>, revisionId: string, steps: Array<[DemoRole, string]>) {
  for (const [role, name] of steps) {
    if (name === 'pass') await closeOpenThreads(sessions[role], revisionId);
    await json(await step(sessions[role], revisionId, name, name === 'return' || name === 'withdraw' ? { reason: 'Please look again.' } : {}), 200);
  }
}

/** Closes every open remark thread of a revision as the given person. */
export async function closeOpenThreads(s: HttpSession, revisionId: string) {
  const { remarks } = await json(await s.fetch(`/api/revisions/${revisionId}`), 200);
  for (const t of remarks.filter((r: { parentId: string | null; resolved: boolean }) => !r.parentId && !r.resolved)) {
    await json(await send(s, 'PATCH', `/api/remarks/${t.id}`, { resolved: true }), 200);
  }
}
