import { and, desc, eq, gt, isNull, sql } from 'drizzle-orm';
import { z } from 'zod';
import { db } from '@/db/client';
import { passwordResets, signInAttempts, users } from '@/db/schema';
import { hashPassword, verifyPassword } from '@/lib/auth/password';
import { newId, randomSecret, sha256 } from '@/lib/auth/secrets';
import { env } from '@/lib/env';
import { conflict, HttpError } from '@/lib/http/errors';
import { sendMail } from '@/lib/mail/send';
import { passwordResetMail } from '@/lib/mail/templates';

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'Enter a valid e-mail address.' }));
export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

export const signUpSchema = z.object({
  email: emailSchema,
  name: z.string().trim().min(1, 'Enter your name.').max(120),
  password: passwordSchema,
});

export type PublicUser = {
  id: string;
  email: string;
  name: string;
  siteRole: 'admin' | 'member';
  notifyRunEmails: boolean;
};

const publicColumns = {
  id: users.id,
  email: users.email,
  name: users.name,
  siteRole: users.siteRole,
  notifyRunEmails: users.notifyRunEmails,
};

export async function createUser(
  input: z.infer<typeof signUpSchema>,
  siteRole: 'admin' | 'member' = 'member',
): Promise<PublicUser> {
  const existing = await db
    .select({ id: users.id })
    .from(users)
    .where(eq(users.email, input.email));
  if (existing.length) throw conflict('An account with this e-mail address already exists.');
  const user = {
    id: newId(),
    email: input.email,
    name: input.name,
    passwordHash: await hashPassword(input.password),
    siteRole,
  };
  await db.insert(users).values(user);
  return { id: user.id, email: user.email, name: user.name, siteRole, notifyRunEmails: true };
}

export async function getUser(id: string): Promise<PublicUser | null> {
  const [u] = await db.select(publicColumns).from(users).where(eq(users.id, id));
  return u ?? null;
}

export async function getUserByEmail(email: string): Promise<PublicUser | null> {
  const [u] = await db.select(publicColumns).from(users).where(eq(users.email, email));
  return u ?? null;
}

/** Failed attempts for this address within the window; past the limit sign-in answers 429. */
export async function signInBlocked(email: string): Promise<boolean> {
  const { SIGN_IN_LIMIT, SIGN_IN_WINDOW_SECONDS } = env();
  const [row] = await db
    .select({ n: sql<number>`count(*)` })
    .from(signInAttempts)
    .where(
      and(
        eq(signInAttempts.email, email),
        eq(signInAttempts.succeeded, false),
        gt(signInAttempts.at, sql`NOW(3) - INTERVAL ${SIGN_IN_WINDOW_SECONDS} SECOND`),
      ),
    );
  return Number(row?.n ?? 0) >= SIGN_IN_LIMIT;
}

/**
 * Checks an address and password. Unknown address and wrong password give the same `null`, in
 * the same time; every attempt is recorded for the per-address rate limit.
 */
export async function verifyCredentials(
  rawEmail: string,
  password: string,
): Promise<PublicUser | null> {
  const email = rawEmail.trim().toLowerCase();
  const [u] = await db
    .select({ ...publicColumns, passwordHash: users.passwordHash })
    .from(users)
    .where(eq(users.email, email));
  const ok = await verifyPassword(password, u?.passwordHash ?? null);
  await db.insert(signInAttempts).values({ email, succeeded: ok });
  if (!ok || !u) return null;
  const { passwordHash: _, ...pub } = u;
  void _;
  return pub;
}

/** Sends a single-use reset link valid for one hour; silent for unknown addresses. */
export async function requestPasswordReset(rawEmail: string): Promise<void> {
  const email = emailSchema.parse(rawEmail);
  const user = await getUserByEmail(email);
  if (!user) return;
  const token = randomSecret();
  await db.insert(passwordResets).values({
    tokenHash: sha256(token),
    userId: user.id,
    expiresAt: new Date(Date.now() + 3600_000),
  });
  const link = `${env().NEXTAUTH_URL}/reset/${token}`;
  await sendMail({ to: email, ...passwordResetMail(link) });
}

export async function resetPassword(token: string, password: string): Promise<void> {
  const newHash = await hashPassword(passwordSchema.parse(password));
  await db.transaction(async (tx) => {
    const [reset] = await tx
      .select()
      .from(passwordResets)
      .where(
        and(
          eq(passwordResets.tokenHash, sha256(token)),
          isNull(passwordResets.usedAt),
          gt(passwordResets.expiresAt, sql`NOW()`),
        ),
      )
      .for('update');
    if (!reset) {
      throw new HttpError(
        400,
        'invalid_link',
        'This reset link is invalid, used or expired; ask for a new one.',
      );
    }
    await tx
      .update(passwordResets)
      .set({ usedAt: sql`NOW()` })
      .where(eq(passwordResets.tokenHash, reset.tokenHash));
    await tx.update(users).set({ passwordHash: newHash }).where(eq(users.id, reset.userId));
  });
}

export async function setNotifyRunEmails(userId: string, on: boolean) {
  await db.update(users).set({ notifyRunEmails: on }).where(eq(users.id, userId));
}

export async function listUsers(): Promise<(PublicUser & { createdAt: Date })[]> {
  return db
    .select({ ...publicColumns, createdAt: users.createdAt })
    .from(users)
    .orderBy(desc(users.createdAt));
}

export async function setSiteRole(userId: string, siteRole: 'admin' | 'member', actorId: string) {
  if (userId === actorId && siteRole !== 'admin') {
    throw conflict('You cannot remove your own admin role.');
  }
  const res = await db.update(users).set({ siteRole }).where(eq(users.id, userId));
  if (res[0].affectedRows === 0) throw new HttpError(404, 'not_found', 'User was not found.');
}
