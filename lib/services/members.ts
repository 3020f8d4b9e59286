import { and, asc, eq, gt, isNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import { db } from '@/db/client';
import { auditLog, invitations, projectMembers, projects, users } from '@/db/schema';
import type { ProjectRole } from '@/lib/auth/roles';
import { newId, randomSecret, sha256 } from '@/lib/auth/secrets';
import { env } from '@/lib/env';
import { conflict, HttpError, notFound } from '@/lib/http/errors';
import { sendMail } from '@/lib/mail/send';
import { invitationMail } from '@/lib/mail/templates';
import { emailSchema } from './users';

export const roleSchema = z.enum(['owner', 'editor', 'viewer']);
export const inviteSchema = z.object({ email: emailSchema, role: roleSchema });
export const changeRoleSchema = z.object({ role: roleSchema });

const INVITATION_DAYS = 7;

export async function listMembers(projectId: string) {
  const members = await db
    .select({
      userId: users.id,
      email: users.email,
      name: users.name,
      role: projectMembers.role,
      since: projectMembers.createdAt,
    })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(eq(projectMembers.projectId, projectId))
    .orderBy(asc(users.name));
  const pending = await db
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      expiresAt: invitations.expiresAt,
      createdAt: invitations.createdAt,
    })
    .from(invitations)
    .where(
      and(
        eq(invitations.projectId, projectId),
        isNull(invitations.acceptedAt),
        isNull(invitations.revokedAt),
        gt(invitations.expiresAt, sql`NOW()`),
      ),
    )
    .orderBy(asc(invitations.createdAt));
  return {
    members: members.map((m) => ({ ...m, since: m.since.toISOString() })),
    invitations: pending.map((i) => ({
      ...i,
      expiresAt: i.expiresAt.toISOString(),
      createdAt: i.createdAt.toISOString(),
    })),
  };
}

/** Records a single-use invitation and e-mails its link. Returns the link (tests and local mode). */
export async function invite(
  projectId: string,
  inviterId: string,
  input: z.infer<typeof inviteSchema>,
) {
  const [already] = await db
    .select({ id: users.id })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(and(eq(projectMembers.projectId, projectId), eq(users.email, input.email)));
  if (already) throw conflict(`${input.email} is already a member of this project.`);
  const [project] = await db
    .select({ name: projects.name })
    .from(projects)
    .where(eq(projects.id, projectId));
  const [inviter] = await db
    .select({ name: users.name, email: users.email })
    .from(users)
    .where(eq(users.id, inviterId));
  if (!project || !inviter) throw notFound('Project');
  const token = randomSecret();
  const id = newId();
  await db.insert(invitations).values({
    id,
    projectId,
    email: input.email,
    role: input.role,
    tokenHash: sha256(token),
    invitedBy: inviterId,
    expiresAt: new Date(Date.now() + INVITATION_DAYS * 86400_000),
  });
  await db.insert(auditLog).values({
    projectId,
    userId: inviterId,
    action: 'member.invite',
    subject: input.email,
    detail: { role: input.role },
  });
  const link = `${env().NEXTAUTH_URL}/invite/${token}`;
  await sendMail({
    to: input.email,
    ...invitationMail({
      link,
      projectName: project.name,
      role: input.role,
      inviter: `${inviter.name} <${inviter.email}>`,
    }),
  });
  return { invitation: { id, email: input.email, role: input.role } };
}

async function openInvitation(token: string) {
  const [inv] = await db
    .select({ i: invitations, projectName: projects.name })
    .from(invitations)
    .innerJoin(projects, eq(projects.id, invitations.projectId))
    .where(eq(invitations.tokenHash, sha256(token)));
  if (!inv || inv.i.revokedAt)
    throw new HttpError(404, 'invalid_link', 'This invitation link is not valid.');
  if (inv.i.acceptedAt)
    throw new HttpError(410, 'used_link', 'This invitation has already been accepted.');
  if (inv.i.expiresAt.getTime() < Date.now())
    throw new HttpError(410, 'expired_link', 'This invitation has expired; ask for a new one.');
  return inv;
}

/** What an invitation link offers, for the page that accepts it. */
export async function describeInvitation(token: string) {
  const inv = await openInvitation(token);
  return {
    email: inv.i.email,
    role: inv.i.role,
    projectName: inv.projectName,
    projectId: inv.i.projectId,
  };
}

/** Accepts an invitation for the signed-in user, whose address must be the invited one. */
export async function acceptInvitation(token: string, user: { id: string; email: string }) {
  const inv = await openInvitation(token);
  if (inv.i.email !== user.email) {
    throw new HttpError(
      403,
      'wrong_account',
      `This invitation is for ${inv.i.email}; sign in with that address.`,
    );
  }
  await db.transaction(async (tx) => {
    const res = await tx
      .update(invitations)
      .set({ acceptedAt: sql`NOW()`, acceptedBy: user.id })
      .where(and(eq(invitations.id, inv.i.id), isNull(invitations.acceptedAt)));
    if (res[0].affectedRows !== 1)
      throw new HttpError(410, 'used_link', 'This invitation has already been accepted.');
    await tx
      .insert(projectMembers)
      .values({ projectId: inv.i.projectId, userId: user.id, role: inv.i.role })
      .onDuplicateKeyUpdate({ set: { role: sql`role` } });
    await tx.insert(auditLog).values({
      projectId: inv.i.projectId,
      userId: user.id,
      action: 'member.join',
      subject: user.id,
      detail: { role: inv.i.role },
    });
  });
  return { projectId: inv.i.projectId };
}

export async function revokeInvitation(projectId: string, invitationId: string) {
  const res = await db
    .update(invitations)
    .set({ revokedAt: sql`NOW()` })
    .where(
      and(
        eq(invitations.projectId, projectId),
        eq(invitations.id, invitationId),
        isNull(invitations.acceptedAt),
      ),
    );
  if (res[0].affectedRows === 0) throw notFound('Invitation');
}

async function ownerCount(projectId: string) {
  const [r] = await db
    .select({ n: sql<number>`count(*)` })
    .from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.role, 'owner')));
  return Number(r?.n ?? 0);
}

async function memberRole(projectId: string, userId: string): Promise<ProjectRole> {
  const [m] = await db
    .select({ role: projectMembers.role })
    .from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)));
  if (!m) throw notFound('Member');
  return m.role;
}

/** Changes a member's role; the last owner cannot be demoted. */
export async function changeRole(
  projectId: string,
  actorId: string,
  userId: string,
  role: ProjectRole,
) {
  const current = await memberRole(projectId, userId);
  if (current === 'owner' && role !== 'owner' && (await ownerCount(projectId)) <= 1) {
    throw conflict('A project needs at least one owner: make someone else owner first.');
  }
  await db
    .update(projectMembers)
    .set({ role })
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)));
  await db.insert(auditLog).values({
    projectId,
    userId: actorId,
    action: 'member.role',
    subject: userId,
    detail: { from: current, to: role },
  });
}

/** Removes a member (or lets one leave); the last owner cannot leave. */
export async function removeMember(projectId: string, actorId: string, userId: string) {
  const current = await memberRole(projectId, userId);
  if (current === 'owner' && (await ownerCount(projectId)) <= 1) {
    throw conflict('A project needs at least one owner: make someone else owner first.');
  }
  await db
    .delete(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId)));
  await db
    .insert(auditLog)
    .values({ projectId, userId: actorId, action: 'member.remove', subject: userId });
}
