import { requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { kinematicDistanceRequestSchema, kinematicDistances } from '@/lib/calculators';

/** Kinematic distances for up to 100 000 sources (API.md, `POST /api/tools/kinematic-distance`). */
export const POST = route(async (req) => {
  await requireUser(req);
  const input = kinematicDistanceRequestSchema.parse(await jsonBody(req));
  return json(kinematicDistances(input));
});
