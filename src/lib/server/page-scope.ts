import type { AstroGlobal } from 'astro';
import { AppError } from '../errors';
import { database } from './services.server';
import { loadRevisionScope, loadStudyScope } from '../db/revisions.repo';

type Scope<T> = { ok: true; scope: T; roles: string[] } | { ok: false; response: Response };

/** Loads what a page shows and checks the visitor belongs to its project; otherwise a plain-text refusal. */
async function scoped<T extends { project: { id: string } }>(astro: AstroGlobal, load: () => Promise<T>): Promise<Scope<T>> {
  let scope: T;
  try {
    scope = await load();
  } catch (err) {
    if (err instanceof AppError) return { ok: false, response: new Response(err.message, { status: err.status }) };
    throw err;
  }
  const roles = astro.locals.user?.projectRoles[scope.project.id] ?? [];
  if (!roles.length) return { ok: false, response: new Response('You are not a member of this project.', { status: 403 }) };
  return { ok: true, scope, roles };
}

export const revisionPageScope = (astro: AstroGlobal) => scoped(astro, () => loadRevisionScope(database(), astro.params.revisionId!));
export const studyPageScope = (astro: AstroGlobal) => scoped(astro, () => loadStudyScope(database(), astro.params.studyId!));
