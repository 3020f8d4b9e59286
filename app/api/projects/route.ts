import { requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { createProject, createProjectSchema, listProjectsFor } from '@/lib/services/projects';

export const GET = route(async (req) => {
  const user = await requireUser(req);
  return json({ projects: await listProjectsFor(user.id) });
});

export const POST = route(async (req) => {
  const user = await requireUser(req);
  const input = createProjectSchema.parse(await jsonBody(req));
  return json({ project: await createProject(user.id, input) }, 201);
});
