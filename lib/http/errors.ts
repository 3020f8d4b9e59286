/** An error with an HTTP status, turned into `{ error: { code, message, details? } }` JSON. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export const unauthenticated = () =>
  new HttpError(
    401,
    'unauthenticated',
    'Sign in, or send a personal API token as Authorization: Bearer.',
  );
export const forbidden = (what = 'do this') =>
  new HttpError(403, 'forbidden', `Your role in this project does not allow you to ${what}.`);
export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} was not found.`);
export const conflict = (message: string, details?: unknown) =>
  new HttpError(409, 'conflict', message, details);
/** A request's query that MariaDB stopped at the statement time limit (db/statement-timeout.ts). */
export const queryTimedOut = (what: string, seconds: number) =>
  new HttpError(
    503,
    'query_timeout',
    `This ${what} took longer than ${seconds} s and was stopped so the database stays available to others; narrow it with filters, or try again when the server is less busy.`,
    { limitSeconds: seconds },
  );
