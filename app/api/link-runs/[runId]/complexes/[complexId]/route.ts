import { requireProjectRole } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import {
  complexDetail,
  complexIdSchema,
  reviewComplex,
  reviewSchema,
} from '@/lib/services/complexes';
import { runProject } from '@/lib/services/link-runs';

type P = { runId: string; complexId: string };

export const GET = route<P>(async (req, { runId, complexId }) => {
  await requireProjectRole(await runProject(runId), 'viewer', req);
  const id = complexIdSchema.parse(complexId);
  return json(await complexDetail(runId, id));
});

export const PATCH = route<P>(async (req, { runId, complexId }) => {
  const { user } = await requireProjectRole(
    await runProject(runId),
    'editor',
    req,
    'review complexes',
  );
  const id = complexIdSchema.parse(complexId);
  const input = reviewSchema.parse(await jsonBody(req));
  return json(await reviewComplex(runId, id, user.id, input));
});
