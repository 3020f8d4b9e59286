import { getServerSession } from 'next-auth';
import { headers } from 'next/headers';
import { HttpError, forbidden, notFound, unauthenticated } from '@/lib/http/errors';
import { roleInProject } from '@/lib/services/projects';
import { userForToken } from '@/lib/services/tokens';
import { getSessionUser, type PublicUser } from '@/lib/services/users';
import { authOptions } from './options';
import { roleAtLeast, type ProjectRole } from './roles';

export type Caller = { user: PublicUser; via: 'session' | 'token' };

/** The signed-in caller (session cookie or `Authorization: Bearer` token), or null. */
export async function currentCaller(): Promise<Caller | null> {
  const h = await headers();
  const auth = h.get('authorization');
  if (auth?.toLowerCase().startsWith('bearer ')) {
    const user = await userForToken(auth.slice(7).trim());
    return user ? { user, via: 'token' } : null;
  }
  const session = await getServerSession(authOptions);
  const { id, sv } = (session?.user ?? {}) as { id?: string; sv?: unknown };
  // A session from before session versions (no `sv`) or from before the latest sign-out,
  // reset or "sign out everywhere" is no session.
  if (!id || typeof sv !== 'number') return null;
  const user = await getSessionUser(id, sv);
  if (!user) return null;
  return { user, via: 'session' };
}

/** 401 unless signed in. */
export async function requireUser(req?: Request): Promise<PublicUser> {
  // `req` stays for the callers; route() has already checked cookie-authenticated writes for
  // same origin (lib/http/same-origin.ts), without trusting forwarded headers.
  void req;
  const caller = await currentCaller();
  if (!caller) throw unauthenticated();
  return caller.user;
}

/** 401 unless signed in, 403 unless a site admin. */
export async function requireSiteAdmin(req?: Request): Promise<PublicUser> {
  const user = await requireUser(req);
  if (user.siteRole !== 'admin')
    throw new HttpError(403, 'forbidden', 'Only site admins may do this.');
  return user;
}

/**
 * The one access check of every project handler and action: 401 when not signed in, 404 when
 * the caller is not a member (so non-members cannot learn a project exists), 403 when the role
 * is lower than `min`.
 */
export async function requireProjectRole(
  projectId: string,
  min: ProjectRole,
  req?: Request,
  what?: string,
): Promise<{ user: PublicUser; role: ProjectRole }> {
  const user = await requireUser(req);
  const role = await roleInProject(projectId, user.id);
  if (!role) throw notFound('Project');
  if (!roleAtLeast(role, min)) throw forbidden(what);
  return { user, role };
}
