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
