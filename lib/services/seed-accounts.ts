import { and, eq } from 'drizzle-orm';
import { db } from '@/db/client';
import { projectMembers, projects, users } from '@/db/schema';
import { hashPassword } from '@/lib/auth/password';
import { newId } from '@/lib/auth/secrets';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_PROJECT_NAME } from '@/seed/demo-accounts';

/**
 * Creates the demo accounts and the demo project when they are missing; leaves existing ones
 * as they are, so seeding twice changes nothing. Returns the demo project's id.
 */
export async function ensureDemoAccounts(): Promise<string> {
  const hash = await hashPassword(DEMO_PASSWORD);
  const ids: Record<string, string> = {};
  for (const a of DEMO_ACCOUNTS) {
    const [u] = await db.select({ id: users.id }).from(users).where(eq(users.email, a.email));
    if (u) ids[a.email] = u.id;
    else {
      ids[a.email] = newId();
      await db.insert(users).values({
        id: ids[a.email],
        email: a.email,
        name: a.name,
        passwordHash: hash,
        siteRole: a.siteRole,
      });
    }
  }
  return ensureDemoProject(
    DEMO_PROJECT_NAME,
    'Invented demo data: a synthetic two-armed galaxy whose density wave is known exactly.',
    ids,
  );
}

/**
 * A demo project owned by the demo owner, created when missing, with the demo team in their
 * roles; `ids` maps each demo e-mail address to its user id. Returns the project's id.
 */
export async function ensureDemoProject(
  name: string,
  description: string,
  ids: Readonly<Record<string, string>>,
): Promise<string> {
  const ownerId = ids['owner@harborridge.example'];
  let [project] = await db
    .select({ id: projects.id })
    .from(projects)
    .where(and(eq(projects.name, name), eq(projects.createdBy, ownerId)));
  if (!project) {
    project = { id: newId() };
    await db
      .insert(projects)
      .values({ id: project.id, name, description, createdBy: ownerId, settings: {} });
  }
  for (const a of DEMO_ACCOUNTS) {
    if (!a.projectRole) continue;
    await db
      .insert(projectMembers)
      .values({ projectId: project.id, userId: ids[a.email], role: a.projectRole })
      .onDuplicateKeyUpdate({ set: { role: a.projectRole } });
  }
  return project.id;
}
