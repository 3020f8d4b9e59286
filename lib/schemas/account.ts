/**
 * Request schemas of the account endpoints (sign-up, password reset, settings), shared by the
 * route handlers, the services and the browser's forms.
 */
import { z } from 'zod';
import { plainText } from './text';

export const emailSchema = z
  .string()
  .trim()
  .toLowerCase()
  .pipe(z.email({ message: 'Enter a valid e-mail address.' }));

/** Any length up to 200 counts in full: passwords are pre-hashed before bcrypt (lib/auth/password.ts). */
export const passwordSchema = z
  .string()
  .min(10, 'Use at least 10 characters.')
  .max(200, 'Use at most 200 characters.');

export const signUpSchema = z.object({
  email: emailSchema,
  name: plainText({ max: 120 }).min(1, 'Enter your name.'),
  password: passwordSchema,
});

export const resetRequestSchema = z.object({ email: emailSchema });

export const resetConfirmSchema = z.object({
  token: z.string().min(1).max(200),
  password: z.string().max(1000),
});

export const accountPatchSchema = z.object({ notifyRunEmails: z.boolean() }).strict();

/** What a completed reset does besides setting the password; the page and the mail say the same. */
export const RESET_CONSEQUENCES =
  'Setting a new password signs you out everywhere (every session on every device ends) and revokes all your personal API tokens; other reset links you were sent stop working.';
