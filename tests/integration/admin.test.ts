import mysql from 'mysql2/promise';
import { beforeAll, describe, expect, it } from 'vitest';
import { Client, newUser } from '../helpers/client';

/** Site administration: listing accounts, site roles, and the caught mail of local mode. */
describe('admin endpoints', () => {
  let admin: Client;
  let adminId: string;
  let member: { client: Client; id: string; email: string };

  beforeAll(async () => {
    const a = await newUser('site-admin');
    // The first admin is made outside the app (the seed does it for the demo): here by SQL.
    const conn = await mysql.createConnection(process.env.DATABASE_URL!);
    await conn.query("UPDATE users SET site_role = 'admin' WHERE id = ?", [a.id]);
    await conn.end();
    admin = a.client;
    adminId = a.id;
    member = await newUser('site-member');
  });

  it('refuse members (403) and anonymous callers (401)', async () => {
    expect((await member.client.get('/api/admin/users')).status).toBe(403);
    expect((await member.client.get('/api/admin/mail')).status).toBe(403);
    expect(
      (await member.client.patch(`/api/admin/users/${adminId}`, { siteRole: 'member' })).status,
    ).toBe(403);
    expect((await new Client().get('/api/admin/users')).status).toBe(401);
  });

  it('let an admin list accounts and change site roles, but not drop their own admin role', async () => {
    const list = await admin.json<{ users: { id: string; email: string; siteRole: string }[] }>(
      'GET',
      '/api/admin/users',
    );
    expect(list.status).toBe(200);
    expect(list.body.users.find((u) => u.id === member.id)?.email).toBe(member.email);
    const promoted = await admin.json<{ user: { siteRole: string } }>(
      'PATCH',
      `/api/admin/users/${member.id}`,
      { siteRole: 'admin' },
    );
    expect(promoted.body.user.siteRole).toBe('admin');
    expect((await member.client.get('/api/admin/users')).status).toBe(200);
    expect((await admin.patch(`/api/admin/users/${adminId}`, { siteRole: 'member' })).status).toBe(
      409,
    );
    expect(
      (await admin.patch(`/api/admin/users/${member.id}`, { siteRole: 'member' })).status,
    ).toBe(200);
  });

  it('show the caught mail to an admin, in the API and on the Sent mail page', async () => {
    await new Client().post('/api/account/password-reset', { email: member.email });
    let subjects: string[] = [];
    for (let i = 0; i < 50 && !subjects.length; i++) {
      const r = await admin.json<{ messages: { to: string[]; subject: string }[] }>(
        'GET',
        '/api/admin/mail',
      );
      subjects = r.body.messages.filter((m) => m.to.includes(member.email)).map((m) => m.subject);
      if (!subjects.length) await new Promise((res) => setTimeout(res, 100));
    }
    expect(subjects).toContain('Reset your Lanewise password');
    const page = await admin.get('/admin/mail');
    expect(page.status).toBe(200);
    expect(await page.text()).toContain(member.email);
  });
});
