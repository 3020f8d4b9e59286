import { requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { kinematicDistanceRequestSchema, kinematicDistances } from '@/lib/calculators';

/** Kinematic distances for up to 100 000 sources (API.md, `POST /api/tools/kinematic-distance`). */
export const POST = route(async (req) => {
  await requireUser(req);
  const input = kinematicDistanceRequestSchema.parse(
    // Up to 100 000 points or sources (the schema's limit, answered with its own 413) fit in 32 MB.
    await jsonBody(req, { maxBytes: 32 * 1024 * 1024 }),
  );
  return json(kinematicDistances(input));
});
