import { describe, expect, it } from 'vitest';
import { jsonBody, pathBeyondDepth } from '@/lib/http/handler';
import { HttpError } from '@/lib/http/errors';

const post = (body: BodyInit, headers: Record<string, string> = {}) =>
  new Request('http://127.0.0.1/api/x', { method: 'POST', body, headers });

async function failure(p: Promise<unknown>) {
  try {
    await p;
  } catch (e) {
    if (e instanceof HttpError) return { status: e.status, code: e.code, message: e.message };
    throw e;
  }
  return null;
}

/** `{"a":{"a":…}}` nested `n` objects deep, built as text. */
const nested = (n: number) => '{"a":'.repeat(n - 1) + '{}' + '}'.repeat(n - 1);

describe('jsonBody', () => {
  it('reads JSON, and an empty body as {}', async () => {
    expect(await jsonBody(post('{"x":[1,2]}'))).toEqual({ x: [1, 2] });
    expect(await jsonBody(post(''))).toEqual({});
    expect((await failure(jsonBody(post('{x'))))?.code).toBe('invalid_json');
  });

  it('refuses a body over the limit with 413, by its Content-Length or by what arrives', async () => {
    const big = JSON.stringify({ s: 'x'.repeat(2 * 1024 * 1024) });
    expect(await failure(jsonBody(post(big)))).toMatchObject({ status: 413 });
    // No Content-Length: a stream is counted as it is read.
    const chunks = [new TextEncoder().encode('{"s":"'), new Uint8Array(600).fill(120)];
    const stream = new ReadableStream({
      start(c) {
        for (const ch of chunks) c.enqueue(ch);
        c.close();
      },
    });
    const req = new Request('http://127.0.0.1/api/x', {
      method: 'POST',
      body: stream,
      // @ts-expect-error Node's fetch needs duplex for a stream body
      duplex: 'half',
    });
    expect(await failure(jsonBody(req, { maxBytes: 512 }))).toMatchObject({
      status: 413,
      code: 'body_too_large',
    });
    // The per-route override also raises the limit.
    expect(await jsonBody(post(big), { maxBytes: 3 * 1024 * 1024 })).toHaveProperty('s');
  });

  it('refuses nesting deeper than the limit with a 400 naming the place', async () => {
    expect(await jsonBody(post(nested(32)))).toBeTypeOf('object'); // 32 levels: allowed
    const f = await failure(jsonBody(post(nested(33))));
    expect(f).toMatchObject({ status: 400, code: 'too_deep' });
    expect(f?.message).toContain('a.a.a.a.a.a…');
    // 1 000 levels in a settings object, as a probe sent.
    const settings = `{"settings":${nested(1000)}}`;
    expect((await failure(jsonBody(post(settings))))?.message).toMatch(/at settings\.a\.a/);
  });

  it('walks a very deep value without overflowing the stack', () => {
    // 200 000 nested arrays: a recursive walk would overflow; JSON.parse itself copes.
    const deep = JSON.parse('['.repeat(200_000) + ']'.repeat(200_000));
    expect(pathBeyondDepth(deep, 32)).toBe('0.0.0.0.0.0…');
    expect(pathBeyondDepth({ a: [1, { b: 2 }] }, 3)).toBeNull(); // depth 3: exact count
    expect(pathBeyondDepth({ a: [1, { b: {} }] }, 3)).toBe('a.1.b');
  });
});
