import fs from 'node:fs';
import path from 'node:path';

/** Base URL of the app that `npm test` started (its own port and database). */
export const BASE_URL = process.env.LANEWISE_BASE_URL ?? 'http://127.0.0.1:3100';

/**
 * A tiny HTTP client with a cookie jar, standing in for a browser or a script. Requests carry
 * the Origin of the app, as a browser on our pages would; set `origin` to null to send none
 * (a script, or a browser that omits it).
 */
export class Client {
  private cookies = new Map<string, string>();
  bearer?: string;
  origin: string | null = BASE_URL;

  async request(method: string, url: string, body?: unknown, headers: Record<string, string> = {}) {
    const h: Record<string, string> = {
      ...(this.origin ? { origin: this.origin } : {}),
      ...headers,
    };
    if (this.cookies.size) h.cookie = [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    if (this.bearer) h.authorization = `Bearer ${this.bearer}`;
    let payload: BodyInit | undefined;
    if (body instanceof URLSearchParams || body instanceof FormData) payload = body;
    else if (body !== undefined) {
      h['content-type'] = 'application/json';
      payload = JSON.stringify(body);
    }
    const res = await fetch(BASE_URL + url, {
      method,
      headers: h,
      body: payload,
      redirect: 'manual',
    });
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';');
      const i = pair.indexOf('=');
      const name = pair.slice(0, i);
      const value = pair.slice(i + 1);
      if (value === '' || /max-age=0/i.test(c)) this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
    return res;
  }

  get = (url: string) => this.request('GET', url);
  post = (url: string, body?: unknown) => this.request('POST', url, body);
  patch = (url: string, body?: unknown) => this.request('PATCH', url, body);
  delete = (url: string) => this.request('DELETE', url);

  async json<T = Record<string, unknown>>(
    method: string,
    url: string,
    body?: unknown,
  ): Promise<{ status: number; body: T }> {
    const res = await this.request(method, url, body);
    const text = await res.text();
    return { status: res.status, body: (text ? JSON.parse(text) : null) as T };
  }

  /** next-auth credentials sign-in; returns the HTTP status of the callback. */
  async signIn(email: string, password: string): Promise<number> {
    const { csrfToken } = (await (await this.get('/api/auth/csrf')).json()) as {
      csrfToken: string;
    };
    const res = await this.post(
      '/api/auth/callback/credentials',
      new URLSearchParams({ csrfToken, email, password, json: 'true' }),
    );
    return res.status;
  }

  async signOut() {
    const { csrfToken } = (await (await this.get('/api/auth/csrf')).json()) as {
      csrfToken: string;
    };
    await this.post('/api/auth/signout', new URLSearchParams({ csrfToken, json: 'true' }));
  }

  get signedIn() {
    return [...this.cookies.keys()].some((k) => k.endsWith('lanewise.session'));
  }
}

let counter = 0;
/** A unique address per call, so tests never collide. */
export const uniqueEmail = (tag: string) =>
  `${tag}-${Date.now().toString(36)}-${(counter++).toString(36)}@lab.example`;

export const PASSWORD = 'correct-horse-battery';

/** Signs up and signs in a new user; returns the client and the address. */
export async function newUser(tag: string, name = 'Test Researcher') {
  const c = new Client();
  const email = uniqueEmail(tag);
  const res = await c.json('POST', '/api/account/signup', { email, name, password: PASSWORD });
  if (res.status !== 201) throw new Error(`sign-up failed: ${JSON.stringify(res.body)}`);
  await c.signIn(email, PASSWORD);
  if (!c.signedIn) throw new Error('sign-in did not set a session cookie');
  const me = await c.json<{ user: { id: string } }>('GET', '/api/account');
  return { client: c, email, id: me.body.user.id };
}

type CaughtMail = { to: string[]; subject: string; text: string; receivedAt: string };

/** Waits for the local mail catcher to hold a message to `to` matching `subject`. */
export async function waitForMail(
  to: string,
  subject: RegExp,
  timeoutMs = 10_000,
  contains = '',
): Promise<CaughtMail> {
  const dir = process.env.MAIL_CATCHER_DIR ?? '.data/test/mail';
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (fs.existsSync(dir)) {
      for (const f of fs.readdirSync(dir).filter((n) => n.endsWith('.json'))) {
        const m = JSON.parse(fs.readFileSync(path.join(dir, f), 'utf8')) as CaughtMail;
        if (m.to.includes(to) && subject.test(m.subject) && m.text.includes(contains)) return m;
      }
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`);
}

/** How many caught messages went to `to` so far. */
export function countMail(to: string): number {
  const dir = process.env.MAIL_CATCHER_DIR ?? '.data/test/mail';
  if (!fs.existsSync(dir)) return 0;
  return fs
    .readdirSync(dir)
    .filter((n) => n.endsWith('.json'))
    .filter((f) =>
      (JSON.parse(fs.readFileSync(path.join(dir, f), 'utf8')) as CaughtMail).to.includes(to),
    ).length;
}

export const linkIn = (text: string) => {
  const m = text.match(/https?:\/\/\S+/);
  if (!m) throw new Error(`no link in: ${text}`);
  return m[0];
};
