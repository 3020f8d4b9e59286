import { requireProjectRole } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import {
  deleteProject,
  getProject,
  updateProject,
  updateProjectSchema,
} from '@/lib/services/projects';

type P = { projectId: string };

export const GET = route<P>(async (req, { projectId }) => {
  const { role } = await requireProjectRole(projectId, 'viewer', req);
  return json({ project: await getProject(projectId, role) });
});

export const PATCH = route<P>(async (req, { projectId }) => {
  const { user, role } = await requireProjectRole(
    projectId,
    'owner',
    req,
    'change project settings',
  );
  const input = updateProjectSchema.parse(await jsonBody(req));
  return json({ project: await updateProject(projectId, user.id, input, role) });
});

export const DELETE = route<P>(async (req, { projectId }) => {
  const { user } = await requireProjectRole(projectId, 'owner', req, 'delete the project');
  await deleteProject(projectId, user.id);
  return new Response(null, { status: 204 });
});
