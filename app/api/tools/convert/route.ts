import { requireUser } from '@/lib/auth/access';
import { json, jsonBody, route } from '@/lib/http/handler';
import { convertPoints, convertRequestSchema } from '@/lib/calculators';

/** J2000 / ICRS ↔ Galactic for up to 100 000 points (API.md, `POST /api/tools/convert`). */
export const POST = route(async (req) => {
  await requireUser(req);
  const input = convertRequestSchema.parse(
    // Up to 100 000 points or sources (the schema's limit, answered with its own 413) fit in 32 MB.
    await jsonBody(req, { maxBytes: 32 * 1024 * 1024 }),
  );
  return json(convertPoints(input));
});
