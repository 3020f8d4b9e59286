import { redirect } from 'next/navigation';
import type { ProjectRole } from './roles';
import { currentCaller } from './access';
import { roleInProject } from '@/lib/services/projects';
import { notFound } from 'next/navigation';
import type { PublicUser } from '@/lib/services/users';

/** For server pages: the signed-in user, or a redirect to the sign-in page. */
export async function pageUser(): Promise<PublicUser> {
  const caller = await currentCaller();
  if (!caller) redirect('/signin');
  return caller.user;
}

/** For project pages: the same role rule as the API (non-members see "not found"). */
export async function pageProjectRole(
  projectId: string,
): Promise<{ user: PublicUser; role: ProjectRole }> {
  const user = await pageUser();
  const role = await roleInProject(projectId, user.id);
  if (!role) notFound();
  return { user, role };
}
