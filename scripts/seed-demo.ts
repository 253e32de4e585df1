// The demo scenario is invented for Sheathwise: the places, people and cable route are
// fictional and describe no real project.
import { eq } from 'drizzle-orm';
import type { Database } from '../src/lib/db/client';
import { memberships, projects, users } from '../src/lib/db/schema';
import { hashPassword } from '../src/lib/auth/passwords';
import type { ProjectRole } from '../src/lib/db/schema/projects';

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

/** Inserts the demo scenario unless it is already there; returns whether it inserted. */
export async function seedDemo(db: Database): Promise<boolean> {
  const [existing] = await db.select().from(projects).where(eq(projects.code, DEMO_PROJECT.code));
  if (existing) return false;
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (tx) => {
    const [project] = await tx.insert(projects).values(DEMO_PROJECT).returning();
    for (const u of demoUsers) {
      const [user] = await tx
        .insert(users)
        .values({ email: u.email, name: u.name, passwordHash, isAdmin: u.role === 'admin' })
        .returning();
      if (u.role !== 'admin') await tx.insert(memberships).values({ projectId: project.id, userId: user.id, role: u.role });
    }
  });
  return true;
}
