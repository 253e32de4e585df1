// The demo scenario is invented for Sheathwise: the places, people and cable route are
// fictional and describe no real project. Studies are driven through the real services so the
// demo history (audit trail, sign-offs) is what the application itself would have written.
import { readFileSync } from 'node:fs';
import { eq } from 'drizzle-orm';
import type pg from 'pg';
import type { Database } from '../src/lib/db/client';
import { limitSets, memberships, projects, users } from '../src/lib/db/schema';
import { hashPassword } from '../src/lib/auth/passwords';
import type { ProjectRole } from '../src/lib/db/schema/projects';
import { loadSessionUser } from '../src/lib/db/users.repo';
import type { AppServices } from '../src/lib/services';
import { publishLimitSetVersion } from '../src/lib/admin/limit-sets.service';
import { calculateRevision, createStudy, startNewRevision } from '../src/lib/studies/studies.service';
import { updateChecklistItem } from '../src/lib/studies/revision-items.service';
import { applyStep } from '../src/lib/workflow/revision-workflow.server';
import { loadCalculationScope, revisionDetail } from '../src/lib/db/revisions.repo';
import { demoManualItems } from './demo-manual-items';
import { demoCableTypes } from './demo-cable-types';
import { addCableType } from '../src/lib/admin/cable-types.service';
import { cableTypeSchema } from '../src/lib/schemas/bonding-study.schema';
import { storeIssuedRecord } from '../src/lib/records/records.service';
import { seedRegister } from './seed-register';

export const DEMO_PASSWORD = 'sheathwise-demo';

export const demoUsers: Array<{ email: string; name: string; role: ProjectRole | 'admin' }> = [
  { email: 'designer@sheathwise.example', name: 'Ada Okonkwo', role: 'designer' },
  { email: 'checker@sheathwise.example', name: 'Bram Lindqvist', role: 'checker' },
  { email: 'approver@sheathwise.example', name: 'Carys Penhallow', role: 'approver' },
  { email: 'auditor@sheathwise.example', name: 'Dev Raman', role: 'auditor' },
  { email: 'admin@sheathwise.example', name: 'Elin Marsh', role: 'admin' },
];

const DEMO_PROJECT = {
  code: 'FHX-132',
  name: 'Fernhollow–Kestrel Bay 132 kV cable link (demo, fictional)',
  description:
    'An invented 132 kV underground circuit between two imaginary substations, used to show Sheathwise. Not a real project.',
};

const fixture = (name: string) => JSON.parse(readFileSync(`tests/fixtures/studies/${name}.json`, 'utf8'));

