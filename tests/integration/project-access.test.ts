import { beforeAll, describe, expect, it } from 'vitest';
import { makeTeam, type Team } from '../helpers/team';

type Who = 'owner' | 'editor' | 'viewer' | 'outsider' | 'anonymous';
const WHO: Who[] = ['owner', 'editor', 'viewer', 'outsider', 'anonymous'];

/**
 * The one access check, seen from outside: each role against each project endpoint must get
 * the status API.md gives (2xx allowed, 403 role too low, 404 not a member, 401 anonymous).
 */
describe('project endpoints by role', () => {
  let team: Team;
  beforeAll(async () => {
    team = await makeTeam('access');
  });

  const cases: {
    name: string;
    call: (t: Team, who: Who) => Promise<Response>;
    expect: Record<Who, number>;
  }[] = [
    {
      name: 'GET project',
      call: (t, who) => t[who].get(`/api/projects/${t.projectId}`),
      expect: { owner: 200, editor: 200, viewer: 200, outsider: 404, anonymous: 401 },
    },
    {
      name: 'PATCH project (rename)',
      call: (t, who) => t[who].patch(`/api/projects/${t.projectId}`, { name: `Renamed by ${who}` }),
      expect: { owner: 200, editor: 403, viewer: 403, outsider: 404, anonymous: 401 },
    },
    {
      name: 'GET members',
      call: (t, who) => t[who].get(`/api/projects/${t.projectId}/members`),
      expect: { owner: 200, editor: 200, viewer: 200, outsider: 404, anonymous: 401 },
    },
    {
      name: 'POST members (invite)',
      call: (t, who) =>
        t[who].post(`/api/projects/${t.projectId}/members`, {
          email: `guest-${who}-${Date.now()}@lab.example`,
          role: 'viewer',
        }),
      expect: { owner: 201, editor: 403, viewer: 403, outsider: 404, anonymous: 401 },
    },
    {
      name: 'PATCH member role',
      call: (t, who) =>
        t[who].patch(`/api/projects/${t.projectId}/members/${t.ids.viewer}`, { role: 'viewer' }),
      expect: { owner: 200, editor: 403, viewer: 403, outsider: 404, anonymous: 401 },
    },
    {
      name: 'DELETE another member',
      call: (t, who) =>
        t[who].delete(
          `/api/projects/${t.projectId}/members/${who === 'editor' ? t.ids.viewer : t.ids.editor}`,
        ),
      // The owner's call runs last (below) so the editor is still there for the others.
      expect: { owner: 204, editor: 403, viewer: 403, outsider: 404, anonymous: 401 },
    },
  ];

  for (const c of cases) {
    for (const who of WHO) {
      if (c.name === 'DELETE another member' && who === 'owner') continue;
      it(`${c.name} as ${who} → ${c.expect[who]}`, async () => {
        expect((await c.call(team, who)).status).toBe(c.expect[who]);
      });
    }
  }

  it('DELETE another member as owner → 204', async () => {
    expect(
      (await team.owner.delete(`/api/projects/${team.projectId}/members/${team.ids.editor}`))
        .status,
    ).toBe(204);
    expect((await team.editor.get(`/api/projects/${team.projectId}`)).status).toBe(404);
  });

  it('DELETE project: 403 for viewer, 404 outsider, 401 anonymous, 204 owner', async () => {
    expect((await team.viewer.delete(`/api/projects/${team.projectId}`)).status).toBe(403);
    expect((await team.outsider.delete(`/api/projects/${team.projectId}`)).status).toBe(404);
    expect((await team.anonymous.delete(`/api/projects/${team.projectId}`)).status).toBe(401);
    expect((await team.owner.delete(`/api/projects/${team.projectId}`)).status).toBe(204);
    expect((await team.owner.get(`/api/projects/${team.projectId}`)).status).toBe(404);
  });

  it('errors are JSON with code and message', async () => {
    const res = await team.anonymous.get('/api/projects');
    expect(res.status).toBe(401);
    const body = await res.json();
    expect(body.error.code).toBe('unauthenticated');
    expect(typeof body.error.message).toBe('string');
  });
});

describe('owners', () => {
  it('the last owner can neither be demoted nor leave; with two owners one may leave', async () => {
    const t = await makeTeam('owners');
    expect(
      (
        await t.owner.patch(`/api/projects/${t.projectId}/members/${t.ids.owner}`, {
          role: 'editor',
        })
      ).status,
    ).toBe(409);
    expect(
      (await t.owner.delete(`/api/projects/${t.projectId}/members/${t.ids.owner}`)).status,
    ).toBe(409);
    expect(
      (
        await t.owner.patch(`/api/projects/${t.projectId}/members/${t.ids.editor}`, {
          role: 'owner',
        })
      ).status,
    ).toBe(200);
    expect(
      (await t.owner.delete(`/api/projects/${t.projectId}/members/${t.ids.owner}`)).status,
    ).toBe(204);
    expect((await t.editor.get(`/api/projects/${t.projectId}`)).status).toBe(200);
  });

  it('a viewer may leave on their own', async () => {
    const t = await makeTeam('leave');
    expect(
      (await t.viewer.delete(`/api/projects/${t.projectId}/members/${t.ids.viewer}`)).status,
    ).toBe(204);
    expect((await t.viewer.get(`/api/projects/${t.projectId}`)).status).toBe(404);
  });
});
