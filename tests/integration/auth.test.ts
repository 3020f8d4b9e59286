import { describe, expect, it } from 'vitest';
import { Client, PASSWORD, linkIn, newUser, uniqueEmail, waitForMail } from '../helpers/client';

describe('sign-up, sign-in, sign-out', () => {
  it('signs up, signs in, reads the account, signs out', async () => {
    const { client, email } = await newUser('signup');
    const me = await client.json<{ user: { email: string } }>('GET', '/api/account');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(email);
    await client.signOut();
    expect(client.signedIn).toBe(false);
    expect((await client.get('/api/account')).status).toBe(401);
  });

  it('refuses a second account with the same address', async () => {
    const { email } = await newUser('dup');
    const again = await new Client().json<{ error: { code: string } }>(
      'POST',
      '/api/account/signup',
      { email, name: 'X', password: PASSWORD },
    );
    expect(again.status).toBe(409);
  });

  it('rejects a short password with a message naming the field', async () => {
    const r = await new Client().json<{ error: { message: string } }>(
      'POST',
      '/api/account/signup',
      { email: uniqueEmail('short'), name: 'X', password: 'short' },
    );
    expect(r.status).toBe(400);
    expect(r.body.error.message).toMatch(/password/);
  });

  it('gives the same answer for a wrong password and an unknown address', async () => {
    const { email } = await newUser('same');
    const a = new Client();
    const b = new Client();
    const sa = await a.signIn(email, 'wrong-password-here');
    const sb = await b.signIn(uniqueEmail('nobody'), 'wrong-password-here');
    expect(sa).toBe(sb);
    expect(a.signedIn).toBe(false);
    expect(b.signedIn).toBe(false);
  });

  it('rate-limits failed sign-ins of an address from one client with 429', async () => {
    const { email } = await newUser('limit');
    const c = new Client();
    for (let i = 0; i < 10; i++) expect(await c.signIn(email, `wrong-${i}-password`)).not.toBe(429);
    expect(await c.signIn(email, PASSWORD)).toBe(429);
    expect(c.signedIn).toBe(false);
    // Another address is not affected.
    const other = await newUser('limit-other');
    expect(other.client.signedIn).toBe(true);
  });
});

describe('password reset by e-mail', () => {
  it('mails a single-use link that sets a new password', async () => {
    const { email } = await newUser('reset');
    const anon = new Client();
    expect((await anon.post('/api/account/password-reset', { email })).status).toBe(202);
    const mail = await waitForMail(email, /Reset your Lanewise password/);
    const link = linkIn(mail.text);
    const token = new URL(link).pathname.split('/').pop()!;
    expect((await anon.get(new URL(link).pathname)).status).toBe(200);
    const newPassword = 'a-brand-new-password';
    expect(
      (await anon.post('/api/account/password-reset/confirm', { token, password: newPassword }))
        .status,
    ).toBe(200);
    // Used once only.
    expect(
      (
        await anon.post('/api/account/password-reset/confirm', {
          token,
          password: 'another-password-1',
        })
      ).status,
    ).toBe(400);
    const old = new Client();
    await old.signIn(email, PASSWORD);
    expect(old.signedIn).toBe(false);
    const fresh = new Client();
    await fresh.signIn(email, newPassword);
    expect(fresh.signedIn).toBe(true);
  });

  it('answers 202 for an unknown address without sending mail', async () => {
    expect(
      (await new Client().post('/api/account/password-reset', { email: uniqueEmail('ghost') }))
        .status,
    ).toBe(202);
  });
});

describe('personal API tokens', () => {
  it('work as Bearer, are listed without the secret, and give 401 once revoked', async () => {
    const { client, email } = await newUser('token');
    const created = await client.json<{ token: string; id: string }>('POST', '/api/tokens', {
      name: 'notebook',
    });
    expect(created.status).toBe(201);
    const script = new Client();
    script.bearer = created.body.token;
    const me = await script.json<{ user: { email: string } }>('GET', '/api/account');
    expect(me.status).toBe(200);
    expect(me.body.user.email).toBe(email);
    const list = await client.json<{ tokens: Record<string, unknown>[] }>('GET', '/api/tokens');
    expect(JSON.stringify(list.body)).not.toContain(created.body.token);
    expect((await client.delete(`/api/tokens/${created.body.id}`)).status).toBe(204);
    expect((await script.get('/api/account')).status).toBe(401);
  });

  it('an unknown token gets 401', async () => {
    const c = new Client();
    c.bearer = 'lw_not-a-real-token';
    expect((await c.get('/api/projects')).status).toBe(401);
  });
});

describe('cross-site requests', () => {
  it('refuses a cookie-authenticated change from another origin', async () => {
    const { client } = await newUser('csrf');
    const res = await client.request(
      'POST',
      '/api/projects',
      { name: 'Forged' },
      { origin: 'http://evil.example' },
    );
    expect(res.status).toBe(403);
  });
});