/** Inserts the demo scenario unless it is already there; returns whether it inserted. */
export async function seedDemo(db: Database, pool: pg.Pool): Promise<boolean> {
  const [existing] = await db.select().from(projects).where(eq(projects.code, DEMO_PROJECT.code));
  if (existing) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const [project] = await db.insert(projects).values(DEMO_PROJECT).returning();
  const ids: Record<string, string> = {};
  for (const u of demoUsers) {
    const [user] = await db.insert(users).values({ email: u.email, name: u.name, passwordHash, isAdmin: u.role === 'admin' }).returning();
    ids[u.role] = user.id;
    if (u.role !== 'admin') await db.insert(memberships).values({ projectId: project.id, userId: user.id, role: u.role });
  }
  const s: AppServices = { db, pool, jobs: null, store: null, appUrl: '' };
  const as = async (role: string) => (await loadSessionUser(db, ids[role]))!;
  const [designer, checker, approver, admin] = await Promise.all(['designer', 'checker', 'approver', 'admin'].map(as));

  for (const type of demoCableTypes) await addCableType(s, admin, cableTypeSchema.parse(type));

  const [limitSet] = await db.insert(limitSets).values({ name: 'Demo owner limits (fictional owner)' }).returning();
  const demoLimits = JSON.parse(readFileSync('tests/fixtures/limit-sets/demo-owner.json', 'utf8'));
  await publishLimitSetVersion(s, admin, limitSet.id, { limits: demoLimits.limits, manualItems: demoManualItems, checkTolerancePct: 2 });

  // The designer answers the questions the study has not answered itself ("not applicable"
  // where the subject is absent), and says why each failing computed item is submitted.
  const answerAll = async (revisionId: string) => {
    const detail = await revisionDetail(db, revisionId);
    for (const item of detail.checklist.filter((i) => i.kind === 'manual' && !i.answerGenerated)) {
      await updateChecklistItem(s, designer, revisionId, item.itemKey, { answer: 'yes' });
    }
    for (const item of detail.checklist.filter((i) => i.kind === 'computed' && i.status === 'fail')) {
      await updateChecklistItem(s, designer, revisionId, item.itemKey, { justification: 'Demo: the entry is fenced and the link box locked; the owner accepts the margin (invented for the demo).' });
    }
  };
  const version = async (revisionId: string) => (await revisionDetail(db, revisionId)).revision.version;
  // Each seeded person signs with their own (demo) password, as the application asks them to.
  const signing = { clientAddress: 'seed', policy: { maxFailures: 5, lockSeconds: 300, maxFailuresPerAddress: 50 } };
  const step = async (who: typeof designer, revisionId: string, name: Parameters<typeof applyStep>[3]['step'], reason?: string) =>
    applyStep(s, who, revisionId, { step: name, version: await version(revisionId), reason, password: DEMO_PASSWORD }, signing);
  const draftCalculated = async (code: string, title: string, kind: 'bonding' | 'exposure', file: string) => {
    const { revision } = await createStudy(s, designer, project.id, { code, title, kind, limitSetId: limitSet.id, inputs: fixture(file) });
    await calculateRevision(s, designer, await loadCalculationScope(db, revision.id));
    await answerAll(revision.id);
    return revision.id;
  };

  // Issued, with an earlier revision it superseded.
  const main1 = await draftCalculated('B01', 'Circuit 1 cross-bonded route', 'bonding', 'fernhollow-cross-bonded');
  for (const [who, name] of [[designer, 'submit'], [checker, 'startCheck'], [checker, 'pass'], [approver, 'issue']] as const) await step(who, main1, name);
  // The seed runs without the job queue, so it renders the issued records itself.
  await storeIssuedRecord(s, main1);
  const main2 = (await startNewRevision(s, designer, (await revisionDetail(db, main1)).study.id)).id;
  await calculateRevision(s, designer, await loadCalculationScope(db, main2));
  await answerAll(main2);
  for (const [who, name] of [[designer, 'submit'], [checker, 'startCheck'], [checker, 'pass'], [approver, 'issue']] as const) await step(who, main2, name);
  await storeIssuedRecord(s, main2);

  // Checked, waiting for approval (its standing voltage fails the demo limit: the approver must justify or return it).
  const entry = await draftCalculated('B02', 'Kestrel Bay substation entry, single-point with ECC', 'bonding', 'kestrel-single-point-ecc');
  for (const [who, name] of [[designer, 'submit'], [checker, 'startCheck'], [checker, 'pass']] as const) await step(who, entry, name);

  // Submitted, waiting for a checker.
  const fence = await draftCalculated('E01', 'Marrow Lane fence exposure', 'exposure', 'marrow-lane-fence-exposure');
  await step(designer, fence, 'submit');

  // Still being drafted.
  await createStudy(s, designer, project.id, { code: 'B03', title: 'Fernhollow substation entry (drafting)', kind: 'bonding', limitSetId: limitSet.id, inputs: fixture('kestrel-single-point-ecc') });

  // The compliance register of the demo (invented assets, obligations and network data).
  await seedRegister(s, { designer, approver, admin }, project.id, (await revisionDetail(db, main2)).study.id);
  return true;
}
