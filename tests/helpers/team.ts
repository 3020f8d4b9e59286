import { Client, linkIn, newUser, waitForMail } from './client';

export type Team = {
  projectId: string;
  owner: Client;
  editor: Client;
  viewer: Client;
  outsider: Client;
  anonymous: Client;
  ids: Record<'owner' | 'editor' | 'viewer' | 'outsider', string>;
};

/** Invites `email` to the project as `role` through the API and accepts from the mailed link. */
export async function inviteAndAccept(
  owner: Client,
  projectId: string,
  guest: { client: Client; email: string },
  role: string,
) {
  const r = await owner.json('POST', `/api/projects/${projectId}/members`, {
    email: guest.email,
    role,
  });
  if (r.status !== 201) throw new Error(`invite failed: ${JSON.stringify(r.body)}`);
  const mail = await waitForMail(guest.email, /invited/);
  const token = new URL(linkIn(mail.text)).pathname.split('/').pop()!;
  const acc = await guest.client.json('POST', `/api/invitations/${token}`);
  if (acc.status !== 200) throw new Error(`accept failed: ${JSON.stringify(acc.body)}`);
}

/** A project with one member of each role, an outsider and an anonymous client. */
export async function makeTeam(tag: string): Promise<Team> {
  const owner = await newUser(`${tag}-owner`);
  const editor = await newUser(`${tag}-editor`);
  const viewer = await newUser(`${tag}-viewer`);
  const outsider = await newUser(`${tag}-outsider`);
  const created = await owner.client.json<{ project: { id: string } }>('POST', '/api/projects', {
    name: `Project ${tag}`,
  });
  const projectId = created.body.project.id;
  await inviteAndAccept(owner.client, projectId, editor, 'editor');
  await inviteAndAccept(owner.client, projectId, viewer, 'viewer');
  return {
    projectId,
    owner: owner.client,
    editor: editor.client,
    viewer: viewer.client,
    outsider: outsider.client,
    anonymous: new Client(),
    ids: { owner: owner.id, editor: editor.id, viewer: viewer.id, outsider: outsider.id },
  };
}
