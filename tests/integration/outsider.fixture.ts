import { createDatabase } from '../../src/lib/db/client';
import { memberships, projects, users } from '../../src/lib/db/schema';
import { projectRoles } from '../../src/lib/db/schema/projects';
import { hashPassword } from '../../src/lib/auth/passwords';
import { testEnv } from '../helpers/env';
import { type HttpSession, signedIn } from '../helpers/http-session';
import { fixtureInputs, json, send } from '../helpers/workflow-api';

export interface Outsider {
  session: HttpSession;
  userId: string;
  email: string;
  projectId: string;
  studyId: string;
}

let seq = 0;

/**
 * A person who holds every project role, but only in a second project of their own, which has
 * one study of theirs (so it has audit events). Made straight in the database: the app has no
 * endpoint that creates projects.
 */
export async function makeOutsider(): Promise<Outsider> {
  const tag = `${process.pid}-${Date.now() % 1_000_000}-${seq++}`;
  const email = `outsider-${tag}@sheathwise.example`;
  const password = `outsider-password-${tag}`;
  const { db, pool } = createDatabase(testEnv().databaseUrl, 1);
  let userId: string;
  let projectId: string;
  try {
    [{ id: userId }] = await db.insert(users).values({ email, name: `Outsider ${tag}`, passwordHash: await hashPassword(password) }).returning({ id: users.id });
    [{ id: projectId }] = await db.insert(projects).values({ code: `OUT-${tag}`, name: `Outsider project ${tag}` }).returning({ id: projects.id });
    await db.insert(memberships).values(projectRoles.map((role) => ({ projectId, userId, role })));
  } finally {
    await pool.end();
  }
  const session = await signedIn(email, password);
  const { limitSets } = await json(await session.fetch('/api/limit-sets'), 200);
  const created = await json(
    await send(session, 'POST', `/api/projects/${projectId}/studies`, { code: `O-${tag}`, title: 'Outsider study', kind: 'bonding', limitSetId: limitSets[0].id, inputs: fixtureInputs('fernhollow-cross-bonded') }),
    201,
  );
  return { session, userId, email, projectId, studyId: created.study.id };
}
