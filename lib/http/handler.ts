import { NextResponse } from 'next/server';
import { ZodError } from 'zod';
import { HttpError } from './errors';

type RouteContext<P> = { params: Promise<P> };

/**
 * Wraps a route handler so that every failure becomes the JSON error shape of API.md with the
 * right status, and nothing internal (stack traces, SQL) reaches the caller.
 */
export function route<P = Record<string, never>>(
  fn: (req: Request, params: P) => Promise<Response>,
) {
  return async (req: Request, ctx: RouteContext<P>): Promise<Response> => {
    try {
      return await fn(req, await ctx.params);
    } catch (e) {
      return errorResponse(e);
    }
  };
}

export function errorResponse(e: unknown): Response {
  if (e instanceof HttpError) {
    return NextResponse.json(
      { error: { code: e.code, message: e.message, ...(e.details ? { details: e.details } : {}) } },
      { status: e.status },
    );
  }
  if (e instanceof ZodError) {
    const details = e.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    const first = details[0];
    return NextResponse.json(
      {
        error: {
          code: 'invalid_input',
          message: first ? `${first.path || 'body'}: ${first.message}` : 'Invalid input.',
          details,
        },
      },
      { status: 400 },
    );
  }
  console.error('[api] unexpected error:', e instanceof Error ? e.message : e);
  return NextResponse.json(
    { error: { code: 'internal', message: 'Something went wrong on our side; try again.' } },
    { status: 500 },
  );
}

/** Reads a JSON body; a body that is not JSON is a 400 that says so. */
export async function jsonBody(req: Request): Promise<unknown> {
  const text = await req.text();
  if (!text) return {};
  try {
    return JSON.parse(text);
  } catch {
    throw new HttpError(400, 'invalid_json', 'The request body is not valid JSON.');
  }
}

export const json = (body: unknown, status = 200) => NextResponse.json(body, { status });
