import { and, count, eq, gt, lt, max, sql } from 'drizzle-orm';
import { db } from '@/db/client';
import { rateEvents, signInAttempts } from '@/db/schema';
import { limits, signInWaitSeconds } from '@/lib/auth/limits';
import { HttpError } from '@/lib/http/errors';

/**
 * Rate limits kept in MariaDB, so any number of web processes share them. Sign-in has its own
 * record (`sign_in_attempts`); sign-up and the reset endpoints count rows of `rate_events`.
 */

export type RateAction = 'reset_request' | 'reset_confirm_failed' | 'sign_up_failed';

export class RateLimited extends HttpError {
  constructor(
    message: string,
    readonly retryAfterSeconds: number,
  ) {
    super(429, 'rate_limited', message, { retryAfterSeconds });
  }
}

/** A check: at most `max` events of `action` for `subject` within `windowSeconds`. */
export type RateCheck = { subject: string; max: number; windowSeconds: number; message: string };

const since = (seconds: number) => sql`NOW(3) - INTERVAL ${seconds} SECOND`;

/** Throws RateLimited for the first check whose subject is at its limit. */
export async function enforceLimits(action: RateAction, checks: RateCheck[]): Promise<void> {
  for (const c of checks) {
    const [row] = await db
      .select({ n: count() })
      .from(rateEvents)
      .where(
        and(
          eq(rateEvents.action, action),
          eq(rateEvents.subject, c.subject),
          gt(rateEvents.at, since(c.windowSeconds)),
        ),
      );
    if ((row?.n ?? 0) >= c.max) throw new RateLimited(c.message, c.windowSeconds);
  }
}

/** Records one event for each subject, and forgets that subject's events older than a day. */
export async function recordEvent(action: RateAction, subjects: string[]): Promise<void> {
  for (const subject of subjects) {
    await db
      .delete(rateEvents)
      .where(
        and(
          eq(rateEvents.action, action),
          eq(rateEvents.subject, subject),
          lt(rateEvents.at, since(86_400)),
        ),
      );
    await db.insert(rateEvents).values({ action, subject });
  }
}

/** Subjects of rate events: kept apart by kind, so an address never collides with a client. */
export const bySubject = {
  email: (email: string) => `email:${email}`,
  client: (client: string) => `client:${client}`,
  user: (userId: string) => `user:${userId}`,
};

// A client that signed in to an address within this time is not held back by other clients'
// failures on that address.
const KNOWN_CLIENT_DAYS = 30;

/**
 * Why a sign-in of `email` from `client` must wait, or null. Three limits, each on failures only:
 * the (address, client) pair with back-off, the client over all addresses, and the address over
 * all clients — the last only for clients that have not signed in to it recently, so guesses from
 * elsewhere cannot lock its owner out.
 */
export async function signInRefusal(
  email: string,
  client: string,
): Promise<{ message: string; retryAfterSeconds: number } | null> {
  const L = limits();
  const window = since(L.SIGN_IN_WINDOW_SECONDS);
  const failed = and(eq(signInAttempts.succeeded, false), gt(signInAttempts.at, window));
  const [pair] = await db
    .select({
      n: count(),
      ageSeconds: sql<number | null>`TIMESTAMPDIFF(SECOND, ${max(signInAttempts.at)}, NOW(3))`,
    })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.email, email), eq(signInAttempts.client, client), failed));
  const wait = signInWaitSeconds(Number(pair?.n ?? 0), Number(pair?.ageSeconds ?? 0), {
    freeFailures: L.SIGN_IN_LIMIT,
    baseSeconds: L.SIGN_IN_BACKOFF_SECONDS,
    maxSeconds: L.SIGN_IN_WINDOW_SECONDS,
  });
  if (wait > 0) {
    return {
      message: `Too many failed sign-ins for this address from your network; wait ${wait} s and try again, or reset your password.`,
      retryAfterSeconds: wait,
    };
  }
  const [fromClient] = await db
    .select({ n: count() })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.client, client), failed));
  if ((fromClient?.n ?? 0) >= L.SIGN_IN_CLIENT_LIMIT) {
    return {
      message: 'Too many failed sign-ins from your network; wait a few minutes and try again.',
      retryAfterSeconds: L.SIGN_IN_WINDOW_SECONDS,
    };
  }
  const [forAddress] = await db
    .select({ n: count() })
    .from(signInAttempts)
    .where(and(eq(signInAttempts.email, email), failed));
  if ((forAddress?.n ?? 0) >= L.SIGN_IN_ADDRESS_LIMIT) {
    const [known] = await db
      .select({ n: count() })
      .from(signInAttempts)
      .where(
        and(
          eq(signInAttempts.email, email),
          eq(signInAttempts.client, client),
          eq(signInAttempts.succeeded, true),
          gt(signInAttempts.at, since(KNOWN_CLIENT_DAYS * 86_400)),
        ),
      );
    if ((known?.n ?? 0) === 0) {
      return {
        message:
          'Too many failed sign-ins for this address; wait a few minutes, or reset your password.',
        retryAfterSeconds: L.SIGN_IN_WINDOW_SECONDS,
      };
    }
  }
  return null;
}

export async function recordSignIn(email: string, client: string, succeeded: boolean) {
  await db.insert(signInAttempts).values({ email, client, succeeded });
}

/** After a successful reset the address starts afresh: its failed sign-ins are forgotten. */
export async function clearSignInFailures(email: string) {
  await db
    .delete(signInAttempts)
    .where(and(eq(signInAttempts.email, email), eq(signInAttempts.succeeded, false)));
}
