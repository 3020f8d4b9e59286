import { describe, expect, it } from 'vitest';
import { Client, PASSWORD, linkIn, newUser, uniqueEmail, waitForMail } from '../helpers/client';

describe('invitations', () => {
  it('delivers the e-mail; the invitee signs up with that address and accepts once', async () => {
    const owner = await newUser('inv-owner');
    const { body } = await owner.client.json<{ project: { id: string; name: string } }>(
      'POST',
      '/api/projects',
      { name: 'Invitation project' },
    );
    const guestEmail = uniqueEmail('inv-guest');
    expect(
      (
        await owner.client.post(`/api/projects/${body.project.id}/members`, {
          email: guestEmail,
          role: 'editor',
        })
      ).status,
    ).toBe(201);
    const mail = await waitForMail(guestEmail, /invited to "Invitation project"/);
    const token = new URL(linkIn(mail.text)).pathname.split('/').pop()!;

    const guest = new Client();
    const info = await guest.json<{ invitation: { email: string; role: string } }>(
      'GET',
      `/api/invitations/${token}`,
    );
    expect(info.body.invitation).toMatchObject({ email: guestEmail, role: 'editor' });
    expect((await guest.post(`/api/invitations/${token}`)).status).toBe(401);

    await guest.json('POST', '/api/account/signup', {
      email: guestEmail,
      name: 'Guest',
      password: PASSWORD,
    });
    await guest.signIn(guestEmail, PASSWORD);
    expect((await guest.post(`/api/invitations/${token}`)).status).toBe(200);
    const project = await guest.json<{ project: { role: string } }>(
      'GET',
      `/api/projects/${body.project.id}`,
    );
    expect(project.body.project.role).toBe('editor');
    expect((await guest.post(`/api/invitations/${token}`)).status).toBe(410);
  });

  it('refuses acceptance by a different account', async () => {
    const owner = await newUser('inv2-owner');
    const other = await newUser('inv2-other');
    const { body } = await owner.client.json<{ project: { id: string } }>('POST', '/api/projects', {
      name: 'Wrong account',
    });
    const invited = uniqueEmail('inv2-invited');
    await owner.client.post(`/api/projects/${body.project.id}/members`, {
      email: invited,
      role: 'viewer',
    });
    const token = new URL(linkIn((await waitForMail(invited, /invited/)).text)).pathname
      .split('/')
      .pop()!;
    expect((await other.client.post(`/api/invitations/${token}`)).status).toBe(403);
    expect((await other.client.get(`/api/projects/${body.project.id}`)).status).toBe(404);
  });

  it('an unknown token is 404', async () => {
    expect((await new Client().get('/api/invitations/not-a-token')).status).toBe(404);
  });
});
