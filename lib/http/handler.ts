import { NextResponse } from 'next/server';
import { ZodError } from 'zod';
import { env } from '@/lib/env';
import { HttpError } from './errors';
import { assertSameOriginWrite, configuredOrigin } from './same-origin';

type RouteContext<P> = { params: Promise<P> };

/**
 * Wraps a route handler so that every failure becomes the JSON error shape of API.md with the
 * right status, and nothing internal (stack traces, SQL) reaches the caller. Writes that ride on
 * the session cookie must come from our own pages (lib/http/same-origin.ts) before any lookup.
 */
export function route<P = Record<string, never>>(
  fn: (req: Request, params: P) => Promise<Response>,
) {
  return async (req: Request, ctx: RouteContext<P>): Promise<Response> => {
    try {
      assertSameOriginWrite(req.method, req.headers, configuredOrigin(env().NEXTAUTH_URL));
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

/** The largest JSON body a route reads unless it says otherwise. */
export const JSON_BODY_LIMIT_BYTES = 1024 * 1024;
/** MariaDB refuses JSON nested deeper than 32 levels; bodies stay below that. */
export const JSON_DEPTH_LIMIT = 32;

/**
 * Reads a JSON body; a body that is not JSON is a 400 that says so. A body over `maxBytes` is a
 * 413 (read no further than the limit), one nested deeper than `maxDepth` a 400 naming where.
 */
export async function jsonBody(
  req: Request,
  { maxBytes = JSON_BODY_LIMIT_BYTES, maxDepth = JSON_DEPTH_LIMIT } = {},
): Promise<unknown> {
  const text = await readTextUpTo(req, maxBytes);
  if (!text) return {};
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new HttpError(400, 'invalid_json', 'The request body is not valid JSON.');
  }
  const deep = pathBeyondDepth(value, maxDepth);
  if (deep !== null) {
    throw new HttpError(
      400,
      'too_deep',
      `The request body nests deeper than ${maxDepth} levels (at ${deep}).`,
    );
  }
  return value;
}

async function readTextUpTo(req: Request, maxBytes: number): Promise<string> {
  const tooLarge = () =>
    new HttpError(
      413,
      'body_too_large',
      `The request body is larger than ${formatBytes(maxBytes)}; send less at once.`,
      { limitBytes: maxBytes },
    );
  const declared = Number(req.headers.get('content-length'));
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge();
  if (!req.body) return '';
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  return Buffer.concat(chunks).toString('utf8');
}

const formatBytes = (n: number) =>
  n % (1024 * 1024) === 0 ? `${n / (1024 * 1024)} MB` : `${Math.round(n / 1024)} KB`;

/**
 * The path (`settings.a.a…`) of the first value nested deeper than `maxDepth`, or null. Walks
 * with its own stack, so a body of a million brackets cannot overflow the call stack.
 */
export function pathBeyondDepth(value: unknown, maxDepth: number): string | null {
  const stack: { v: unknown; path: string[] }[] = [{ v: value, path: [] }];
  while (stack.length) {
    const { v, path } = stack.pop()!;
    if (v === null || typeof v !== 'object') continue;
    if (path.length >= maxDepth) {
      const shown = path.slice(0, 6).join('.');
      return (shown || 'body') + (path.length > 6 ? '…' : '');
    }
    for (const [k, child] of Object.entries(v)) stack.push({ v: child, path: [...path, k] });
  }
  return null;
}

export const json = (body: unknown, status = 200) => NextResponse.json(body, { status });
