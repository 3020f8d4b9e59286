import { z } from 'zod';
import { env } from '@/lib/env';

/**
 * The abuse limits of sign-in, sign-up and password resets, from the environment. Only failures
 * count where a success is the normal case (sign-in, sign-up, reset confirmation), so a busy lab
 * behind one address is not limited by its own everyday use.
 */
const limitsSchema = z.object({
  /** Failed sign-ins from one client address, over all e-mail addresses, per sign-in window. */
  SIGN_IN_CLIENT_LIMIT: z.coerce.number().int().positive().default(50),
  /**
   * Failed sign-ins on one e-mail address from all clients, per sign-in window; clients that
   * signed in to it within 30 days are exempt, so this cannot lock its owner out.
   */
  SIGN_IN_ADDRESS_LIMIT: z.coerce.number().int().positive().default(100),
  /** The wait after the limit is reached; it doubles with each further failure up to the window. */
  SIGN_IN_BACKOFF_SECONDS: z.coerce.number().int().positive().default(60),
  /** Reset mails asked for one e-mail address (known or not), per hour. */
  RESET_ADDRESS_LIMIT: z.coerce.number().int().positive().default(3),
  /** Reset requests from one client address, per hour. */
  RESET_CLIENT_LIMIT: z.coerce.number().int().positive().default(20),
  /** Failed reset confirmations (bad link or password) per client address and per account, per hour. */
  RESET_CONFIRM_LIMIT: z.coerce.number().int().positive().default(10),
  /** Failed sign-ups (address taken, invalid input) per client address and per e-mail address, per hour. */
  SIGN_UP_LIMIT: z.coerce.number().int().positive().default(10),
});

export type Limits = z.infer<typeof limitsSchema> & {
  SIGN_IN_LIMIT: number;
  SIGN_IN_WINDOW_SECONDS: number;
};

let cached: Limits | null = null;

export function limits(): Limits {
  if (!cached) {
    const { SIGN_IN_LIMIT, SIGN_IN_WINDOW_SECONDS } = env();
    cached = { ...limitsSchema.parse(process.env), SIGN_IN_LIMIT, SIGN_IN_WINDOW_SECONDS };
  }
  return cached;
}

/** The window of the reset and sign-up limits. */
export const HOUR_SECONDS = 3600;

/**
 * Seconds an (address, client) pair must still wait before its next sign-in attempt, given its
 * recent failures: none below `freeFailures`; then `baseSeconds` after the last failure,
 * doubling with each failure past the free ones, never more than `maxSeconds`.
 */
export function signInWaitSeconds(
  failures: number,
  secondsSinceLastFailure: number,
  opts: { freeFailures: number; baseSeconds: number; maxSeconds: number },
): number {
  if (failures < opts.freeFailures) return 0;
  const extra = failures - opts.freeFailures;
  const wait = Math.min(opts.baseSeconds * 2 ** Math.min(extra, 30), opts.maxSeconds);
  return Math.max(0, Math.ceil(wait - secondsSinceLastFailure));
}
