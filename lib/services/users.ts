import { and, desc, eq, gt, isNull, sql } from 'drizzle-orm';
import { ZodError, type z } from 'zod';
import { db } from '@/db/client';
import { apiTokens, passwordResets, users } from '@/db/schema';
import { HOUR_SECONDS, limits } from '@/lib/auth/limits';
import { hashPassword, needsRehash, verifyPassword } from '@/lib/auth/password';
import { newId, randomSecret, sha256 } from '@/lib/auth/secrets';
import { env } from '@/lib/env';
import { conflict, HttpError } from '@/lib/http/errors';
import { sendMail } from '@/lib/mail/send';
import { passwordResetMail } from '@/lib/mail/templates';
import {
  emailSchema,
  passwordSchema,
  resetConfirmSchema,
  resetRequestSchema,
  signUpSchema,
} from '@/lib/schemas/account';
import {
  bySubject,
  clearSignInFailures,
  enforceLimits,
  recordEvent,
  recordSignIn,
} from './rate-limits';

export { emailSchema };

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

/**
 * Sign-up from a client: failed sign-ups (address taken, invalid input) are limited per client
 * and per e-mail address, so the form cannot be used to test many addresses for accounts.
 */
export async function signUp(raw: unknown, client: string): Promise<PublicUser> {
  const rawEmail = (raw as { email?: unknown } | null)?.email;
  const email = emailSchema.safeParse(rawEmail).data;
  const subjects = [bySubject.client(client), ...(email ? [bySubject.email(email)] : [])];
  const L = limits();
  await enforceLimits(
    'sign_up_failed',
    subjects.map((subject) => ({
      subject,
      max: L.SIGN_UP_LIMIT,
      windowSeconds: HOUR_SECONDS,
      message: 'Too many failed sign-ups; wait an hour and try again.',
    })),
  );
  try {
    return await createUser(signUpSchema.parse(raw));
  } catch (e) {
    if (e instanceof HttpError || e instanceof ZodError)
      await recordEvent('sign_up_failed', subjects);
    throw e;
  }
}

export async function getUser(id: string): Promise<PublicUser | null> {
  const [u] = await db.select(publicColumns).from(users).where(eq(users.id, id));
  return u ?? null;
}

/** The user of a session, or null when the session's version is no longer the user's. */
export async function getSessionUser(
  id: string,
  sessionVersion: number,
): Promise<PublicUser | null> {
  const [u] = await db
    .select({ ...publicColumns, sessionVersion: users.sessionVersion })
    .from(users)
    .where(eq(users.id, id));
  if (!u || u.sessionVersion !== sessionVersion) return null;
  const { sessionVersion: _, ...pub } = u;
  void _;
  return pub;
}

export async function getUserByEmail(email: string): Promise<PublicUser | null> {
  const [u] = await db.select(publicColumns).from(users).where(eq(users.email, email));
  return u ?? null;
}

/**
 * Checks an address and password. Unknown address and wrong password give the same `null`, in
 * the same time; every attempt is recorded, with its client, for the sign-in limits. A hash of
 * the old kind is replaced by the current one once the password is known to match.
 */
export async function verifyCredentials(
  rawEmail: string,
  password: string,
  client: string,
): Promise<(PublicUser & { sessionVersion: number }) | null> {
  const email = rawEmail.trim().toLowerCase();
  const [u] = await db
    .select({
      ...publicColumns,
      passwordHash: users.passwordHash,
      sessionVersion: users.sessionVersion,
    })
    .from(users)
    .where(eq(users.email, email));
  const ok = await verifyPassword(password, u?.passwordHash ?? null);
  await recordSignIn(email, client, ok);
  if (!ok || !u) return null;
  const { passwordHash, ...pub } = u;
  if (needsRehash(passwordHash)) {
    await db
      .update(users)
      .set({ passwordHash: await hashPassword(password) })
      .where(eq(users.id, u.id));
  }
  return pub;
}

/** Ends every session of the user (sign-out, "sign out everywhere"); API tokens stay. */
export async function endAllSessions(userId: string): Promise<void> {
  await db
    .update(users)
    .set({ sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId));
}

/**
 * The part of a reset request that runs before the answer: the same checks and the same writes
 * for every address, known or not, so neither the answer nor its timing tells them apart.
 * Limited per address and per client. Returns the normalised address for `sendPasswordReset`.
 */
export async function acceptPasswordResetRequest(raw: unknown, client: string): Promise<string> {
  const { email } = resetRequestSchema.parse(raw);
  const L = limits();
  const message = 'Too many reset requests; wait an hour and try again.';
  await enforceLimits('reset_request', [
    {
      subject: bySubject.email(email),
      max: L.RESET_ADDRESS_LIMIT,
      windowSeconds: HOUR_SECONDS,
      message,
    },
    {
      subject: bySubject.client(client),
      max: L.RESET_CLIENT_LIMIT,
      windowSeconds: HOUR_SECONDS,
      message,
    },
  ]);
  await recordEvent('reset_request', [bySubject.email(email), bySubject.client(client)]);
  return email;
}

/** Mails a single-use reset link valid for one hour; does nothing for an unknown address. */
export async function sendPasswordReset(email: string): Promise<void> {
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

const invalidLink = () =>
  new HttpError(
    400,
    'invalid_link',
    'This reset link is invalid, used or expired; ask for a new one.',
  );

/**
 * Sets a new password from a reset link. Besides the password it ends every session, revokes
 * every API token, uses up every other reset link of the user, and forgets the address's failed
 * sign-ins. Failures (bad link, rejected password) are limited per client and per account.
 */
export async function resetPassword(raw: unknown, client: string): Promise<void> {
  const L = limits();
  const check = (subject: string) => ({
    subject,
    max: L.RESET_CONFIRM_LIMIT,
    windowSeconds: HOUR_SECONDS,
    message: 'Too many failed attempts to use a reset link; wait an hour and try again.',
  });
  await enforceLimits('reset_confirm_failed', [check(bySubject.client(client))]);
  const { token, password } = resetConfirmSchema.parse(raw);
  const [reset] = await db
    .select({ userId: passwordResets.userId, email: users.email })
    .from(passwordResets)
    .innerJoin(users, eq(users.id, passwordResets.userId))
    .where(
      and(
        eq(passwordResets.tokenHash, sha256(token)),
        isNull(passwordResets.usedAt),
        gt(passwordResets.expiresAt, sql`NOW()`),
      ),
    );
  if (!reset) {
    await recordEvent('reset_confirm_failed', [bySubject.client(client)]);
    throw invalidLink();
  }
  const account = bySubject.user(reset.userId);
  await enforceLimits('reset_confirm_failed', [check(account)]);
  const parsed = passwordSchema.safeParse(password);
  if (!parsed.success) {
    await recordEvent('reset_confirm_failed', [bySubject.client(client), account]);
    throw new HttpError(400, 'invalid_input', `password: ${parsed.error.issues[0]?.message}`);
  }
  const newHash = await hashPassword(parsed.data);
  await db.transaction(async (tx) => {
    // Locked and re-checked, so two uses of one link race to a single winner.
    const [open] = await tx
      .select({ userId: passwordResets.userId })
      .from(passwordResets)
      .where(and(eq(passwordResets.tokenHash, sha256(token)), isNull(passwordResets.usedAt)))
      .for('update');
    if (!open) throw invalidLink();
    await tx
      .update(passwordResets)
      .set({ usedAt: sql`NOW()` })
      .where(and(eq(passwordResets.userId, reset.userId), isNull(passwordResets.usedAt)));
    await tx
      .update(users)
      .set({ passwordHash: newHash, sessionVersion: sql`${users.sessionVersion} + 1` })
      .where(eq(users.id, reset.userId));
    await tx
      .update(apiTokens)
      .set({ revokedAt: sql`NOW()` })
      .where(and(eq(apiTokens.userId, reset.userId), isNull(apiTokens.revokedAt)));
  });
  await clearSignInFailures(reset.email);
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
